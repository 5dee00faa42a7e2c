/**
 * A real Matchloom server for tests: a fresh SQLite file in its own temp folder, port 0 on 127.0.0.1,
 * no demo data unless asked, bcrypt cost 4, silent logs. Use one per test file:
 *
 *   const server = await startTestServer();            // or startTestServer({ seedDemo: true })
 *   const { agent, user } = await signUp(server);      // a supertest agent holding the session cookie
 *   await agent.get('/api/rooms').expect(200);
 *   await server.close();                              // also deletes the temp folder
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import supertest from 'supertest';
import type TestAgent from 'supertest/lib/agent';
import { loadConfig, type Config } from '../../../server/config';
import { startServer, type RunningServer, type StartOptions } from '../../../server/main';

export interface TestServer extends RunningServer {
  config: Config;
  /** the temp folder holding the database (removed by close). */
  dir: string;
  /** a fresh cookie-keeping client for this server. */
  agent(): TestAgent;
}

export async function startTestServer(
  overrides: Partial<Config> = {},
  options: StartOptions = {},
): Promise<TestServer> {
  const dir = mkdtempSync(join(tmpdir(), 'matchloom-test-'));
  const config: Config = {
    ...loadConfig({
      NODE_ENV: 'test',
      LOG_LEVEL: 'silent',
      DATABASE_FILE: join(dir, 'matchloom.sqlite3'),
      BCRYPT_COST: '4',
    }),
    port: 0,
    host: '127.0.0.1',
    seedDemo: false,
    ...overrides,
  };
  const server = await startServer(config, { clientDir: null, ...options });
  return {
    ...server,
    config,
    dir,
    agent: () => supertest.agent(server.url),
    async close() {
      await server.close();
      rmSync(dir, { recursive: true, force: true });
    },
  };
}

let counter = 0;
/** A unique address for a test account. */
export function uniqueEmail(prefix = 'user'): string {
  counter += 1;
  return `${prefix}-${process.pid}-${counter}-${Math.random().toString(36).slice(2, 8)}@example.test`;
}

export const TEST_PASSWORD = 'correct horse battery';

/** Sign up a new account; returns an agent holding its session cookie, the account and the cookie itself. */
export async function signUp(
  server: Pick<TestServer, 'agent'>,
  input: { email?: string; password?: string; displayName?: string } = {},
): Promise<{
  agent: TestAgent;
  user: { id: string; email: string; displayName: string };
  password: string;
  /** `ml_session=<token>`, for sockets. */
  cookie: string;
}> {
  const agent = server.agent();
  const password = input.password ?? TEST_PASSWORD;
  const res = await agent
    .post('/api/auth/signup')
    .send({
      email: input.email ?? uniqueEmail(),
      password,
      displayName: input.displayName ?? 'Test Engineer',
    })
    .expect(201);
  const setCookie = ([] as string[]).concat(res.headers['set-cookie'] ?? []);
  const cookie = setCookie.find((c) => c.startsWith('ml_session='))?.split(';')[0] ?? '';
  return { agent, user: res.body, password, cookie };
}

/** A signed-in agent for an existing account. */
export async function signIn(
  server: Pick<TestServer, 'agent'>,
  email: string,
  password: string,
): Promise<TestAgent> {
  const agent = server.agent();
  await agent.post('/api/auth/signin').send({ email, password }).expect(200);
  return agent;
}

/** The four accounts most room tests need: one for each role, and someone outside the room. */
export async function signUpTeam(server: Pick<TestServer, 'agent'>) {
  return {
    owner: await signUp(server, { displayName: 'Olive Owner' }),
    tuner: await signUp(server, { displayName: 'Tom Tuner' }),
    observer: await signUp(server, { displayName: 'Orla Observer' }),
    outsider: await signUp(server, { displayName: 'Otto Outsider' }),
  };
}
