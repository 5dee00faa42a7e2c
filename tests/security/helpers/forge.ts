/**
 * Hostile tokens: tampered, expired, unsigned (`alg: none`), signed with another key or algorithm, with
 * the wrong issuer or audience, or without an expiry. Each is built with jose (or by hand for the
 * unsigned one) from the real claims the server would issue.
 */
import { SignJWT, decodeJwt } from 'jose';
import { COLLAB_AUDIENCE, SESSION_AUDIENCE, TOKEN_ISSUER } from '../../../server/auth/tokens';

const b64url = (s: string) => Buffer.from(s, 'utf8').toString('base64url');

export interface Claims {
  sub: string;
  aud: string;
  room?: string;
  role?: string;
}

export function sessionClaims(userId: string): Claims {
  return { sub: userId, aud: SESSION_AUDIENCE };
}

export function collabClaims(userId: string, roomId: string, role = 'owner'): Claims {
  return { sub: userId, aud: COLLAB_AUDIENCE, room: roomId, role };
}

interface SignOptions {
  alg?: string;
  iss?: string | null;
  aud?: string | null;
  /** seconds from now; null: no exp claim */
  expIn?: number | null;
  nbfIn?: number;
}

export async function sign(claims: Claims, secret: Uint8Array, o: SignOptions = {}): Promise<string> {
  const extra: Record<string, unknown> = {};
  if (claims.room !== undefined) extra.room = claims.room;
  if (claims.role !== undefined) extra.role = claims.role;
  let jwt = new SignJWT(extra).setProtectedHeader({ alg: o.alg ?? 'HS256' }).setSubject(claims.sub).setIssuedAt();
  const iss = o.iss === undefined ? TOKEN_ISSUER : o.iss;
  const aud = o.aud === undefined ? claims.aud : o.aud;
  if (iss !== null) jwt = jwt.setIssuer(iss);
  if (aud !== null) jwt = jwt.setAudience(aud);
  const expIn = o.expIn === undefined ? 60 : o.expIn;
  if (expIn !== null) jwt = jwt.setExpirationTime(Math.floor(Date.now() / 1000) + expIn);
  if (o.nbfIn !== undefined) jwt = jwt.setNotBefore(Math.floor(Date.now() / 1000) + o.nbfIn);
  return jwt.sign(secret);
}

/** `{"alg":"none"}` with the given claims and an empty signature (and variants of the header's case). */
export function unsigned(claims: Claims, alg = 'none'): string {
  const now = Math.floor(Date.now() / 1000);
  const payload: Record<string, unknown> = { sub: claims.sub, iss: TOKEN_ISSUER, aud: claims.aud, iat: now, exp: now + 600 };
  if (claims.room !== undefined) payload.room = claims.room;
  if (claims.role !== undefined) payload.role = claims.role;
  return `${b64url(JSON.stringify({ alg, typ: 'JWT' }))}.${b64url(JSON.stringify(payload))}.`;
}

/** The real token with its payload rewritten (new claims, old signature). */
export function withPayload(token: string, change: (p: Record<string, unknown>) => Record<string, unknown>): string {
  const [h, , s] = token.split('.');
  return `${h}.${b64url(JSON.stringify(change(decodeJwt(token) as Record<string, unknown>)))}.${s}`;
}

/** The real token with one signature character changed. */
export function flipSignature(token: string): string {
  const [h, p, s] = token.split('.');
  const i = Math.floor(s.length / 2);
  const c = s[i] === 'A' ? 'B' : 'A';
  return `${h}.${p}.${s.slice(0, i)}${c}${s.slice(i + 1)}`;
}

export const OTHER_SECRET = new TextEncoder().encode('another-server-entirely-0123456789abcdef');

export interface ForgedToken {
  name: string;
  token: string;
}

/**
 * Every hostile variant of a token for these claims. `real` is a genuine token the server issued for
 * the same claims (to tamper with); `secret` is the server's key (for the variants that must fail on a
 * claim, not on the signature).
 */
export async function forgeries(claims: Claims, real: string, secret: Uint8Array): Promise<ForgedToken[]> {
  const otherSub = claims.sub.split('').reverse().join('');
  return [
    { name: 'expired (right key)', token: await sign(claims, secret, { expIn: -120 }) },
    { name: 'not yet valid (nbf in an hour)', token: await sign(claims, secret, { nbfIn: 3600 }) },
    { name: 'alg none', token: unsigned(claims) },
    { name: 'alg None', token: unsigned(claims, 'None') },
    { name: 'alg none with the real signature', token: `${unsigned(claims).slice(0, -1)}.${real.split('.')[2]}`.replace('..', '.') },
    { name: 'wrong key', token: await sign(claims, OTHER_SECRET) },
    { name: 'HS512 with the right key', token: await sign(claims, secret, { alg: 'HS512' }) },
    { name: 'HS384 with the right key', token: await sign(claims, secret, { alg: 'HS384' }) },
    { name: 'wrong issuer', token: await sign(claims, secret, { iss: 'someone-else' }) },
    { name: 'no issuer', token: await sign(claims, secret, { iss: null }) },
    { name: 'wrong audience', token: await sign(claims, secret, { aud: 'someone-else' }) },
    { name: 'no audience', token: await sign(claims, secret, { aud: null }) },
    { name: 'tampered subject', token: withPayload(real, (p) => ({ ...p, sub: otherSub })) },
    { name: 'tampered expiry', token: withPayload(real, (p) => ({ ...p, exp: (p.exp as number) + 3600 })) },
    { name: 'flipped signature', token: flipSignature(real) },
    { name: 'no signature', token: real.split('.').slice(0, 2).join('.') + '.' },
    { name: 'two parts', token: real.split('.').slice(0, 2).join('.') },
    { name: 'garbage', token: 'not-a-token' },
    { name: 'empty segments', token: '..' },
    // Past the verifier's 4096-character cap, under Node's 16 KB header limit (past that Node answers 431 itself).
    { name: 'huge', token: `${real}${'A'.repeat(6000)}` },
  ];
}

/** A correctly signed token without an `exp` claim: valid for ever if the server does not require one. */
export async function withoutExpiry(claims: Claims, secret: Uint8Array): Promise<string> {
  return sign(claims, secret, { expIn: null });
}
