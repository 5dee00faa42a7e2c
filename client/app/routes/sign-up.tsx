import type { QueryClient } from '@tanstack/react-query';
import { Link, useNavigate, useSearchParams, type LoaderFunctionArgs } from 'react-router-dom';
import { paths, safeRedirect } from '../../config/paths';
import { AuthLayout } from '../../features/auth/components/auth-layout';
import { SignUpForm } from '../../features/auth/components/sign-up-form';
import { redirectSignedIn } from '../auth-loader';

export const clientLoader = (queryClient: QueryClient) => async (args: LoaderFunctionArgs) => {
  await redirectSignedIn(queryClient, args);
  return null;
};

export default function SignUpRoute() {
  const navigate = useNavigate();
  const [searchParams] = useSearchParams();
  const redirectTo = searchParams.get('redirectTo');
  return (
    <AuthLayout
      title="Create an account"
      footer={
        <>
          Already have an account?{' '}
          <Link to={paths.auth.signIn.getHref(redirectTo)} className="font-bold text-teal-deep underline underline-offset-2">
            Sign in
          </Link>
        </>
      }
    >
      <SignUpForm defaultEmail={searchParams.get('email') ?? ''} onSuccess={() => navigate(safeRedirect(redirectTo), { replace: true })} />
    </AuthLayout>
  );
}
