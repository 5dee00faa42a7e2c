/**
 * The team features end to end on the seeded demo server: a tuner saves a snapshot, branches it,
 * changes the branch (a restored snapshot and a new load measurement uploaded through the page) and
 * compares the two; an observer's note appears live in the tuner's window and the reply in the
 * observer's; the observer sees no snapshot, branch, restore or upload controls; the lineage tree;
 * restore from the table; an invitation read from the development mailbox and accepted after signing
 * up; the hand-off design file downloaded and imported as a new room, and a broken one refused with
 * the path the server names. Screenshots go to e2e/screenshots/ (team-*.png).
 */
import { readFile } from 'node:fs/promises';
import type { APIRequestContext, Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_PASSWORD, DEMO_USERS, WHIP_ROOM } from '../shared/demo/designs';
import { newAccount, signIn } from './support/auth';
import { launchBrowser, openSession, type BrowserSession } from './support/browser';
import { startTestServer, type TestServer } from './support/server';

let server: TestServer;
let browser: Browser;
const sessions: BrowserSession[] = [];

async function session(viewport?: { width: number; height: number }): Promise<BrowserSession> {
  const s = await openSession(browser, server.url, viewport ? { viewport } : {});
  sessions.push(s);
  return s;
}

const demo = (role: 'owner' | 'tuner' | 'observer') => DEMO_USERS.find((u) => u.role === role)!;

async function roomIdByName(request: APIRequestContext, name: string): Promise<string> {
  const rooms = (await (await request.get('/api/rooms')).json()) as { id: string; name: string }[];
  const room = rooms.find((r) => r.name === name);
  if (!room) throw new Error(`no room named ${name}`);
  return room.id;
}

/**
 * An invented measurement of the whip (a series RLC: R = 14 Ω, L = 30 nH, C = 9 pF, a little more
 * loss than the model) from 380 to 480 MHz, as a Touchstone .s1p in real/imaginary form on 50 Ω.
 */
function whipMeasurement(): string {
  const lines = ['! invented whip measurement for the browser test', '# MHz S RI R 50'];
  for (let i = 0; i <= 100; i++) {
    const f = 380e6 + i * 1e6;
    const w = 2 * Math.PI * f;
    const x = w * 30e-9 - 1 / (w * 9e-12);
    // Γ = (Z − 50)/(Z + 50) with Z = 14 + jX.
    const nr = 14 - 50;
    const dr = 14 + 50;
    const den = dr * dr + x * x;
    const re = (nr * dr + x * x) / den;
    const im = (x * dr - nr * x) / den;
    lines.push(`${(f / 1e6).toFixed(1)} ${re.toFixed(6)} ${im.toFixed(6)}`);
  }
  return `${lines.join('\n')}\n`;
}

async function waitForCharts(page: Page): Promise<void> {
  // The Smith chart (Konva) and the sweep plot (uPlot) both draw into canvases once analysed.
  await page.getByRole('figure', { name: 'Smith chart of both designs' }).locator('canvas').first().waitFor();
  await page.getByRole('figure', { name: 'Sweep plot of both designs' }).locator('canvas').first().waitFor();
  await page.getByText('Analysing…').waitFor({ state: 'detached' });
  await page.getByText('analysing…').first().waitFor({ state: 'detached' });
}

beforeAll(async () => {
  server = await startTestServer({ seedDemo: true });
  browser = await launchBrowser();
});

afterAll(async () => {
  for (const s of sessions) await s.close();
  await browser?.close();
  await server?.close();
});

