/**
 * The client shell end to end: sign-up with field errors, a room, a member added as observer who
 * sees no editing controls (and whose forged role change the server refuses), sign-in with a demo
 * account, the not-found page and the error boundary. Screenshots go to e2e/screenshots/.
 */
import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_PASSWORD, DEMO_USERS, WHIP_BRANCH_ROOM, WHIP_ROOM } from '../shared/demo/designs';
import { newAccount, fillSignUp, signOut, signUp, submitSignIn } from './support/auth';
import { launchBrowser, openSession, type BrowserSession } from './support/browser';
import { startTestServer, type TestServer } from './support/server';

let server: TestServer;
let browser: Browser;
const sessions: BrowserSession[] = [];

async function session(): Promise<BrowserSession> {
  const s = await openSession(browser, server.url);
  sessions.push(s);
  return s;
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

describe('client shell', () => {
  const owner = newAccount('Rhea Okafor');
  const observer = newAccount('Tomas Lind');
  let ownerSession: BrowserSession;
  let observerSession: BrowserSession;
  let roomId = '';
  const roomName = '868 MHz PCB antenna, rev B';

  it('sends a signed-out visitor to sign in, and signs up with errors shown beside the fields', async () => {
    ownerSession = await session();
    const { page } = ownerSession;
    await page.goto('/rooms');
    await page.waitForURL((url) => url.pathname === '/sign-in');
    expect(new URL(page.url()).searchParams.get('redirectTo')).toBe('/rooms');
    await page.getByRole('heading', { name: 'Sign in' }).waitFor();
    await ownerSession.screenshot('01-sign-in');

    await page.getByRole('link', { name: 'Create an account' }).click();
    await page.waitForURL((url) => url.pathname === '/sign-up');
    const form = page.getByRole('form', { name: 'Create an account' });

    // Checked in the browser: a short password.
    await fillSignUp(page, { ...owner, password: 'short' });
    await form.getByRole('button', { name: 'Create account' }).click();
    await form.getByText('Use at least 10 characters').waitFor();
    expect(await form.getByLabel('Password', { exact: true }).getAttribute('aria-invalid')).toBe('true');

    // Checked by the server: an address already in use (the demo owner's) comes back beside the e-mail field.
    ownerSession.expectHttpError({ status: 409, path: '/api/auth/signup', method: 'POST' });
    await fillSignUp(page, { ...owner, email: DEMO_USERS[0].email });
    await form.getByRole('button', { name: 'Create account' }).click();
    const emailField = form.getByLabel('E-mail', { exact: true });
    await form.getByText('That e-mail address cannot be used to sign up').waitFor();
    expect(await emailField.getAttribute('aria-invalid')).toBe('true');
    await ownerSession.screenshot('02-sign-up-errors');

    await fillSignUp(page, owner);
    await form.getByRole('button', { name: 'Create account' }).click();
    await page.waitForURL((url) => url.pathname === '/rooms');
    await page.getByText(`Signed in as ${owner.displayName}`).waitFor();
    await page.getByText('You are not in any room yet').waitFor();
    ownerSession.assertClean();
  });

  it('creates a room and opens it as its owner', async () => {
    const { page } = ownerSession;
    const form = page.getByRole('form', { name: 'Create a room' });
    // An empty name is refused beside the field, without a request.
    await form.getByRole('button', { name: 'Create room' }).click();
    await form.getByText('Give the room a name').waitFor();

    await form.getByLabel('Room name').fill(roomName);
    await form.getByRole('button', { name: 'Create room' }).click();
    await page.waitForURL(/\/rooms\/[^/]+$/);
    roomId = decodeURIComponent(new URL(page.url()).pathname.split('/')[2]);
    await page.getByRole('heading', { level: 1, name: roomName }).waitFor();
    const header = page.locator('header').filter({ has: page.getByRole('heading', { level: 1 }) });
    expect(await header.getByText('owner', { exact: true }).count()).toBe(1);
    // The workspace (lazily loaded) has replaced the frame's loading line.
    const frame = page.getByTestId('room-workspace');
    expect(await frame.getAttribute('data-room-id')).toBe(roomId);
    await frame.locator(':scope > *').first().waitFor();
    await frame.getByText('Loading the workspace…').waitFor({ state: 'detached' });
    await ownerSession.screenshot('03-room-owner');

    await page.getByRole('link', { name: 'Rooms', exact: true }).click();
    await page.waitForURL((url) => url.pathname === '/rooms');
    const card = page.getByRole('list', { name: 'Your rooms' }).getByRole('listitem').filter({ hasText: roomName });
    await card.getByText('owner', { exact: true }).waitFor();
    await card.getByText(/Updated/).waitFor();
    ownerSession.assertClean();
  });

  it('adds a second signed-up user to the room as an observer', async () => {
    observerSession = await session();
    await signUp(observerSession.page, observer);
    await signOut(observerSession.page);

    const { page } = ownerSession;
    await page.goto(`/rooms/${encodeURIComponent(roomId)}`);
    await page.getByRole('link', { name: 'Members' }).click();
    await page.waitForURL((url) => url.pathname.endsWith('/members'));
    const form = page.getByRole('form', { name: 'Add a member' });
    await form.getByLabel('E-mail', { exact: true }).fill(observer.email);
    await form.getByLabel('Role', { exact: true }).selectOption('observer');
    await form.getByRole('button', { name: 'Add member' }).click();
    await page.getByRole('status').filter({ hasText: 'Member added' }).waitFor();

    const row = page.getByRole('list', { name: 'Members' }).getByRole('listitem').filter({ hasText: observer.email });
    expect(await row.getByLabel(`Role of ${observer.displayName}`).inputValue()).toBe('observer');
    await row.getByRole('button', { name: `Remove ${observer.displayName} from the room` }).waitFor();

    // Adding the same person twice: the server's refusal shows beside the e-mail field.
    ownerSession.expectHttpError({ status: 409, path: `/api/rooms/${roomId}/members`, method: 'POST' });
    await form.getByLabel('E-mail', { exact: true }).fill(observer.email);
    await form.getByRole('button', { name: 'Add member' }).click();
    await form.getByText('already a member').waitFor();
    await ownerSession.screenshot('04-members-owner');

    // An address with no account is invited instead, and listed (to the owner) as pending.
    const newcomer = newAccount('Noor Haddad').email;
    await form.getByLabel('E-mail', { exact: true }).fill(newcomer);
    await form.getByLabel('Role', { exact: true }).selectOption('tuner');
    await form.getByRole('button', { name: 'Add member' }).click();
    await page.getByRole('status').filter({ hasText: 'Invitation recorded' }).waitFor();
    const pending = page.getByRole('list', { name: 'Invitations' }).getByRole('listitem').filter({ hasText: newcomer });
    await pending.getByText('tuner', { exact: true }).waitFor();
    expect(await form.getByText('already a member').count()).toBe(0);
    await ownerSession.screenshot('04b-members-owner-invited');
    ownerSession.assertClean();
  });

  it('shows the observer a members page without any editing control, and the server refuses a forged change', async () => {
    const { page, context } = observerSession;
    const membersPath = `/rooms/${encodeURIComponent(roomId)}/members`;
    // Signed out: sign in first, then straight back to the page asked for.
    await page.goto(membersPath);
    await page.waitForURL((url) => url.pathname === '/sign-in');
    await submitSignIn(page, observer.email, observer.password);
    expect(new URL(page.url()).pathname).toBe(membersPath);

    const list = page.getByRole('list', { name: 'Members' });
    await list.getByText(owner.email).waitFor();
    await list.getByText(observer.email).waitFor();
    await page.getByText('Only the room’s owner adds people and changes roles.').waitFor();
    const main = page.locator('main');
    expect(await main.getByRole('form').count()).toBe(0);
    expect(await main.locator('input, select, textarea, button').count()).toBe(0);
    expect(await main.getByRole('button').count()).toBe(0);
    await observerSession.screenshot('05-members-observer');

    const me = (await (await context.request.get('/api/me')).json()) as { id: string };
    const forged = await context.request.patch(`/api/rooms/${roomId}/members/${me.id}`, { data: { role: 'owner' } });
    expect(forged.status()).toBe(403);
    expect(((await forged.json()) as { error: { code: string } }).error.code).toBe('forbidden');
    const members = (await (await context.request.get(`/api/rooms/${roomId}/members`)).json()) as { email: string; role: string }[];
    expect(members.find((m) => m.email === observer.email)?.role).toBe('observer');

    await page.goto(`/rooms/${encodeURIComponent(roomId)}`);
    const header = page.locator('header').filter({ has: page.getByRole('heading', { level: 1, name: roomName }) });
    await header.getByText('observer', { exact: true }).waitFor();
    observerSession.assertClean();
  });

  it('signs in as the demo owner and lists the demo rooms with roles and branch origin', async () => {
    const demo = await session();
    const { page, context } = demo;
    await page.goto('/');
    await page.waitForURL((url) => url.pathname === '/sign-in');
    await page.getByRole('heading', { name: 'Sign in' }).waitFor();

    // The list is shown when the server says it holds the demo accounts (GET /api/health `demo: true`).
    // A production build whose server does not say so must not show it.
    const health = (await (await context.request.get('/api/health')).json()) as { ok: boolean; demo?: boolean };
    const list = page.getByRole('region', { name: 'Demo accounts' });
    if (health.demo === true) {
      await list.waitFor();
      for (const user of DEMO_USERS) await list.getByText(user.email).waitFor();
      await list.getByRole('button', { name: `Use the demo owner account, ${DEMO_USERS[0].email}` }).click();
      const form = page.getByRole('form', { name: 'Sign in' });
      expect(await form.getByLabel('E-mail', { exact: true }).inputValue()).toBe(DEMO_USERS[0].email);
      expect(await form.getByLabel('Password', { exact: true }).inputValue()).toBe(DEMO_PASSWORD);
      await demo.screenshot('06-sign-in-demo');
      await form.getByRole('button', { name: 'Sign in', exact: true }).click();
      await page.waitForURL((url) => url.pathname !== '/sign-in');
    } else {
      expect(await list.count()).toBe(0);
      await submitSignIn(page, DEMO_USERS[0].email, DEMO_PASSWORD);
    }

    expect(new URL(page.url()).pathname).toBe('/rooms');
    await page.getByText(`Signed in as ${DEMO_USERS[0].displayName}`).waitFor();
    const rooms = page.getByRole('list', { name: 'Your rooms' });
    const branch = rooms.getByRole('listitem').filter({ hasText: WHIP_BRANCH_ROOM });
    await branch.getByText('Branch of snapshot “E12 values” in').waitFor();
    await branch.getByRole('link', { name: WHIP_ROOM }).waitFor();
    expect(await rooms.getByRole('listitem').count()).toBe(3);
    expect(await rooms.getByText('owner', { exact: true }).count()).toBe(3);
    await demo.screenshot('07-rooms-demo-owner');

    // A room that does not exist (or is not ours): the error boundary, inside the app frame.
    demo.expectHttpError({ status: 404, path: '/api/rooms/no-such-room', method: 'GET' });
    await page.goto('/rooms/no-such-room');
    await page.getByRole('heading', { name: 'Nothing here' }).waitFor();
    await page.getByRole('button', { name: 'Sign out' }).waitFor();
    await demo.screenshot('08-room-missing');

    await page.goto('/no/such/page');
    await page.getByRole('heading', { name: 'This page is not on the chart' }).waitFor();
    await demo.screenshot('09-not-found');

    await page.goto('/rooms');
    await signOut(page);
    await page.goto('/rooms');
    await page.waitForURL((url) => url.pathname === '/sign-in');
    demo.assertClean();
  });

  it('works from the keyboard alone, with visible focus', async () => {
    const keys = await session();
    const { page } = keys;
    await page.goto('/sign-in');
    const form = page.getByRole('form', { name: 'Sign in' });
    await form.waitFor();
    const focusedLabel = () =>
      page.evaluate(() => {
        const el = document.activeElement as HTMLElement | null;
        return el?.getAttribute('aria-label') ?? (el?.id ? document.querySelector(`label[for="${el.id}"]`)?.textContent : el?.textContent) ?? '';
      });
    // Tab until the e-mail field has focus (the demo list, when shown, comes first).
    for (let i = 0; i < 6 && (await focusedLabel()) !== 'E-mail'; i++) await page.keyboard.press('Tab');
    expect(await focusedLabel()).toBe('E-mail');
    await page.keyboard.type(DEMO_USERS[1].email);
    await page.keyboard.press('Tab');
    expect(await focusedLabel()).toBe('Password');
    await page.keyboard.type(DEMO_PASSWORD);
    await page.keyboard.press('Enter');
    await page.waitForURL((url) => url.pathname === '/rooms');
    await page.getByText(`Signed in as ${DEMO_USERS[1].displayName}`).waitFor();

    // The first Tab on a signed-in page offers the skip link, then the app bar.
    await page.keyboard.press('Tab');
    expect(await focusedLabel()).toBe('Skip to content');
    const outline = await page.evaluate(() => getComputedStyle(document.activeElement as Element).outlineStyle);
    expect(outline).not.toBe('none');
    await keys.screenshot('11-keyboard-skip-link');
    await page.keyboard.press('Enter');
    await page.keyboard.press('Tab');
    expect(await focusedLabel()).toBe('Room name');
    keys.assertClean();
  });

  it('fits a narrow screen', async () => {
    const narrow = await openSession(browser, server.url, { viewport: { width: 390, height: 844 } });
    sessions.push(narrow);
    await signUp(narrow.page, newAccount('Ines Prado'));
    await narrow.page.getByRole('form', { name: 'Create a room' }).waitFor();
    const overflow = await narrow.page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth);
    expect(overflow).toBeLessThanOrEqual(0);
    await narrow.screenshot('10-rooms-narrow');
    narrow.assertClean();
  });
});
