import { Link } from 'react-router-dom';
import { AuthLayout } from '../../../components/layouts/auth-layout';
import { paths } from '../../../config/paths';
import { ForgotPasswordForm } from '../../../features/account/components/forgot-password-form';

export default function ForgotPasswordPage() {
  return (
    <AuthLayout>
      <div className="flex flex-col gap-5">
        <h1 className="text-2xl font-bold tracking-tight md:text-3xl">Forgot your password?</h1>
        <p className="text-ink-700">
          Enter the e-mail address you sign in with, and we will mail you a link to choose a new one.
        </p>
        <ForgotPasswordForm />
        <Link
          to={paths.signIn.getHref()}
          className="min-h-touch self-start py-3 font-semibold text-fjord-700 underline underline-offset-4"
        >
          Back to sign-in
        </Link>
      </div>
    </AuthLayout>
  );
}
