/**
 * Collaboration in the room workspace, with real browsers on one real server: two tuners edit
 * different elements of the 433 MHz whip room at the same moment and both screens converge; an
 * observer sees a tuner's change live, has no editing control, and can follow a tuner; each tuner's
 * undo takes back only their own edit. Screenshots go to e2e/screenshots/ (collab-*.png).
 */
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_PASSWORD, WHIP_ROOM } from '../shared/demo/designs';
import { newAccount, signIn, signUp } from './support/auth';
import { launchBrowser, openSession, type BrowserSession } from './support/browser';
import { startTestServer, type TestServer } from './support/server';

let server: TestServer;
let browser: Browser;
let tunerA: BrowserSession;
let tunerB: BrowserSession;
let observer: BrowserSession;
let roomPath = '';
let roomId = '';
const second = newAccount('Bea Tuner');

const chainList = (page: Page) => page.getByTestId('chain-list');
const inspector = (page: Page) => page.getByTestId('element-inspector');
const chainTexts = (page: Page) => chainList(page).getByRole('button').allInnerTexts();

async function openRoom(s: BrowserSession) {
  await s.page.goto(roomPath);
  await s.page.locator('[data-testid="workspace"][data-synced="true"]').waitFor();
  await chainList(s.page).waitFor();
}

async function select(page: Page, name: string) {
  await chainList(page).getByRole('button', { name: new RegExp(`^${name},`) }).click();
  await inspector(page).getByRole('heading', { name: new RegExp(`^${name}`) }).waitFor();
}

async function typeValue(page: Page, text: string) {
  const field = inspector(page).getByLabel('Value (F)', { exact: true });
  await field.fill(text);
  await field.press('Enter');
}

/** The chain-list line of element `name` ("C1, series C, 22 pF, Q 400, ±5 %"). */
async function lineOf(page: Page, name: string): Promise<string> {
  return (await chainTexts(page)).find((t) => t.startsWith(`${name},`)) ?? '';
}

beforeAll(async () => {
  server = await startTestServer({ seedDemo: true });
  browser = await launchBrowser();
  const viewport = { width: 1366, height: 768 };
  tunerA = await openSession(browser, server.url, { viewport });
  tunerB = await openSession(browser, server.url, { viewport });
  observer = await openSession(browser, server.url, { viewport });

  // The demo owner adds a second tuner to the whip room.
  await signUp(tunerB.page, second);
  const owner = await browser.newContext({ baseURL: server.url });
  try {
    expect((await owner.request.post('/api/auth/signin', { data: { email: 'owner@demo.test', password: DEMO_PASSWORD } })).status()).toBe(200);
    const rooms = (await (await owner.request.get('/api/rooms')).json()) as { id: string; name: string }[] | { rooms: { id: string; name: string }[] };
    const list = Array.isArray(rooms) ? rooms : rooms.rooms;
    const whip = list.find((r) => r.name === WHIP_ROOM);
    if (!whip) throw new Error('the demo whip room is missing');
    roomId = whip.id;
    roomPath = `/rooms/${encodeURIComponent(whip.id)}`;
    const added = await owner.request.post(`/api/rooms/${whip.id}/members`, { data: { email: second.email, role: 'tuner' } });
    expect(added.status()).toBeLessThan(300);
  } finally {
    await owner.close();
  }
  await signIn(tunerA.page, 'tuner@demo.test', DEMO_PASSWORD);
  await signIn(observer.page, 'observer@demo.test', DEMO_PASSWORD);
});

afterAll(async () => {
  for (const s of [tunerA, tunerB, observer]) await s?.close();
  await browser?.close();
  await server?.close();
});

