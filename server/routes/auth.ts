/** Sign-up, sign-in, sign-out and the signed-in user (CONTRACT §5). */
import { Router } from 'express';
import { z } from 'zod';
import { clearSessionCookie, setSessionCookie, signedInUser } from '../auth/session';
import { PASSWORD_MAX_BYTES, PASSWORD_MIN_CHARS } from '../auth/passwords';
import { HttpError } from '../errors';
import { createUser, findUserCredentials, getAccount, updateAccount } from '../services/users';
import { accountPatchBodySchema } from '../../shared/api/account';
import { bodyObject, check, emailSchema } from '../validate';
import type { AppDeps } from '../app';

const passwordSchema = z
  .string({ error: 'must be a string' })
  .min(PASSWORD_MIN_CHARS, `must be at least ${PASSWORD_MIN_CHARS} characters`)
  .refine(
    (p) => Buffer.byteLength(p, 'utf8') <= PASSWORD_MAX_BYTES,
    `must be at most ${PASSWORD_MAX_BYTES} bytes`,
  );

const signupBody = bodyObject({
  email: emailSchema,
  password: passwordSchema,
  displayName: z
    .string({ error: 'must be a string' })
    .trim()
    .min(1, 'must not be empty')
    .max(80, 'must be at most 80 characters'),
});

// Sign-in checks only the shape: the length rules belong to sign-up, and a refusal must look the same
// whatever was wrong.
const signinBody = bodyObject({
  email: z.string({ error: 'must be a string' }).max(320, 'must be at most 320 characters'),
  password: z.string({ error: 'must be a string' }).max(1024, 'must be at most 1024 characters'),
});

export const SIGNIN_REFUSED = 'The e-mail address or password is not right.';

export function authRoutes({ knex, tokens, passwords, config }: AppDeps): Router {
  const r = Router();

  r.post('/auth/signup', async (req, res) => {
    const body = check(signupBody, req.body);
    const user = await createUser(knex, {
      email: body.email,
      displayName: body.displayName,
      passwordHash: await passwords.hash(body.password),
    });
    setSessionCookie(res, await tokens.signSession(user.id), config);
    res.status(201).json(user);
  });

  r.post('/auth/signin', async (req, res) => {
    const body = check(signinBody, req.body);
    const found = await findUserCredentials(knex, body.email);
    const ok = await passwords.verifyOrDummy(body.password, found?.passwordHash);
    if (!found || !ok) throw new HttpError(401, 'bad-credentials', SIGNIN_REFUSED);
    setSessionCookie(res, await tokens.signSession(found.user.id), config);
    res.json(found.user);
  });

  r.post('/auth/signout', (_req, res) => {
    clearSessionCookie(res, config);
    res.status(204).end();
  });

  r.get('/me', async (req, res) => {
    const account = await getAccount(knex, signedInUser(req).id);
    if (!account) throw new HttpError(401, 'unauthenticated', 'Sign in first.');
    res.json(account);
  });

  r.patch('/me', async (req, res) => {
    const user = signedInUser(req);
    const body = check(accountPatchBodySchema, req.body);
    await updateAccount(knex, user.id, body);
    const account = await getAccount(knex, user.id);
    if (!account) throw new HttpError(401, 'unauthenticated', 'Sign in first.');
    res.json(account);
  });

  return r;
}
