/**
 * Signed tokens (jose, HS256 only). The session token lives in the `ml_session` cookie for 7 days; the
 * collab token is a 60-second ticket naming one room and the holder's role there, for the room socket.
 * Both carry issuer "matchloom" and their own audience, so one can never stand in for the other.
 */
import { SignJWT, jwtVerify } from 'jose';

export const SESSION_COOKIE = 'ml_session';
export type Role = 'owner' | 'tuner' | 'observer';
export const ROLES: readonly Role[] = ['owner', 'tuner', 'observer'];

export const TOKEN_ISSUER = 'matchloom';
export const SESSION_AUDIENCE = 'matchloom-session';
export const COLLAB_AUDIENCE = 'matchloom-collab';
export const SESSION_TTL_SECONDS = 7 * 24 * 60 * 60;
export const COLLAB_TTL_SECONDS = 60;
const ALG = 'HS256';

export interface TokenService {
  signSession(userId: string): Promise<string>;
  verifySession(token: string): Promise<{ userId: string } | null>;
  signCollab(c: { userId: string; roomId: string; role: Role }): Promise<string>;
  verifyCollab(token: string): Promise<{ userId: string; roomId: string; role: Role } | null>;
}

function isRole(v: unknown): v is Role {
  return typeof v === 'string' && (ROLES as readonly string[]).includes(v);
}

export function createTokenService(secret: Uint8Array): TokenService {
  if (secret.byteLength < 16) throw new Error('the token secret must be at least 16 bytes');

  async function verify(token: string, audience: string) {
    if (typeof token !== 'string' || token.length === 0 || token.length > 4096) return null;
    try {
      const { payload } = await jwtVerify(token, secret, {
        algorithms: [ALG],
        issuer: TOKEN_ISSUER,
        audience,
        requiredClaims: ['exp', 'iat'],
      });
      return typeof payload.sub === 'string' && payload.sub ? payload : null;
    } catch {
      return null; // expired, tampered, wrong audience or not a JWT at all
    }
  }

  return {
    signSession: (userId) =>
      new SignJWT({})
        .setProtectedHeader({ alg: ALG })
        .setSubject(userId)
        .setIssuer(TOKEN_ISSUER)
        .setAudience(SESSION_AUDIENCE)
        .setIssuedAt()
        .setExpirationTime(`${SESSION_TTL_SECONDS}s`)
        .sign(secret),

    async verifySession(token) {
      const p = await verify(token, SESSION_AUDIENCE);
      return p ? { userId: p.sub as string } : null;
    },

    signCollab: ({ userId, roomId, role }) =>
      new SignJWT({ room: roomId, role })
        .setProtectedHeader({ alg: ALG })
        .setSubject(userId)
        .setIssuer(TOKEN_ISSUER)
        .setAudience(COLLAB_AUDIENCE)
        .setIssuedAt()
        .setExpirationTime(`${COLLAB_TTL_SECONDS}s`)
        .sign(secret),

    async verifyCollab(token) {
      const p = await verify(token, COLLAB_AUDIENCE);
      if (!p || typeof p.room !== 'string' || !p.room || !isRole(p.role)) return null;
      return { userId: p.sub as string, roomId: p.room, role: p.role };
    },
  };
}