describe('collaboration in the workspace', () => {
  it('two tuners edit different elements at once and both screens converge', async () => {
    await Promise.all([openRoom(tunerA), openRoom(tunerB)]);
    await select(tunerA.page, 'C1');
    await select(tunerB.page, 'C2');
    // Each sees the other in the room, on the element they selected.
    await tunerA.page.getByRole('tab', { name: /^Room/ }).click();
    await tunerA.page.getByTestId('presence-list').getByText(second.displayName).waitFor();
    await tunerA.page.getByTestId('presence-list').getByText('on C2').waitFor();
    await tunerA.page.getByRole('tab', { name: /^Element/ }).click();

    await Promise.all([typeValue(tunerA.page, '22p'), typeValue(tunerB.page, '10 pF')]);
    for (const s of [tunerA, tunerB]) {
      await expect.poll(() => lineOf(s.page, 'C1')).toContain('22 pF');
      await expect.poll(() => lineOf(s.page, 'C2')).toContain('10 pF');
    }
    await tunerA.screenshot('collab-01-two-tuners');
    tunerA.assertClean();
    tunerB.assertClean();
  });

  it('an observer sees a tuner’s change live and has no editing control', async () => {
    const { page } = observer;
    await openRoom(observer);
    await page.getByTestId('read-only-chip').waitFor();
    expect(await page.getByRole('toolbar', { name: 'Add an element' }).count()).toBe(0);
    expect(await page.getByRole('button', { name: 'Undo', exact: true }).count()).toBe(0);
    expect(await page.getByLabel('Tuning steps').count()).toBe(0);

    await select(page, 'C1');
    const value = inspector(page).getByLabel('Value (F)', { exact: true });
    expect(await value.getAttribute('readonly')).not.toBeNull();
    expect(await inspector(page).getByRole('button').count()).toBe(0);
    // Every field of the inspector is read-only or disabled.
    const writable = await inspector(page)
      .locator('input, select, textarea')
      .evaluateAll((els) => els.filter((el) => !(el as HTMLInputElement).readOnly && !(el as HTMLInputElement).disabled).length);
    expect(writable).toBe(0);
    // The forms show the values with nothing to apply them.
    await page.getByRole('tab', { name: 'Load', exact: true }).click();
    expect(await page.getByRole('button', { name: 'Apply load' }).count()).toBe(0);
    await page.getByRole('tab', { name: 'Band & port', exact: true }).click();
    expect(await page.getByRole('button', { name: 'Apply' }).count()).toBe(0);
    // The match finder may be consulted, but offers nothing to apply.
    await page.getByRole('tab', { name: 'Match finder', exact: true }).click();
    await page.getByRole('button', { name: 'Find matches' }).click();
    await page.getByTestId('match-candidate').first().waitFor();
    expect(await page.getByRole('button', { name: /^Apply/ }).count()).toBe(0);
    await page.getByRole('tab', { name: /^Element/ }).click();

    // The tuner's edit reaches the observer's screen while it watches.
    await select(tunerA.page, 'C1');
    const field = inspector(tunerA.page).getByLabel('Value (F)', { exact: true });
    await field.fill('27p');
    // Watch in the observer's page itself, so the time measured is the edit's trip, not the test's polling.
    const seen = page.waitForFunction(() => document.querySelector('[data-testid="chain-list"]')?.textContent?.includes('27 pF') ? Date.now() : 0, undefined, {
      polling: 'raf',
    });
    const sent = await tunerA.page.evaluate(() => Date.now());
    await field.press('Enter');
    const arrived = (await (await seen).jsonValue()) as number;
    console.info(`the observer's screen showed the tuner's edit ${arrived - sent} ms after Enter`);
    await expect.poll(() => lineOf(page, 'C1')).toContain('27 pF');
    await expect.poll(() => value.inputValue()).toBe('27 pF');
    await observer.screenshot('collab-02-observer');
    observer.assertClean();
  });

  it('an observer follows a tuner’s selection', async () => {
    const { page } = observer;
    await page.getByLabel('Follow a member’s view').selectOption({ label: 'Demo Tuner (tuner)' });
    await page.getByTestId('following-chip').getByText('Following Demo Tuner').waitFor();
    await select(tunerA.page, 'C2');
    await inspector(page).getByRole('heading', { name: /^C2/ }).waitFor();
    await select(tunerA.page, 'C1');
    await inspector(page).getByRole('heading', { name: /^C1/ }).waitFor();
    await observer.screenshot('collab-03-observer-following');
    // Choosing an element oneself stops following.
    await select(page, 'C2');
    expect(await page.getByTestId('following-chip').count()).toBe(0);
    observer.assertClean();
  });

  it('undo in one tuner’s screen takes back only that tuner’s own edit', async () => {
    await select(tunerA.page, 'C1');
    await select(tunerB.page, 'C2');
    await typeValue(tunerA.page, '15p');
    await expect.poll(() => lineOf(tunerB.page, 'C1')).toContain('15 pF');
    await typeValue(tunerB.page, '8.2p');
    await expect.poll(() => lineOf(tunerA.page, 'C2')).toContain('8.2 pF');

    // A undoes: A's last edit (15 pF) goes back to 27 pF; B's 8.2 pF stays, on every screen.
    await tunerA.page.getByRole('button', { name: 'Undo', exact: true }).click();
    for (const s of [tunerA, tunerB, observer]) {
      await expect.poll(() => lineOf(s.page, 'C1')).toContain('27 pF');
      await expect.poll(() => lineOf(s.page, 'C2')).toContain('8.2 pF');
    }
    // B undoes from the keyboard: B's 8.2 pF goes back to 10 pF; A's value stays.
    await tunerB.page.getByRole('heading', { level: 1 }).click();
    await tunerB.page.keyboard.press('Control+z');
    for (const s of [tunerA, tunerB]) {
      await expect.poll(() => lineOf(s.page, 'C2')).toContain('10 pF');
      await expect.poll(() => lineOf(s.page, 'C1')).toContain('27 pF');
    }
    // The room log names who changed what.
    await tunerB.page.getByRole('tab', { name: /^Room/ }).click();
    await tunerB.page.getByTestId('room-log').getByText(/Demo Tuner .*C1/).first().waitFor();
    await tunerB.screenshot('collab-04-room-log');
    for (const s of [tunerA, tunerB, observer]) s.assertClean();
  });

  it('a tuner who goes offline keeps editing, comes back with a fresh token, and the edits merge', async () => {
    const { page } = tunerA;
    await page.getByRole('tab', { name: /^Element/ }).click();
    await select(page, 'C1');
    const tokenPosts: number[] = [];
    page.on('request', (r) => {
      if (r.method() === 'POST' && r.url().includes('/collab-token')) tokenPosts.push(Date.now());
    });
    const problemsBefore = tunerA.problems.length;
    await page.context().setOffline(true);
    await page.getByTestId('connection-status').getByText('Reconnecting…').waitFor();
    // An edit made while offline stays on this screen, and goes nowhere yet.
    await typeValue(page, '33p');
    await expect.poll(() => lineOf(page, 'C1')).toContain('33 pF');
    await page.waitForTimeout(4000);
    expect(await lineOf(observer.page, 'C1')).not.toContain('33 pF');
    const wentOnline = Date.now();
    await page.context().setOffline(false);
    await page.getByTestId('connection-status').getByText('Live').waitFor({ timeout: 15_000 });
    // The reconnection asked for a new token (they live 60 s), and the offline edit reached the others.
    expect(tokenPosts.filter((t) => t >= wentOnline).length).toBeGreaterThanOrEqual(1);
    await expect.poll(() => lineOf(observer.page, 'C1'), { timeout: 10_000 }).toContain('33 pF');
    await tunerB.page.getByRole('tab', { name: /^Element/ }).click();
    await expect.poll(() => lineOf(tunerB.page, 'C1'), { timeout: 10_000 }).toContain('33 pF');
    // While offline the browser reports the failed token fetches and socket attempts; nothing else may go wrong.
    const offlineNoise = /ERR_INTERNET_DISCONNECTED|WebSocket|Failed to fetch|NetworkError|collab-token/i;
    const during = tunerA.problems.splice(problemsBefore);
    expect(during.filter((p) => !offlineNoise.test(p))).toEqual([]);
    tunerA.assertClean();
    observer.assertClean();
  });

  it('a role change reaches an open screen at once: editing controls go, and removal ends access', async () => {
    const { page } = tunerB;
    await page.getByRole('tab', { name: /^Element/ }).click();
    const me = (await (await tunerB.context.request.get('/api/me')).json()) as { id: string };
    const owner = await browser.newContext({ baseURL: server.url });
    try {
      await owner.request.post('/api/auth/signin', { data: { email: 'owner@demo.test', password: DEMO_PASSWORD } });
      expect((await owner.request.patch(`/api/rooms/${roomId}/members/${me.id}`, { data: { role: 'observer' } })).status()).toBeLessThan(300);
      await page.getByTestId('read-only-chip').waitFor();
      await page.getByRole('toolbar', { name: 'Add an element' }).waitFor({ state: 'detached' });
      expect(await page.getByRole('button', { name: 'Undo', exact: true }).count()).toBe(0);

      tunerB.expectHttpError({ status: 403, path: `/api/rooms/${roomId}` });
      tunerB.expectHttpError({ status: 404, path: `/api/rooms/${roomId}` });
      expect((await owner.request.delete(`/api/rooms/${roomId}/members/${me.id}`)).status()).toBeLessThan(300);
      await page.getByTestId('banner-access').getByText('You no longer have access to this room.').waitFor();
      await tunerB.screenshot('collab-05-access-ended');
    } finally {
      await owner.close();
    }
    // The others carry on.
    await select(tunerA.page, 'C1');
    await typeValue(tunerA.page, '24p');
    await expect.poll(() => lineOf(observer.page, 'C1')).toContain('24 pF');
    tunerA.assertClean();
    observer.assertClean();
  });
});
