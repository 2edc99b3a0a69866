import { useParams } from 'react-router-dom';
import { INVITATION_HOURS } from '../../../../shared/schemas/account';
import { AuthLayout } from '../../../components/layouts/auth-layout';
import { paths } from '../../../config/paths';
import { AccountLinkForm } from '../../../features/account/components/account-link-form';

/** The link in an invitation mail: the person chooses a first password and is signed in. */
export default function InvitePage() {
  return (
    <AuthLayout>
      <AccountLinkForm
        purpose="invitation"
        token={useParams().token ?? ''}
        title="Welcome to Tightloop"
        checking="Checking the invitation…"
        problemAction={{ to: paths.signIn.getHref(), label: 'Go to sign-in' }}
        intro={(link) => (
          <>
            {link.name}, choose a password for <span className="font-semibold">{link.email}</span>. You will use it with
            this e-mail address to sign in. The invitation works once, for {INVITATION_HOURS} hours.
          </>
        )}
        submitLabel="Set password and sign in"
        pendingLabel="Setting up…"
      />
    </AuthLayout>
  );
}
