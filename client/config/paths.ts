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
    signUp: {
      path: '/sign-up',
      /** `email` fills the form's address (an invitation's). */
      getHref: (redirectTo?: string | null, email?: string) => {
        const href = withRedirect('/sign-up', redirectTo);
        return email ? `${href}${href.includes('?') ? '&' : '?'}email=${encodeURIComponent(email)}` : href;
      },
    },
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
  snapshots: {
    path: '/rooms/:roomId/snapshots',
    getHref: (roomId: string) => `/rooms/${encodeURIComponent(roomId)}/snapshots`,
  },
  lineage: {
    path: '/rooms/:roomId/lineage',
    getHref: (roomId: string) => `/rooms/${encodeURIComponent(roomId)}/lineage`,
  },
  compare: {
    path: '/rooms/:roomId/compare',
    /** `a` and `b`: a snapshot id or `live` (the room now). */
    getHref: (roomId: string, a: string, b: string) =>
      `/rooms/${encodeURIComponent(roomId)}/compare?a=${encodeURIComponent(a)}&b=${encodeURIComponent(b)}`,
  },
  notes: {
    path: '/rooms/:roomId/notes',
    getHref: (roomId: string) => `/rooms/${encodeURIComponent(roomId)}/notes`,
  },
  uploads: {
    path: '/rooms/:roomId/uploads',
    getHref: (roomId: string) => `/rooms/${encodeURIComponent(roomId)}/uploads`,
  },
  handoff: {
    path: '/rooms/:roomId/handoff',
    getHref: (roomId: string) => `/rooms/${encodeURIComponent(roomId)}/handoff`,
  },
  invitation: {
    path: '/invitations/:token',
    getHref: (token: string) => `/invitations/${encodeURIComponent(token)}`,
  },
  mailbox: { path: '/dev/mailbox', getHref: () => '/dev/mailbox' },
  account: { path: '/account', getHref: () => '/account' },
} as const;

/**
 * A redirect target taken from the query string is followed only when it is a path on this site
 * (`/rooms/abc`), never an absolute or protocol-relative address (`//evil.test`).
 */
export function safeRedirect(target: string | null | undefined, fallback: string = paths.rooms.getHref()): string {
  if (!target || !target.startsWith('/') || target.startsWith('//') || target.startsWith('/\\')) return fallback;
  return target;
}
