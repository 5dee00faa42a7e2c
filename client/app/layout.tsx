import type { QueryClient } from '@tanstack/react-query';
import { Suspense } from 'react';
import { Link, Navigate, Outlet, useLocation, useMatches, type LoaderFunctionArgs } from 'react-router-dom';
import { Button } from '../components/button';
import { Loading } from '../components/page-status';
import { Wordmark } from '../components/wordmark';
import { paths } from '../config/paths';
import { useMe } from '../features/auth/api/get-me';
import { useSignOut } from '../features/auth/api/sign-out';
import { cx } from '../lib/cx';
import { requireSignedIn } from './auth-loader';
import type { RouteHandle } from './router';

export const clientLoader = (queryClient: QueryClient) => async (args: LoaderFunctionArgs) => {
  await requireSignedIn(queryClient, args);
  return null;
};

function AppBar({ displayName, wide }: { displayName: string; wide: boolean }) {
  const signOut = useSignOut({ onSuccess: () => window.location.assign(paths.auth.signIn.getHref()) });
  return (
    <header className="border-b border-rule bg-card/80 backdrop-blur">
      <div className={cx('mx-auto flex items-center justify-between gap-4 px-4 py-2.5', wide ? 'max-w-none' : 'max-w-6xl')}>
        <Link to={paths.rooms.getHref()} className="flex items-center rounded-md text-ink" aria-label="Matchloom, your rooms">
          <Wordmark />
        </Link>
        <nav aria-label="Account" className="flex items-center gap-3">
          <span className="hidden text-sm text-ink-soft sm:inline">
            Signed in as <strong className="font-bold text-ink">{displayName}</strong>
          </span>
          <Link to={paths.account.getHref()} className="rounded-md px-1.5 text-sm font-semibold text-ink-soft hover:text-ink hover:underline">
            Account
          </Link>
          <Button variant="secondary" size="sm" busy={signOut.isPending} busyLabel="Signing out…" onClick={() => signOut.mutate()}>
            Sign out
          </Button>
        </nav>
      </div>
    </header>
  );
}

/** The signed-in frame: the app bar, then the page. */
export default function AppLayout() {
  const { data: me } = useMe();
  const location = useLocation();
  const wide = useMatches().some((match) => (match.handle as RouteHandle | undefined)?.wide);
  // The session can end while the app is open (signed out elsewhere, expired): ask to sign in again.
  if (me === null) return <Navigate to={paths.auth.signIn.getHref(`${location.pathname}${location.search}`)} replace />;
  return (
    <div className="flex min-h-screen flex-col">
      <a href="#main" className="sr-only focus:not-sr-only focus:absolute focus:top-2 focus:left-2 focus:z-50 focus:rounded-md focus:bg-ink focus:px-3 focus:py-2 focus:text-paper">
        Skip to content
      </a>
      <AppBar displayName={me?.displayName ?? ''} wide={wide} />
      <main id="main" className={cx('mx-auto w-full flex-1 px-4', wide ? 'max-w-none py-4' : 'max-w-6xl py-6')}>
        <Suspense fallback={<Loading />}>
          <Outlet />
        </Suspense>
      </main>
    </div>
  );
}
