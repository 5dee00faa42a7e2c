/**
 * Who is at the other end of a room socket or an events socket: the session cookie (`ml_session`) or a
 * collab token (60 s, names one room). Membership and role always come from the database, never from
 * the token, so a role changed a second ago is the role that counts.
 */
import type { Knex } from 'knex';
import { SESSION_COOKIE, type Role, type TokenService } from '../auth/tokens';
import { getRole } from '../rooms/membership';
import { COLLAB_CLOSE } from '../../shared/collab/close-codes';

export interface Credentials {
  cookieHeader?: string;
  /** A collab token (`?token=` on the room socket, `auth.token` on socket.io), or a session token. */
  token?: string;
  /** The request's Origin and Host headers, to refuse cookie use from another site. */
  origin?: string;
  host?: string;
}

export type Identity = { ok: true; userId: string; via: 'session' | 'collab'; onlyRoomId: string | null };
export type Refusal = { ok: false; code: number; reason: string };

/** Read one cookie from a Cookie header. */
export function readCookie(header: string | undefined, name: string): string | undefined {
  if (!header) return undefined;
  for (const part of header.split(';')) {
    const eq = part.indexOf('=');
    if (eq < 0) continue;
    if (part.slice(0, eq).trim() !== name) continue;
    let value = part.slice(eq + 1).trim();
    if (value.startsWith('"') && value.endsWith('"')) value = value.slice(1, -1);
    try {
      return decodeURIComponent(value);
    } catch {
      return value;
    }
  }
  return undefined;
}

/** True unless the request carries an Origin whose host differs from the Host it was sent to. */
export function sameOrigin(origin: string | undefined, host: string | undefined, publicUrl?: string): boolean {
  if (!origin) return true; // not a browser (browsers always send Origin on WebSocket handshakes)
  let originHost: string;
  try {
    originHost = new URL(origin).host;
  } catch {
    return false;
  }
  if (host && originHost === host) return true;
  if (publicUrl) {
    try {
      if (new URL(publicUrl).host === originHost) return true;
    } catch {
      /* a bad PUBLIC_URL is the config's problem */
    }
  }
  return false;
}

const refuse = (code: number, reason: string): Refusal => ({ ok: false, code, reason });

/** Identify the user from a token (collab, else session) or the session cookie. */
export async function identifyUser(tokens: TokenService, c: Credentials, publicUrl?: string): Promise<Identity | Refusal> {
  if (c.token) {
    const collab = await tokens.verifyCollab(c.token);
    if (collab) return { ok: true, userId: collab.userId, via: 'collab', onlyRoomId: collab.roomId };
    const session = await tokens.verifySession(c.token);
    if (session) return { ok: true, userId: session.userId, via: 'session', onlyRoomId: null };
    return refuse(COLLAB_CLOSE.unauthenticated, 'the token is invalid or has expired');
  }
  const cookie = readCookie(c.cookieHeader, SESSION_COOKIE);
  if (!cookie) return refuse(COLLAB_CLOSE.unauthenticated, 'not signed in');
  if (!sameOrigin(c.origin, c.host, publicUrl)) return refuse(COLLAB_CLOSE.unauthenticated, 'the session cookie may not be used from another site');
  const session = await tokens.verifySession(cookie);
  if (!session) return refuse(COLLAB_CLOSE.unauthenticated, 'the session is invalid or has expired; sign in again');
  return { ok: true, userId: session.userId, via: 'session', onlyRoomId: null };
}

/** The member's role in the room for this identity, or why not. */
export async function authoriseRoom(knex: Knex, who: Identity, roomId: string): Promise<{ ok: true; role: Role } | Refusal> {
  if (who.onlyRoomId !== null && who.onlyRoomId !== roomId) return refuse(COLLAB_CLOSE.unauthenticated, 'the collab token is for another room');
  const role = await getRole(knex, roomId, who.userId);
  if (!role) return refuse(COLLAB_CLOSE.forbidden, 'not a member of this room');
  return { ok: true, role };
}
