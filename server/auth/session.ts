/**
 * The session: a JWT in the httpOnly `ml_session` cookie (SameSite=Lax, Secure in production, path /,
 * 7 days). `sessionMiddleware` turns a valid cookie into `req.user`; `signedInUser` demands one.
 */
import type { CookieOptions, Request, RequestHandler, Response } from 'express';
import type { Knex } from 'knex';
import type { Config } from '../config';
import { unauthenticated } from '../errors';
import { SESSION_COOKIE, SESSION_TTL_SECONDS, type TokenService } from './tokens';
import { findUserById, type PublicUser } from '../services/users';

declare global {
  // eslint-disable-next-line @typescript-eslint/no-namespace
  namespace Express {
    interface Request {
      /** The signed-in user, set by sessionMiddleware when the cookie is valid. */
      user?: PublicUser;
    }
  }
}

export function sessionCookieOptions(config: Pick<Config, 'nodeEnv'>): CookieOptions {
  return { httpOnly: true, sameSite: 'lax', secure: config.nodeEnv === 'production', path: '/' };
}

export function setSessionCookie(res: Response, token: string, config: Pick<Config, 'nodeEnv'>): void {
  res.cookie(SESSION_COOKIE, token, { ...sessionCookieOptions(config), maxAge: SESSION_TTL_SECONDS * 1000 });
}

export function clearSessionCookie(res: Response, config: Pick<Config, 'nodeEnv'>): void {
  res.clearCookie(SESSION_COOKIE, sessionCookieOptions(config));
}

/** The user a session cookie value names, if the token is valid and the account still exists. */
export async function userFromSessionToken(
  knex: Knex,
  tokens: TokenService,
  token: unknown,
): Promise<PublicUser | null> {
  if (typeof token !== 'string' || !token) return null;
  const session = await tokens.verifySession(token);
  return session ? findUserById(knex, session.userId) : null;
}

export function sessionMiddleware(deps: { knex: Knex; tokens: TokenService }): RequestHandler {
  return async (req, _res, next) => {
    const token = (req.cookies as Record<string, unknown> | undefined)?.[SESSION_COOKIE];
    const user = await userFromSessionToken(deps.knex, deps.tokens, token);
    if (user) req.user = user;
    next();
  };
}

/** The signed-in user, or a 401. */
export function signedInUser(req: Request): PublicUser {
  if (!req.user) throw unauthenticated();
  return req.user;
}
