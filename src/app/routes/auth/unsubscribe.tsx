import { Link, useSearchParams } from 'react-router-dom';
import { ALERT_KIND_LABELS, unsubscribeSchema } from '../../../../shared/schemas/alerts';
import { AuthLayout } from '../../../components/layouts/auth-layout';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { paths } from '../../../config/paths';
import { isApiError } from '../../../lib/api-client';
import { useUnsubscribe } from '../../../features/alerts/api/subscriptions';

/** The signed link at the foot of every alert mail. A button, not the visit itself, does it: mail scanners open links. */
export default function UnsubscribePage() {
  const [params] = useSearchParams();
  const parsed = unsubscribeSchema.safeParse(Object.fromEntries(params));
  const unsubscribe = useUnsubscribe();
  const title = parsed.success ? ALERT_KIND_LABELS[parsed.data.kind].title : null;

  return (
    <AuthLayout>
      <div className="flex flex-col gap-5">
        <h1 className="text-2xl font-bold tracking-tight md:text-3xl">Stop alert mails</h1>
        {!parsed.success ? (
          <Alert tone="alarm" title="This link does not work">
            Part of the link is missing. Open it again from the e-mail, or change your alerts in Tightloop.
          </Alert>
        ) : unsubscribe.isSuccess ? (
          <Alert tone="okay" title="Done">
            You will no longer get “{title}” mails, at any site.
          </Alert>
        ) : (
          <>
            <p className="text-ink-700">
              Stop “{title}” mails for every site you follow? Other kinds of alert stay as they are.
            </p>
            {unsubscribe.isError && (
              <Alert tone="alarm" title="Nothing was changed">
                {isApiError(unsubscribe.error)
                  ? unsubscribe.error.message
                  : 'Something unexpected went wrong. Try again.'}
              </Alert>
            )}
            <Button
              size="lg"
              onClick={() => unsubscribe.mutate(parsed.data)}
              pending={unsubscribe.isPending}
              pendingLabel="Stopping…"
            >
              Stop these mails
            </Button>
          </>
        )}
        <Link
          to={paths.alertSettings.getHref()}
          className="min-h-touch self-start py-3 font-semibold text-fjord-700 underline underline-offset-4"
        >
          Choose sites and alerts in Tightloop
        </Link>
      </div>
    </AuthLayout>
  );
}
