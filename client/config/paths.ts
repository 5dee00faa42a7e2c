/**
 * Every client path lives here, with a `getHref` that builds a concrete link. Routes use `path`;
 * links and redirects use `getHref`, so a path is spelt once.
 */
const withRedirect = (base: string, redirectTo?: string | null) =>
  redirectTo ? `${base}?redirectTo=${encodeURIComponent(redirectTo)}` : base;

export const paths = {
  home: { path: '/', getHref: () => '/' },
  auth: {
    signIn: { path: '/sign-in', getHref: (redirectTo?: string | null) => withRedirect('/sign-in', redirectTo) },
    signUp: { path: '/sign-up', getHref: (redirectTo?: string | null) => withRedirect('/sign-up', redirectTo) },
  },
  rooms: { path: '/rooms', getHref: () => '/rooms' },
  room: {
    path: '/rooms/:roomId',
    getHref: (roomId: string) => `/rooms/${encodeURIComponent(roomId)}`,
  },
  members: {
    path: '/rooms/:roomId/members',
    getHref: (roomId: string) => `/rooms/${encodeURIComponent(roomId)}/members`,
  },
} as const;

/**
 * A redirect target taken from the query string is followed only when it is a path on this site
 * (`/rooms/abc`), never an absolute or protocol-relative address (`//evil.test`).
 */
export function safeRedirect(target: string | null | undefined, fallback: string = paths.rooms.getHref()): string {
  if (!target || !target.startsWith('/') || target.startsWith('//') || target.startsWith('/\\')) return fallback;
  return target;
}
