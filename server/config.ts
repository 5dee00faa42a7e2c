/**
 * The server's configuration, read once from the environment and checked with zod. A bad value throws a
 * `ConfigError` whose message is one line naming the variable (start.ts prints it and exits), so nothing
 * else in the server reads `process.env`.
 */
import { randomBytes } from 'node:crypto';
import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { dirname, resolve } from 'node:path';
import { z } from 'zod';

export interface Config {
  port: number;
  host: string;
  databaseFile: string;
  databaseUrl?: string;
  seedDemo: boolean;
  nodeEnv: 'development' | 'production' | 'test';
  jwtSecret: Uint8Array;
  smtpUrl?: string;
  /** The From of the mail the server sends (MAIL_FROM). */
  mailFrom: string;
  publicUrl?: string;
  logLevel: string;
  redisUrl?: string;
  /** bcrypt cost factor (BCRYPT_COST, 4–15, default 10); tests lower it to stay fast. */
  bcryptCost?: number;
}

export class ConfigError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'ConfigError';
  }
}

/** `.invalid` is reserved (RFC 2606): no real domain is named. Set MAIL_FROM for a real mail server. */
export const DEFAULT_MAIL_FROM = 'Matchloom <no-reply@matchloom.invalid>';

const LOG_LEVELS = ['fatal', 'error', 'warn', 'info', 'debug', 'trace', 'silent'] as const;
const blankToUndefined = (v: unknown) => (typeof v === 'string' && v.trim() === '' ? undefined : v);

const flag = (name: string, fallback: boolean) =>
  z.preprocess(
    blankToUndefined,
    z
      .string()
      .optional()
      .transform((v, ctx) => {
        if (v === undefined) return fallback;
        const s = v.trim().toLowerCase();
        if (['1', 'true', 'yes', 'on'].includes(s)) return true;
        if (['0', 'false', 'no', 'off'].includes(s)) return false;
        ctx.addIssue({ code: 'custom', message: `${name} must be 1 or 0 (got ${JSON.stringify(v)})` });
        return z.NEVER;
      }),
  );

const wholeNumber = (name: string, min: number, max: number, fallback: number) =>
  z.preprocess(
    blankToUndefined,
    z
      .string()
      .optional()
      .transform((v, ctx) => {
        if (v === undefined) return fallback;
        const n = Number(v.trim());
        if (!/^\d+$/.test(v.trim()) || !Number.isSafeInteger(n) || n < min || n > max) {
          ctx.addIssue({
            code: 'custom',
            message: `${name} must be a whole number from ${min} to ${max} (got ${JSON.stringify(v)})`,
          });
          return z.NEVER;
        }
        return n;
      }),
  );

const url = (name: string) =>
  z.preprocess(
    blankToUndefined,
    z
      .string()
      .optional()
      .refine((v) => v === undefined || URL.canParse(v), { message: `${name} must be a URL` }),
  );

const envSchema = z.object({
  PORT: wholeNumber('PORT', 0, 65535, 3000),
  HOST: z.preprocess(blankToUndefined, z.string().default('0.0.0.0')),
  DATABASE_FILE: z.preprocess(blankToUndefined, z.string().default('db/matchloom.sqlite3')),
  DATABASE_URL: url('DATABASE_URL'),
  SEED_DEMO: flag('SEED_DEMO', true),
  NODE_ENV: z.preprocess(
    blankToUndefined,
    z
      .enum(['development', 'production', 'test'], {
        error: 'NODE_ENV must be development, production or test',
      })
      .default('development'),
  ),
  JWT_SECRET: z.preprocess(
    blankToUndefined,
    z.string().min(32, 'JWT_SECRET must be at least 32 characters').optional(),
  ),
  SMTP_URL: url('SMTP_URL'),
  MAIL_FROM: z.preprocess(
    blankToUndefined,
    z
      .string()
      .max(320, 'MAIL_FROM must be at most 320 characters')
      .refine((v) => !/[\r\n]/.test(v), 'MAIL_FROM must be one line')
      .default(DEFAULT_MAIL_FROM),
  ),
  PUBLIC_URL: url('PUBLIC_URL'),
  LOG_LEVEL: z.preprocess(
    (v) => (typeof v === 'string' ? (v.trim() === '' ? undefined : v.trim().toLowerCase()) : v),
    z.enum(LOG_LEVELS, { error: `LOG_LEVEL must be one of ${LOG_LEVELS.join(', ')}` }).default('info'),
  ),
  REDIS_URL: url('REDIS_URL'),
  BCRYPT_COST: wholeNumber('BCRYPT_COST', 4, 15, 10),
});

/**
 * Outside production a missing JWT_SECRET is replaced by a random one kept in a file beside the
 * database (`<DATABASE_FILE>.jwt-secret`), so sessions survive a restart. (An in-memory database gets a fresh secret each time.)
 */
function devSecret(databaseFile: string): Uint8Array {
  if (databaseFile === ':memory:') return randomBytes(32);
  // `<database file>.jwt-secret`: beside the database, and git-ignored with it (db/*.sqlite3*).
  const file = `${resolve(databaseFile)}.jwt-secret`;
  try {
    if (existsSync(file)) {
      const text = readFileSync(file, 'utf8').trim();
      if (text.length >= 32) return new TextEncoder().encode(text);
    }
    mkdirSync(dirname(file), { recursive: true });
    const text = randomBytes(32).toString('base64url');
    writeFileSync(file, text + '\n', { mode: 0o600 });
    return new TextEncoder().encode(text);
  } catch (e) {
    throw new ConfigError(
      `JWT_SECRET is not set and the secret file ${file} cannot be written (${(e as Error).message})`,
    );
  }
}

/** Read and check the configuration; throws `ConfigError` (one line) for a bad value. */
export function loadConfig(env: NodeJS.ProcessEnv = process.env): Config {
  const parsed = envSchema.safeParse(env);
  if (!parsed.success) {
    const issue = parsed.error.issues[0];
    const key = String(issue?.path[0] ?? '');
    const message = issue?.message ?? 'is not valid';
    throw new ConfigError(
      `Invalid configuration: ${message.startsWith(key) ? message : `${key}: ${message}`}`,
    );
  }
  const e = parsed.data;
  if (e.NODE_ENV === 'production' && !e.JWT_SECRET)
    throw new ConfigError(
      'Invalid configuration: JWT_SECRET is required in production (at least 32 characters)',
    );
  return {
    port: e.PORT,
    host: e.HOST,
    databaseFile: e.DATABASE_FILE,
    databaseUrl: e.DATABASE_URL,
    seedDemo: e.SEED_DEMO,
    nodeEnv: e.NODE_ENV,
    jwtSecret: e.JWT_SECRET ? new TextEncoder().encode(e.JWT_SECRET) : devSecret(e.DATABASE_FILE),
    smtpUrl: e.SMTP_URL,
    mailFrom: e.MAIL_FROM,
    publicUrl: e.PUBLIC_URL,
    logLevel: e.LOG_LEVEL,
    redisUrl: e.REDIS_URL,
    bcryptCost: e.BCRYPT_COST,
  };
}
