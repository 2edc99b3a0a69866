import { useParams } from 'react-router-dom';
import { AuthLayout } from '../../../components/layouts/auth-layout';
import { paths } from '../../../config/paths';
import { AccountLinkForm } from '../../../features/account/components/account-link-form';

/** The link in a password-reset mail: a new password, then signed in here and out everywhere else. */
export default function ResetPasswordPage() {
  return (
    <AuthLayout>
      <AccountLinkForm
        purpose="password_reset"
        token={useParams().token ?? ''}
        title="Choose a new password"
        checking="Checking the link…"
        problemAction={{ to: paths.forgotPassword.getHref(), label: 'Ask for a new link' }}
        intro={(link) => (
          <>
            For <span className="font-semibold">{link.email}</span>. Saving it signs you out on every other device.
          </>
        )}
        submitLabel="Save password and sign in"
        pendingLabel="Saving…"
      />
    </AuthLayout>
  );
}
