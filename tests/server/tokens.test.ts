import { SignJWT } from 'jose';
import { afterEach, describe, expect, it, vi } from 'vitest';
import {
  COLLAB_AUDIENCE,
  SESSION_AUDIENCE,
  TOKEN_ISSUER,
  createTokenService,
} from '../../server/auth/tokens';

const secret = new TextEncoder().encode('a-test-secret-of-enough-length-0123456789');
const tokens = createTokenService(secret);

afterEach(() => {
  vi.useRealTimers();
});

describe('session tokens', () => {
  it('round-trip the user id', async () => {
    expect(await tokens.verifySession(await tokens.signSession('user-1'))).toEqual({ userId: 'user-1' });
  });

  it('expire after 7 days', async () => {
    vi.useFakeTimers({ toFake: ['Date'] });
    vi.setSystemTime(new Date('2026-12-01T12:00:00Z'));
    const token = await tokens.signSession('user-1');
    vi.setSystemTime(new Date('2026-12-08T11:59:00Z'));
    expect(await tokens.verifySession(token)).toEqual({ userId: 'user-1' });
    vi.setSystemTime(new Date('2026-12-08T12:00:01Z'));
    expect(await tokens.verifySession(token)).toBeNull();
  });

  it('refuse a tampered, foreign or garbage token', async () => {
    const token = await tokens.signSession('user-1');
    const [h, p, s] = token.split('.');
    const payload = JSON.parse(Buffer.from(p, 'base64url').toString());
    const forged = [
      h,
      Buffer.from(JSON.stringify({ ...payload, sub: 'user-2' })).toString('base64url'),
      s,
    ].join('.');
    expect(await tokens.verifySession(forged)).toBeNull();
    const other = createTokenService(new TextEncoder().encode('another-secret-of-enough-length-987654321'));
    expect(await other.verifySession(token)).toBeNull();
    expect(await tokens.verifySession('not.a.jwt')).toBeNull();
    expect(await tokens.verifySession('')).toBeNull();
  });

  it('refuse an unsigned ("alg": "none") token', async () => {
    const header = Buffer.from(JSON.stringify({ alg: 'none' })).toString('base64url');
    const body = Buffer.from(
      JSON.stringify({ sub: 'user-1', iss: TOKEN_ISSUER, aud: SESSION_AUDIENCE, exp: 9e9 }),
    ).toString('base64url');
    expect(await tokens.verifySession(`${header}.${body}.`)).toBeNull();
  });
});

describe('collab tokens', () => {
  it('name the room and role and last 60 s', async () => {
    vi.useFakeTimers({ toFake: ['Date'] });
    vi.setSystemTime(new Date('2026-12-01T12:00:00Z'));
    const token = await tokens.signCollab({ userId: 'u', roomId: 'room-a', role: 'tuner' });
    expect(await tokens.verifyCollab(token)).toEqual({ userId: 'u', roomId: 'room-a', role: 'tuner' });
    vi.setSystemTime(new Date('2026-12-01T12:01:01Z'));
    expect(await tokens.verifyCollab(token)).toBeNull();
  });

  it('cannot be moved to another room or role', async () => {
    const token = await tokens.signCollab({ userId: 'u', roomId: 'room-a', role: 'observer' });
    const [h, p, s] = token.split('.');
    const payload = JSON.parse(Buffer.from(p, 'base64url').toString());
    for (const change of [{ room: 'room-b' }, { role: 'owner' }]) {
      const forged = [
        h,
        Buffer.from(JSON.stringify({ ...payload, ...change })).toString('base64url'),
        s,
      ].join('.');
      expect(await tokens.verifyCollab(forged)).toBeNull();
    }
  });

  it('are not sessions, and sessions are not collab tokens', async () => {
    const collab = await tokens.signCollab({ userId: 'u', roomId: 'room-a', role: 'owner' });
    expect(await tokens.verifySession(collab)).toBeNull();
    expect(await tokens.verifyCollab(await tokens.signSession('u'))).toBeNull();
  });

  it('refuse a correctly signed token with an unknown role', async () => {
    const token = await new SignJWT({ room: 'room-a', role: 'admin' })
      .setProtectedHeader({ alg: 'HS256' })
      .setSubject('u')
      .setIssuer(TOKEN_ISSUER)
      .setAudience(COLLAB_AUDIENCE)
      .setExpirationTime('60s')
      .sign(secret);
    expect(await tokens.verifyCollab(token)).toBeNull();
  });
});