describe('team features', () => {
  let tuner: BrowserSession;
  let observer: BrowserSession;
  let whipId = '';
  let branchId = '';
  let baselineId = '';
  const baseline = 'E12 before the bench measurement';
  const branchName = '433 MHz whip — measured load';

  it('saves a snapshot as the tuner and finds it in the table, sortable and filterable', async () => {
    tuner = await session({ width: 1440, height: 960 });
    const { page, context } = tuner;
    await signIn(page, demo('tuner').email, DEMO_PASSWORD);
    whipId = await roomIdByName(context.request, WHIP_ROOM);

    await page.goto(`/rooms/${whipId}`);
    await page.getByRole('navigation', { name: 'Room pages' }).getByRole('link', { name: 'Snapshots' }).click();
    await page.waitForURL((url) => url.pathname === `/rooms/${whipId}/snapshots`);
    const table = page.getByRole('table', { name: 'The room’s snapshots' });
    await table.getByText('E12 values').waitFor();
    await table.getByText('first cut').waitFor();

    const form = page.getByRole('form', { name: 'Save a snapshot' });
    // An empty label is refused beside the field without a request.
    await form.getByRole('button', { name: 'Save snapshot' }).click();
    await form.getByText('Give the snapshot a label').waitFor();
    await form.getByLabel('Snapshot label').fill(baseline);
    await form.getByRole('checkbox', { name: 'For review' }).check();
    await form.getByRole('button', { name: 'Save snapshot' }).click();
    await page.getByRole('status').filter({ hasText: 'Snapshot saved' }).waitFor();
    const row = table.getByRole('row').filter({ hasText: baseline });
    await row.waitFor();
    await row.getByText('for review', { exact: true }).waitFor();
    baselineId = (await row.getAttribute('data-snapshot-id')) ?? '';
    expect(baselineId).not.toBe('');
    // The server's figures: the E12 whip meets VSWR ≤ 2 with two parts.
    expect(await row.getByRole('cell').nth(5).textContent()).toBe('2');
    const vswr = Number(await row.getByRole('cell').nth(4).textContent());
    expect(vswr).toBeGreaterThan(1);
    expect(vswr).toBeLessThan(2);

    // Newest first; the filter narrows to the matching label.
    expect(await table.getByRole('row').nth(1).getAttribute('data-snapshot-id')).toBe(baselineId);
    await page.getByLabel('Filter by label or person').fill('first');
    await expect.poll(() => table.getByRole('row').count()).toBe(2);
    await page.getByLabel('Filter by label or person').fill('');
    await page.getByRole('checkbox', { name: 'For review only' }).check();
    await expect.poll(() => table.getByRole('row').count()).toBe(2);
    await page.getByRole('checkbox', { name: 'For review only' }).uncheck();
    await tuner.screenshot('team-01-snapshots-tuner');
    tuner.assertClean();
  });

  it('branches the snapshot, copying the members', async () => {
    const { page } = tuner;
    await page.getByRole('button', { name: `Branch from ${baseline}` }).click();
    const form = page.getByRole('form', { name: `Branch from ${baseline}` });
    await form.getByLabel('Branch name').fill(branchName);
    await form.getByRole('checkbox', { name: 'Copy this room’s members, with their roles' }).check();
    await form.getByRole('button', { name: 'Create branch' }).click();
    const open = page.getByRole('link', { name: 'Open the branch' });
    await open.waitFor();
    branchId = decodeURIComponent((await open.getAttribute('href'))!.split('/')[2]);
    expect(branchId).not.toBe(whipId);
    await open.click();
    await page.waitForURL((url) => url.pathname === `/rooms/${branchId}`);
    await page.getByRole('heading', { level: 1, name: branchName }).waitFor();
    // The tuner owns the branch they started.
    await page.locator('header').getByText('owner', { exact: true }).waitFor();
    tuner.assertClean();
  });

  it('changes the branch: restores the first cut into it, then replaces the load with an uploaded measurement', async () => {
    const { page, context } = tuner;
    // A snapshot of the room the branch came from may be restored into the branch (one edit).
    const snapshots = (await (await context.request.get(`/api/rooms/${whipId}/snapshots`)).json()) as { id: string; label: string }[];
    const firstCut = snapshots.find((s) => s.label === 'first cut')!;
    const restored = await context.request.post(`/api/rooms/${branchId}/snapshots/${firstCut.id}/restore`);
    expect(restored.status()).toBe(200);

    await page.getByRole('navigation', { name: 'Room pages' }).getByRole('link', { name: 'Uploads' }).click();
    await page.waitForURL((url) => url.pathname === `/rooms/${branchId}/uploads`);
    const form = page.getByRole('form', { name: 'Upload a measurement' });

    // A file that does not parse: the server names the line, and the page shows it.
    tuner.expectHttpError({ status: 400, path: `/api/rooms/${branchId}/uploads`, method: 'POST' });
    await form.getByLabel(/Touchstone file/).setInputFiles({
      name: 'bench-broken.s1p',
      mimeType: 'application/octet-stream',
      buffer: Buffer.from('# MHz S RI R 50\n400 0.1 0.2\n410 0.1 zebra\n'),
    });
    await form.getByRole('button', { name: 'Upload' }).click();
    const refusal = page.getByTestId('upload-error');
    await refusal.waitFor();
    expect(await refusal.textContent()).toMatch(/line 3/i);
    await tuner.screenshot('team-02a-upload-error');

    await form.getByLabel(/Touchstone file/).setInputFiles({ name: 'whip-bench.s1p', mimeType: 'application/octet-stream', buffer: Buffer.from(whipMeasurement()) });
    await form.getByRole('button', { name: 'Upload' }).click();
    const row = page.getByRole('table', { name: 'Uploaded measurements' }).getByRole('row').filter({ hasText: 'whip-bench.s1p' });
    await row.waitFor();
    expect(await row.getByRole('cell').nth(3).textContent()).toBe('1');
    expect(await row.getByRole('cell').nth(4).textContent()).toBe('101');
    expect(await row.getByRole('cell').nth(5).textContent()).toBe('380 MHz – 480 MHz');
    await row.getByRole('button', { name: 'Replace the load with whip-bench.s1p, keeping a snapshot first' }).click();
    await page.getByText('The load is now the measurement').waitFor();
    await tuner.screenshot('team-02b-upload-replaced');
    const design = (await (await context.request.get(`/api/rooms/${branchId}/design`)).json()) as { load: { kind: string } };
    expect(design.load.kind).toBe('measured');
    tuner.assertClean();
  });

  it('compares the branch with the snapshot it came from: both traces drawn, the differences listed', async () => {
    const { page } = tuner;
    await page.goto(`/rooms/${branchId}/compare?a=${baselineId}&b=live`);
    const view = page.getByTestId('compare-view');
    await view.waitFor();
    await waitForCharts(page);
    const diff = page.getByRole('table', { name: 'Differences' });
    const rowText = async (subject: string) =>
      (await diff.getByRole('row').filter({ has: page.getByRole('rowheader', { name: new RegExp(subject) }) }).first().innerText()).replace(/\s+/g, ' ');
    expect(await rowText('C1 \\(series C\\): value')).toContain('18 pF');
    expect(await rowText('C1 \\(series C\\): value')).toContain('18.67 pF');
    expect(await rowText('Load model')).toContain('RLC model');
    expect(await rowText('Load model')).toContain('measured (Touchstone)');
    expect(await rowText('Design name')).toContain(branchName);
    // Both sides analysed: the figures table has numbers, never NaN.
    const figures = await page.getByRole('region', { name: 'Figures' }).innerText();
    expect(figures).not.toMatch(/NaN/);
    expect(figures).toMatch(/“E12 before the bench measurement”/);
    await page.getByRole('heading', { name: 'Figures' }).scrollIntoViewIfNeeded();
    const shot = await tuner.screenshot('team-03-compare');
    expect((await readFile(shot)).byteLength).toBeGreaterThan(20_000);

    // The VSWR view of the same two.
    await page.getByRole('button', { name: 'VSWR', exact: true }).click();
    await page.getByText('VSWR across the sweep').waitFor();

    // On a phone the page stacks and never scrolls sideways (wide tables scroll inside their own frame).
    await page.setViewportSize({ width: 390, height: 844 });
    for (const path of [`/rooms/${branchId}/compare?a=${baselineId}&b=live`, `/rooms/${whipId}/snapshots`]) {
      await page.goto(path);
      await page.getByRole('navigation', { name: 'Room pages' }).waitFor();
      if (path.includes('compare')) await waitForCharts(page);
      else await page.getByRole('table', { name: 'The room’s snapshots' }).getByText(baseline).waitFor();
      const overflow = await page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth);
      expect(overflow, path).toBeLessThanOrEqual(0);
    }
    await tuner.screenshot('team-03b-snapshots-narrow');
    await page.setViewportSize({ width: 1440, height: 960 });
    tuner.assertClean();
  });

  it('shows the lineage: the room, its snapshots and the branch under the one it came from', async () => {
    const { page } = tuner;
    await page.goto(`/rooms/${branchId}/lineage`);
    const tree = page.getByRole('list', { name: 'Lineage' });
    await tree.waitFor();
    const whipRoom = tree.locator(`[data-lineage-room="${whipId}"]`);
    await whipRoom.getByRole('link', { name: WHIP_ROOM }).waitFor();
    const snapshotLine = tree.locator(`[data-lineage-snapshot="${baselineId}"]`);
    await snapshotLine.getByRole('link', { name: baseline }).waitFor();
    // The branch is drawn inside the snapshot's item, marked as this room.
    const branchLine = tree
      .locator('li')
      .filter({ has: page.locator(`[data-lineage-snapshot="${baselineId}"]`) })
      .last()
      .locator(`[data-lineage-room="${branchId}"]`);
    await branchLine.getByText('this room').waitFor();
    await tree.getByText('first cut').first().waitFor();
    await tuner.screenshot('team-04-lineage');
    // A snapshot opens beside its room as it is now.
    await snapshotLine.getByRole('link', { name: baseline }).click();
    await page.waitForURL((url) => url.pathname === `/rooms/${whipId}/compare` && url.searchParams.get('a') === baselineId);
    await page.getByTestId('compare-view').waitFor();
    await page.getByText('The two designs are the same').waitFor();
    tuner.assertClean();
  });

  it('shows an observer’s note live in the tuner’s window, and the tuner’s reply in the observer’s', async () => {
    observer = await session();
    await signIn(observer.page, demo('observer').email, DEMO_PASSWORD);
    await observer.page.goto(`/rooms/${whipId}/notes`);
    await tuner.page.goto(`/rooms/${whipId}/notes`);
    for (const s of [observer, tuner]) await s.page.locator('[data-testid="notes-panel"][data-live="live"]').waitFor();

    const body = 'Is C2 rated for the voltage it sees at 25 mW? Please add the rating to the BOM.';
    const form = observer.page.getByRole('form', { name: 'New note' });
    await form.getByLabel('Note').fill(body);
    await form.getByRole('radio', { name: 'An element' }).check();
    await form.getByLabel('Element', { exact: true }).selectOption('c-shunt');
    await form.getByRole('button', { name: 'Post note' }).click();
    const mine = observer.page.getByRole('article', { name: 'Note by Demo Observer' }).filter({ hasText: body });
    await mine.waitFor();

    // No reload in the tuner's window: the note arrives over the room's event socket.
    const card = tuner.page.getByRole('article', { name: 'Note by Demo Observer' }).filter({ hasText: body });
    await card.getByText(body).waitFor({ timeout: 10_000 });
    await card.getByText('on C2 (shunt C)').waitFor();
    await tuner.screenshot('team-05a-note-arrived-tuner');

    await card.getByRole('button', { name: 'Reply to Demo Observer' }).click();
    await card.getByLabel('Your reply').fill('Yes: 50 V C0G part, about 3 V peak here.');
    await card.getByRole('button', { name: 'Post reply' }).click();
    await mine.getByText('Yes: 50 V C0G part').waitFor({ timeout: 10_000 });
    await observer.screenshot('team-05b-note-observer');
    const resolvedBefore = await observer.page.getByRole('button', { name: /^Resolved \(/ }).textContent();
    await card.getByRole('button', { name: 'Resolve' }).click();
    // The thread leaves the observer's open list once the tuner resolves it.
    await mine.waitFor({ state: 'detached', timeout: 10_000 });
    expect(await observer.page.getByRole('button', { name: /^Resolved \(/ }).textContent()).not.toBe(resolvedBefore);
    observer.assertClean();
    tuner.assertClean();
  });

  it('gives the observer no snapshot, branch, restore or upload controls', async () => {
    const { page } = observer;
    await page.goto(`/rooms/${whipId}/snapshots`);
    const table = page.getByRole('table', { name: 'The room’s snapshots' });
    await table.getByText(baseline).waitFor();
    await page.getByText('Owners and tuners save, restore and branch snapshots').waitFor();
    expect(await page.getByRole('form', { name: 'Save a snapshot' }).count()).toBe(0);
    expect(await page.getByRole('button', { name: /^(Restore|Branch|Mark|Clear the review)/ }).count()).toBe(0);
    // No button in any row (the column heads' sort buttons are for reading).
    expect(await table.locator('tbody').getByRole('button').count()).toBe(0);
    // Reading and comparing are open to everyone.
    expect(await table.getByRole('link', { name: /^Compare .* with the room now$/ }).count()).toBeGreaterThan(0);
    await observer.screenshot('team-06-snapshots-observer');

    await page.goto(`/rooms/${whipId}/uploads`);
    await page.getByText('Owners and tuners upload measurements').waitFor();
    expect(await page.getByRole('form', { name: 'Upload a measurement' }).count()).toBe(0);
    expect(await page.locator('input[type="file"]').count()).toBe(0);
    expect(await page.getByRole('button', { name: /Use as|Replace/ }).count()).toBe(0);

    // The server agrees.
    const refused = await observer.context.request.post(`/api/rooms/${whipId}/snapshots`, { data: { label: 'sneaky' } });
    expect(refused.status()).toBe(403);
    observer.assertClean();
  });

  it('restores a snapshot from the table as one edit, keeping the state before it', async () => {
    const { page } = tuner;
    await page.goto(`/rooms/${whipId}/snapshots`);
    await page.getByRole('button', { name: 'Restore first cut' }).click();
    await page.getByRole('button', { name: 'Restore “first cut”' }).click();
    await page.getByRole('status').filter({ hasText: 'Snapshot restored' }).waitFor();
    const design = (await (await tuner.context.request.get(`/api/rooms/${whipId}/design`)).json()) as { elements: { value: number }[] };
    expect(design.elements[0].value).toBeCloseTo(18.67e-12, 15);
    // The state just before is a snapshot of its own, at the top of the table.
    const rows = page.getByRole('table', { name: 'The room’s snapshots' }).getByRole('row');
    await expect.poll(() => rows.count()).toBe(5);
    tuner.assertClean();
  });

  it('invites a newcomer; the mail in the development mailbox leads to an invitation accepted after signing up', async () => {
    const owner = await session();
    await signIn(owner.page, demo('owner').email, DEMO_PASSWORD);
    const newcomer = newAccount('Ayla Brenner');
    await owner.page.goto(`/rooms/${whipId}/members`);
    const form = owner.page.getByRole('form', { name: 'Add a member' });
    await form.getByLabel('E-mail', { exact: true }).fill(newcomer.email);
    await form.getByLabel('Role', { exact: true }).selectOption('observer');
    await form.getByRole('button', { name: 'Add member' }).click();
    await owner.page.getByRole('status').filter({ hasText: 'Invitation recorded' }).waitFor();

    const visitor = await session();
    const { page } = visitor;
    await page.goto('/dev/mailbox');
    const message = page.getByRole('article').filter({ hasText: newcomer.email }).first();
    await message.waitFor({ timeout: 15_000 });
    await visitor.screenshot('team-07-mailbox');
    const link = message.getByRole('link', { name: /\/invitations\// });
    await link.click();
    await page.waitForURL((url) => url.pathname.startsWith('/invitations/'));
    const invitationPath = new URL(page.url()).pathname;
    await page.getByText(`Sign in or sign up as ${newcomer.email} first`).waitFor();
    await page.getByText(WHIP_ROOM, { exact: false }).first().waitFor();
    await visitor.screenshot('team-08-invitation-signed-out');

    await page.getByRole('link', { name: `Sign up as ${newcomer.email}` }).click();
    await page.waitForURL((url) => url.pathname === '/sign-up');
    const signUp = page.getByRole('form', { name: 'Create an account' });
    expect(await signUp.getByLabel('E-mail', { exact: true }).inputValue()).toBe(newcomer.email);
    await signUp.getByLabel('Your name', { exact: true }).fill(newcomer.displayName);
    await signUp.getByLabel('Password', { exact: true }).fill(newcomer.password);
    await signUp.getByRole('button', { name: 'Create account' }).click();
    await page.waitForURL((url) => url.pathname === invitationPath);
    await page.getByRole('button', { name: 'Accept and open the room' }).click();
    await page.waitForURL((url) => url.pathname === `/rooms/${whipId}`);
    await page.locator('header').getByText('observer', { exact: true }).waitFor();
    visitor.assertClean();
    owner.assertClean();
  });

  it('downloads the design file from the hand-off page and imports it as a new room; a broken one is refused with its path', async () => {
    const { page } = tuner;
    await page.goto(`/rooms/${branchId}/handoff`);
    await page.getByRole('complementary', { name: 'Cautions' }).getByText('RF exposure limits apply').waitFor();
    await tuner.screenshot('team-09-handoff');
    const [download] = await Promise.all([page.waitForEvent('download'), page.getByRole('link', { name: 'Download design.matchloom.json' }).click()]);
    expect(download.suggestedFilename()).toMatch(/\.matchloom\.json$/);
    const file = await download.path();
    const text = await readFile(file, 'utf8');
    expect((JSON.parse(text) as { load: { kind: string } }).load.kind).toBe('measured');

    await page.goto('/rooms');
    const form = page.getByRole('form', { name: 'Import a design file' });
    const broken = JSON.parse(text) as { band: { startHz: number } };
    broken.band.startHz = -5;
    tuner.expectHttpError({ status: 400, path: '/api/rooms', method: 'POST' });
    await form.getByLabel('Design file (.matchloom.json)').setInputFiles({ name: 'broken.matchloom.json', mimeType: 'application/json', buffer: Buffer.from(JSON.stringify(broken)) });
    await form.getByRole('button', { name: 'Import design file' }).click();
    const error = page.getByTestId('import-error');
    await error.waitFor();
    expect(await error.textContent()).toContain('band.startHz');
    await tuner.screenshot('team-10-import-refused');

    await form.getByLabel('Design file (.matchloom.json)').setInputFiles({ name: download.suggestedFilename(), mimeType: 'application/json', buffer: Buffer.from(text) });
    await form.getByRole('button', { name: 'Import design file' }).click();
    await page.waitForURL((url) => /^\/rooms\/[^/]+$/.test(url.pathname) && url.pathname !== `/rooms/${branchId}`);
    await page.getByRole('heading', { level: 1, name: branchName }).waitFor();
    tuner.assertClean();
  });

  it('turns review e-mails off from the account page', async () => {
    const { page, context } = observer;
    await page.getByRole('link', { name: 'Account' }).click();
    await page.waitForURL((url) => url.pathname === '/account');
    const box = page.getByRole('checkbox', { name: /E-mail me when a snapshot in one of my rooms is marked for review/ });
    expect(await box.isChecked()).toBe(true);
    await box.uncheck();
    await page.getByRole('status').filter({ hasText: 'Settings saved' }).waitFor();
    const me = (await (await context.request.get('/api/me')).json()) as { notifyReviews: boolean };
    expect(me.notifyReviews).toBe(false);
    await page.reload();
    await page.getByRole('heading', { name: 'Your account' }).waitFor();
    expect(await page.getByRole('checkbox', { name: /E-mail me when/ }).isChecked()).toBe(false);
    observer.assertClean();
  });
});
