/**
 * Debian's Chromium through playwright-core, and pages that fail the test on any console error,
 * uncaught page error, or 4xx/5xx answer the test did not expect (`GET /api/me` → 401 on a
 * signed-out page is expected by default; add more with `session.expectHttpError(...)`).
 */
import { mkdir } from 'node:fs/promises';
import { join, resolve } from 'node:path';
import { chromium, type Browser, type BrowserContext, type Page } from 'playwright-core';

export const SCREENSHOT_DIR = resolve('e2e/screenshots');

export function launchBrowser(): Promise<Browser> {
  return chromium.launch({
    executablePath: '/usr/bin/chromium',
    headless: true,
    args: [
      '--no-sandbox',
      '--disable-gpu',
      '--disable-quic',
      '--no-first-run',
      '--disable-dev-shm-usage',
      '--disable-background-networking',
      '--disable-component-update',
      '--disable-sync',
    ],
  });
}

/** An HTTP answer a test expects to fail: its status and the path it was for (a string prefix or a pattern). */
export interface ExpectedHttpError {
  status: number;
  path: string | RegExp;
  method?: string;
}

const DEFAULT_EXPECTED: ExpectedHttpError[] = [{ status: 401, path: '/api/me', method: 'GET' }];

export interface BrowserSession {
  context: BrowserContext;
  page: Page;
  baseUrl: string;
  /** Problems seen so far: console errors, page errors, unexpected 4xx/5xx answers. */
  problems: string[];
  expectHttpError(expected: ExpectedHttpError): void;
  /** Throws (failing the test) when the page has logged any problem. */
  assertClean(): void;
  screenshot(name: string): Promise<string>;
  close(): Promise<void>;
}

const matches = (expected: ExpectedHttpError, method: string, status: number, path: string) =>
  expected.status === status &&
  (!expected.method || expected.method === method) &&
  (typeof expected.path === 'string' ? path.startsWith(expected.path) : expected.path.test(path));

/** A new, isolated browser context (its own cookies) with one page watched for problems. */
export async function openSession(
  browser: Browser,
  baseUrl: string,
  { viewport = { width: 1280, height: 860 } }: { viewport?: { width: number; height: number } } = {},
): Promise<BrowserSession> {
  const context = await browser.newContext({ baseURL: baseUrl, viewport, locale: 'en-GB', timezoneId: 'UTC' });
  const page = await context.newPage();
  const expected = [...DEFAULT_EXPECTED];
  const problems: string[] = [];

  // Every 4xx/5xx answer is checked here against the expected ones, so Chromium's console note
  // about it ("Failed to load resource: the server responded with a status of 401") adds nothing.
  page.on('response', (response) => {
    const status = response.status();
    if (status < 400) return;
    const method = response.request().method();
    const { pathname } = new URL(response.url());
    if (!expected.some((e) => matches(e, method, status, pathname))) problems.push(`unexpected HTTP ${status} for ${method} ${pathname}`);
  });
  page.on('console', (message) => {
    if (message.type() !== 'error') return;
    const text = message.text();
    if (text.startsWith('Failed to load resource: the server responded with a status of')) return;
    problems.push(`console error: ${text}${message.location().url ? ` (${message.location().url})` : ''}`);
  });
  page.on('pageerror', (error) => problems.push(`page error: ${error.message}`));

  return {
    context,
    page,
    baseUrl,
    problems,
    expectHttpError: (e) => void expected.push(e),
    assertClean() {
      if (problems.length) throw new Error(`The page reported problems:\n${problems.join('\n')}`);
    },
    async screenshot(name) {
      await mkdir(SCREENSHOT_DIR, { recursive: true });
      const path = join(SCREENSHOT_DIR, `${name}.png`);
      // The whole page only when it is really longer than the window: a full-page capture resizes the
      // viewport, and the workspace's canvases can then be caught mid-resize (DEVELOPERS.md).
      const overflow = await page.evaluate(() => document.documentElement.scrollHeight - window.innerHeight);
      await page.screenshot({ path, fullPage: overflow > 24 });
      return path;
    },
    async close() {
      await context.close();
    },
  };
}
