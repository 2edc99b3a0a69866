import type { QueryClient } from '@tanstack/react-query';
import { Link, redirect, useNavigate, useSearchParams, type LoaderFunctionArgs } from 'react-router-dom';
import { Alert } from '../../../components/ui/alert';
import { AuthLayout } from '../../../components/layouts/auth-layout';
import { paths, safeNext } from '../../../config/paths';
import { SignInForm } from '../../../features/account/components/sign-in-form';
import { meQuery } from '../../../lib/auth';

/** Already signed in (in this tab's cache)? Skip the form. No request here: a 401 on this page would be noise. */
export const loader =
  (queryClient: QueryClient) =>
  ({ request }: LoaderFunctionArgs) => {
    if (queryClient.getQueryData(meQuery().queryKey)) {
      throw redirect(safeNext(new URL(request.url).searchParams.get('next')));
    }
    return null;
  };

export default function SignInPage() {
  const [searchParams] = useSearchParams();
  const navigate = useNavigate();
  const next = searchParams.get('next');

  return (
    <AuthLayout>
      {next && (
        <Alert tone="info" className="mb-6">
          Sign in to continue where you were.
        </Alert>
      )}
      <SignInForm onSignedIn={() => navigate(safeNext(next), { replace: true })} />
      <Link
        to={paths.forgotPassword.getHref()}
        className="mt-4 inline-flex min-h-touch items-center font-semibold text-fjord-700 underline underline-offset-4"
      >
        Forgot password?
      </Link>
    </AuthLayout>
  );
}
