import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { ConfigError, loadConfig } from '../../server/config';

const dir = mkdtempSync(join(tmpdir(), 'matchloom-config-'));
const base = { DATABASE_FILE: join(dir, 'db', 'm.sqlite3') };
afterAll(() => rmSync(dir, { recursive: true, force: true }));

function errorOf(env: NodeJS.ProcessEnv): string {
  try {
    loadConfig(env);
  } catch (e) {
    expect(e).toBeInstanceOf(ConfigError);
    return (e as Error).message;
  }
  throw new Error('loadConfig accepted a bad configuration');
}

describe('loadConfig', () => {
  it('gives the documented defaults', () => {
    const c = loadConfig(base);
    expect(c).toMatchObject({
      port: 3000,
      host: '0.0.0.0',
      seedDemo: true,
      nodeEnv: 'development',
      logLevel: 'info',
      bcryptCost: 10,
    });
    expect(loadConfig({ JWT_SECRET: 'y'.repeat(32) }).databaseFile).toBe('db/matchloom.sqlite3');
  });

  it('reads every variable', () => {
    const c = loadConfig({
      ...base,
      PORT: '8080',
      HOST: '127.0.0.1',
      SEED_DEMO: '0',
      NODE_ENV: 'production',
      JWT_SECRET: 'x'.repeat(40),
      SMTP_URL: 'smtp://127.0.0.1:2525',
      PUBLIC_URL: 'https://matchloom.example.test',
      LOG_LEVEL: 'WARN',
      REDIS_URL: 'redis://127.0.0.1:6379',
      BCRYPT_COST: '12',
    });
    expect(c).toMatchObject({
      port: 8080,
      host: '127.0.0.1',
      seedDemo: false,
      nodeEnv: 'production',
      smtpUrl: 'smtp://127.0.0.1:2525',
      publicUrl: 'https://matchloom.example.test',
      logLevel: 'warn',
      redisUrl: 'redis://127.0.0.1:6379',
      bcryptCost: 12,
    });
    expect(new TextDecoder().decode(c.jwtSecret)).toBe('x'.repeat(40));
  });

  it.each([
    [{ PORT: 'abc' }, /^Invalid configuration: PORT must be a whole number from 0 to 65535 \(got "abc"\)$/],
    [{ PORT: '70000' }, /PORT must be a whole number/],
    [{ PORT: '-1' }, /PORT must be a whole number/],
    [{ PORT: '3000.5' }, /PORT must be a whole number/],
    [{ SEED_DEMO: 'maybe' }, /SEED_DEMO must be 1 or 0/],
    [{ NODE_ENV: 'staging' }, /NODE_ENV must be development, production or test/],
    [{ LOG_LEVEL: 'loud' }, /LOG_LEVEL must be one of/],
    [{ PUBLIC_URL: 'not a url' }, /PUBLIC_URL must be a URL/],
    [{ JWT_SECRET: 'short' }, /JWT_SECRET must be at least 32 characters/],
    [{ BCRYPT_COST: '3' }, /BCRYPT_COST must be a whole number from 4 to 15/],
    [{ NODE_ENV: 'production' }, /JWT_SECRET is required in production/],
  ])('refuses %o with one clear line', (env, pattern) => {
    const message = errorOf({ ...base, ...env });
    expect(message).toMatch(pattern);
    expect(message).not.toContain('\n');
  });

  it('treats blank values as unset', () => {
    expect(loadConfig({ ...base, PORT: '', SEED_DEMO: ' ' })).toMatchObject({ port: 3000, seedDemo: true });
  });

  it('keeps a development secret beside the database, the same across restarts', () => {
    const first = loadConfig(base).jwtSecret;
    const second = loadConfig(base).jwtSecret;
    expect(first.byteLength).toBeGreaterThanOrEqual(32);
    expect(Buffer.from(second).equals(Buffer.from(first))).toBe(true);
    expect(readFileSync(join(dir, 'db', 'm.sqlite3.jwt-secret'), 'utf8').trim()).toBe(
      new TextDecoder().decode(first),
    );
  });
});
