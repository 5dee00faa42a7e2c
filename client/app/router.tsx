/**
 * The route table. Every route is lazy (its own chunk) and lives in one file under `routes/`,
 * which may export `clientLoader(queryClient)` (prefetching through the features' query options)
 * and `ErrorBoundary`; the default export is the page.
 */
import type { QueryClient } from '@tanstack/react-query';
import type { ComponentType } from 'react';
import { createBrowserRouter, redirect, type LoaderFunction, type RouteObject } from 'react-router-dom';
import { RouteError } from '../components/route-error';
import { paths } from '../config/paths';

/** What a route may tell the layout: `wide` pages (the room workspace) use the whole window width. */
export interface RouteHandle {
  wide?: boolean;
}

interface RouteModule {
  default: ComponentType;
  clientLoader?: (queryClient: QueryClient) => LoaderFunction;
  ErrorBoundary?: ComponentType;
  handle?: RouteHandle;
}

const convert = (queryClient: QueryClient) => (module: RouteModule) => ({
  Component: module.default,
  loader: module.clientLoader?.(queryClient),
  ErrorBoundary: module.ErrorBoundary ?? RouteError,
  handle: module.handle,
});

export function createRoutes(queryClient: QueryClient): RouteObject[] {
  const load = convert(queryClient);
  return [
    {
      ErrorBoundary: RouteError,
      HydrateFallback: () => null,
      children: [
        { path: paths.auth.signIn.path, lazy: () => import('./routes/sign-in').then(load) },
        { path: paths.auth.signUp.path, lazy: () => import('./routes/sign-up').then(load) },
        // Open to anyone holding the link, signed in or not; the page says what to do.
        { path: paths.invitation.path, lazy: () => import('./routes/invitation').then(load) },
        { path: paths.mailbox.path, lazy: () => import('./routes/mailbox').then(load) },
        {
          // Everything below needs a signed-in user; the layout's loader sends others to sign in.
          lazy: () => import('./layout').then(load),
          children: [
            { path: paths.home.path, loader: () => redirect(paths.rooms.getHref()) },
            { path: paths.rooms.path, lazy: () => import('./routes/rooms').then(load) },
            { path: paths.room.path, lazy: () => import('./routes/room').then(load) },
            { path: paths.members.path, lazy: () => import('./routes/members').then(load) },
            { path: paths.account.path, lazy: () => import('./routes/account').then(load) },
            { path: paths.snapshots.path, lazy: () => import('./routes/snapshots').then(load) },
            { path: paths.lineage.path, lazy: () => import('./routes/lineage').then(load) },
            { path: paths.compare.path, lazy: () => import('./routes/compare').then(load) },
            { path: paths.notes.path, lazy: () => import('./routes/notes').then(load) },
            { path: paths.uploads.path, lazy: () => import('./routes/uploads').then(load) },
            { path: paths.handoff.path, lazy: () => import('./routes/handoff').then(load) },
          ],
        },
        { path: '*', lazy: () => import('./routes/not-found').then(load) },
      ],
    },
  ];
}

export const createAppRouter = (queryClient: QueryClient) => createBrowserRouter(createRoutes(queryClient));
