import { afterEach, describe, expect, it, vi } from 'vitest';
import { paths, safeRedirect } from '../../client/config/paths';
import { dateFrom, timeAgo } from '../../client/lib/format-time';
import { createNoticeStore } from '../../client/lib/notices';
import { roleWithArticle } from '../../client/lib/room-role';

afterEach(() => vi.useRealTimers());

describe('paths', () => {
  it('builds links with an encoded redirect target', () => {
    expect(paths.auth.signIn.getHref('/rooms/a b?x=1')).toBe('/sign-in?redirectTo=%2Frooms%2Fa%20b%3Fx%3D1');
    expect(paths.auth.signIn.getHref()).toBe('/sign-in');
    expect(paths.members.getHref('r/1')).toBe('/rooms/r%2F1/members');
  });

  it('safeRedirect follows only paths on this site', () => {
    expect(safeRedirect('/rooms/abc/members')).toBe('/rooms/abc/members');
    expect(safeRedirect('//evil.test/x')).toBe('/rooms');
    expect(safeRedirect('/\\evil.test')).toBe('/rooms');
    expect(safeRedirect('https://evil.test')).toBe('/rooms');
    expect(safeRedirect(null)).toBe('/rooms');
  });
});

describe('timeAgo', () => {
  const now = new Date('2026-12-01T12:00:00Z');
  it('reads like speech', () => {
    expect(timeAgo(new Date('2026-12-01T11:59:40Z'), now)).toBe('just now');
    expect(timeAgo(new Date('2026-12-01T11:55:00Z'), now)).toBe('5 minutes ago');
    expect(timeAgo(new Date('2026-12-01T07:00:00Z'), now)).toBe('5 hours ago');
    expect(timeAgo(new Date('2026-11-30T12:00:00Z'), now)).toBe('yesterday');
    expect(timeAgo(new Date('2026-11-10T12:00:00Z'), now)).toBe('3 weeks ago');
  });

  it('dateFrom takes epoch milliseconds or ISO text and refuses the rest', () => {
    expect(dateFrom(0)?.toISOString()).toBe('1970-01-01T00:00:00.000Z');
    expect(dateFrom('2026-12-01T12:00:00Z')?.getTime()).toBe(now.getTime());
    expect(dateFrom('not a date')).toBeNull();
    expect(dateFrom(undefined)).toBeNull();
  });
});

describe('notice store', () => {
  it('keeps the newest few, shows a repeated message once, and dismisses', () => {
    const store = createNoticeStore({ limit: 2, settleMs: 0 });
    store.post({ tone: 'error', title: 'A' });
    const b = store.post({ tone: 'error', title: 'B' });
    expect(store.post({ tone: 'error', title: 'B' })).toBe(b);
    store.post({ tone: 'error', title: 'C' });
    expect(store.list().map((n) => n.title)).toEqual(['B', 'C']);
    store.dismiss(b);
    expect(store.list().map((n) => n.title)).toEqual(['C']);
  });

  it('lets a success settle by itself but keeps an error until dismissed', () => {
    vi.useFakeTimers();
    const store = createNoticeStore({ settleMs: 5000 });
    store.post({ tone: 'success', title: 'Member added' });
    store.post({ tone: 'error', title: 'That did not work' });
    vi.advanceTimersByTime(5000);
    expect(store.list().map((n) => n.title)).toEqual(['That did not work']);
  });
});

describe('roleWithArticle', () => {
  it('says "an owner", "a tuner", "an observer"', () => {
    expect(['owner', 'tuner', 'observer'].map((r) => roleWithArticle(r as 'owner'))).toEqual(['an owner', 'a tuner', 'an observer']);
  });
});
