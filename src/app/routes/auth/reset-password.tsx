import { useNavigate, useParams } from 'react-router-dom';
import { AuthLayout } from '../../../components/layouts/auth-layout';
import { ButtonLink } from '../../../components/ui/button';
import { Spinner } from '../../../components/ui/spinner';
import { paths } from '../../../config/paths';
import { useAccountLink, useCompleteAccountLink } from '../../../features/account/api/account-links';
import { LinkProblem } from '../../../features/account/components/link-problem';
import { SetPasswordForm } from '../../../features/account/components/set-password-form';

/** The link in a password-reset mail: a new password, then signed in here and out everywhere else. */
export default function ResetPasswordPage() {
  const token = useParams().token ?? '';
  const navigate = useNavigate();
  const link = useAccountLink('password_reset', token);
  const complete = useCompleteAccountLink('password_reset', token);

  return (
    <AuthLayout>
      <div className="flex flex-col gap-5">
        <h1 className="text-2xl font-bold tracking-tight md:text-3xl">Choose a new password</h1>
        {link.isPending ? (
          <p className="flex items-center gap-3 text-ink-700">
            <Spinner /> Checking the link…
          </p>
        ) : link.isError ? (
          <LinkProblem error={link.error}>
            <ButtonLink to={paths.forgotPassword.getHref()} variant="secondary">
              Ask for a new link
            </ButtonLink>
          </LinkProblem>
        ) : (
          <>
            <p className="text-ink-700">
              For <span className="font-semibold">{link.data.email}</span>. Saving it signs you out on every other
              device.
            </p>
            <SetPasswordForm
              person={{ email: link.data.email, name: link.data.name }}
              submitLabel="Save password and sign in"
              pendingLabel="Saving…"
              pending={complete.isPending}
              error={complete.error}
              onSubmit={(password) =>
                complete.mutate(password, { onSuccess: () => navigate(paths.home.getHref(), { replace: true }) })
              }
            />
          </>
        )}
      </div>
    </AuthLayout>
  );
}
