import { useNavigate, useParams } from 'react-router-dom';
import { INVITATION_HOURS } from '../../../../shared/schemas/account';
import { AuthLayout } from '../../../components/layouts/auth-layout';
import { ButtonLink } from '../../../components/ui/button';
import { Spinner } from '../../../components/ui/spinner';
import { paths } from '../../../config/paths';
import { useAccountLink, useCompleteAccountLink } from '../../../features/account/api/account-links';
import { LinkProblem } from '../../../features/account/components/link-problem';
import { SetPasswordForm } from '../../../features/account/components/set-password-form';

/** The link in an invitation mail: the person chooses a first password and is signed in. */
export default function InvitePage() {
  const token = useParams().token ?? '';
  const navigate = useNavigate();
  const link = useAccountLink('invitation', token);
  const complete = useCompleteAccountLink('invitation', token);

  return (
    <AuthLayout>
      <div className="flex flex-col gap-5">
        <h1 className="text-2xl font-bold tracking-tight md:text-3xl">Welcome to Tightloop</h1>
        {link.isPending ? (
          <p className="flex items-center gap-3 text-ink-700">
            <Spinner /> Checking the invitation…
          </p>
        ) : link.isError ? (
          <LinkProblem error={link.error}>
            <ButtonLink to={paths.signIn.getHref()} variant="secondary">
              Go to sign-in
            </ButtonLink>
          </LinkProblem>
        ) : (
          <>
            <p className="text-ink-700">
              {link.data.name}, choose a password for <span className="font-semibold">{link.data.email}</span>. You will
              use it with this e-mail address to sign in. The invitation works once, for {INVITATION_HOURS} hours.
            </p>
            <SetPasswordForm
              person={{ email: link.data.email, name: link.data.name }}
              submitLabel="Set password and sign in"
              pendingLabel="Setting up…"
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
