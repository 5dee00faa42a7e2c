import type { QueryClient } from '@tanstack/react-query';
import { Link, useNavigate, useSearchParams, type LoaderFunctionArgs } from 'react-router-dom';
import { paths, safeRedirect } from '../../config/paths';
import { healthQueryOptions, useHealth } from '../../features/auth/api/get-health';
import { AuthLayout } from '../../features/auth/components/auth-layout';
import { SignInForm } from '../../features/auth/components/sign-in-form';
import { redirectSignedIn } from '../auth-loader';

export const clientLoader = (queryClient: QueryClient) => async (args: LoaderFunctionArgs) => {
  await Promise.all([redirectSignedIn(queryClient, args), queryClient.prefetchQuery(healthQueryOptions())]);
  return null;
};

/**
 * The demo accounts are listed when the server says it holds them (`GET /api/health` answers
 * `demo: true`), or in Vite's development server.
 */
export const showsDemoAccounts = (demo: boolean | undefined, dev: boolean = import.meta.env.DEV) => demo === true || dev;

export default function SignInRoute() {
  const navigate = useNavigate();
  const [searchParams] = useSearchParams();
  const redirectTo = searchParams.get('redirectTo');
  const health = useHealth();
  return (
    <AuthLayout
      title="Sign in"
      footer={
        <>
          New to Matchloom?{' '}
          <Link to={paths.auth.signUp.getHref(redirectTo)} className="font-bold text-teal-deep underline underline-offset-2">
            Create an account
          </Link>
        </>
      }
    >
      <SignInForm
        showDemoAccounts={showsDemoAccounts(health.data?.demo)}
        onSuccess={() => navigate(safeRedirect(redirectTo), { replace: true })}
      />
    </AuthLayout>
  );
}
