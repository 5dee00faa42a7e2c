/**
 * Does the built client run under securityMiddleware's content security policy? Not a Vitest file (it
 * builds the client and drives Chromium, too slow for the unit run): `npx tsx tests/security/csp-browser.check.ts`.
 *
 * Builds the client into a temp folder, starts the real server on it with the demo data, replaces every
 * answer's Content-Security-Policy with the one `securityHeaders` sends, signs in as the demo owner and walks
 * the room list, a room's workspace (chart, plot, engine worker, both sockets), its members, snapshots and
 * lineage. Every `securitypolicyviolation` event and every CSP console message is printed; exits 1 on any.
 */
import { execFileSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { IncomingMessage } from 'node:http';
import { chromium } from 'playwright-core';
import { startTestServer } from '../server/helpers/test-server';
import { securityHeaders } from '../../server/security/csp';
import { DEMO_PASSWORD, DEMO_USERS } from '../../shared/demo/designs';

/** The policy securityHeaders would send for a request to `host`. */
function policyFor(host: string): string {
  const headers: Record<string, string> = {};
  const res = {
    setHeader: (k: string, v: string) => void (headers[k.toLowerCase()] = String(v)),
    removeHeader: () => undefined,
    getHeader: () => undefined,
  };
  securityHeaders({ nodeEnv: 'development' })({ headers: { host } } as unknown as IncomingMessage as never, res as never, () => undefined);
  return headers['content-security-policy'];
}

const out = mkdtempSync(join(tmpdir(), 'matchloom-csp-build-'));
let failed = false;
try {
  process.stderr.write('building the client...\n');
  execFileSync('npx', ['vite', 'build', '--logLevel', 'warn', '--outDir', out, '--emptyOutDir'], { stdio: 'inherit' });
  const html = readFileSync(join(out, 'index.html'), 'utf8');
  const inlineScripts = [...html.matchAll(/<script(?![^>]*\bsrc=)[^>]*>/g)].map((m) => m[0]);
  const inlineStyles = [...html.matchAll(/<style\b|\sstyle=/g)].map((m) => m[0]);
  console.log(`index.html: ${inlineScripts.length} inline script(s), ${inlineStyles.length} inline style(s)`);
  if (inlineScripts.length || inlineStyles.length) failed = true;

  const server = await startTestServer({ seedDemo: true }, { clientDir: out });
  const host = new URL(server.url).host;
  const policy = policyFor(host);
  console.log(`policy: ${policy}`);
  const browser = await chromium.launch({
    executablePath: '/usr/bin/chromium',
    headless: true,
    args: ['--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-dev-shm-usage', '--disable-background-networking', '--disable-component-update', '--disable-sync'],
  });
  const violations: string[] = [];
  try {
    const context = await browser.newContext({ baseURL: server.url });
    await context.addInitScript(() => {
      document.addEventListener('securitypolicyviolation', (e) => {
        console.warn(`CSP-VIOLATION ${e.violatedDirective} blocked=${e.blockedURI} at ${e.sourceFile}:${e.lineNumber} sample=${e.sample}`);
      });
    });
    await context.route('**/*', async (route) => {
      const response = await route.fetch();
      const headers = { ...response.headers(), 'content-security-policy': policy };
      await route.fulfill({ response, headers });
    });
    const page = await context.newPage();
    page.on('console', (m) => {
      const t = m.text();
      if (t.includes('CSP-VIOLATION') || /Content Security Policy/i.test(t)) violations.push(t);
    });
    page.on('pageerror', (e) => violations.push(`page error: ${e.message}`));
    const signin = await context.request.post('/api/auth/signin', { data: { email: DEMO_USERS[0].email, password: DEMO_PASSWORD } });
    if (signin.status() !== 200) throw new Error(`demo sign-in: ${signin.status()}`);
    const rooms = (await (await context.request.get('/api/rooms')).json()) as { id: string }[];
    const roomId = rooms[0].id;
    for (const path of ['/rooms', `/rooms/${roomId}`, `/rooms/${roomId}/members`, `/rooms/${roomId}/snapshots`, `/rooms/${roomId}/lineage`, `/rooms/${roomId}`]) {
      await page.goto(path, { waitUntil: 'networkidle' });
      await page.waitForTimeout(2500); // the worker's first analysis, the sockets' first messages
      console.log(`visited ${path}: ${await page.title()}`);
    }
    // Interact a little with the workspace: every visible tab.
    for (const tab of await page.getByRole('tab').all()) {
      await tab.click().catch(() => undefined);
      await page.waitForTimeout(300);
    }
  } finally {
    await browser.close();
    await server.close();
  }
  console.log(violations.length ? `CSP violations:\n${violations.join('\n')}` : 'no CSP violations');
  if (violations.length && violations.every((v) => v.includes('blocked=eval')))
    console.log(
      "All of them are blocked eval probes: zod 4 tries `new Function('')` once per realm (page and worker) to decide whether to " +
        'compile its parsers, catches the refusal and parses without compiling. Nothing breaks, but the browser reports it; ' +
        'calling `z.config({ jitless: true })` first thing in the client entry and in the engine worker stops the probe.',
    );
  if (violations.length) failed = true;
} finally {
  rmSync(out, { recursive: true, force: true });
}
process.exit(failed ? 1 : 0);
