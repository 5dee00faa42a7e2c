// @vitest-environment jsdom
// The account page's review e-mail setting: a change survives a read of the account that was already on
// its way when the box was clicked (the page asks afresh when it opens), instead of flipping back, and
// the box shows the new value in the click itself, not only once the save's state reaches the screen.
import { QueryClientProvider } from '@tanstack/react-query';
import { act, cleanup, fireEvent, render, screen, waitFor } from '@testing-library/react';
import { MemoryRouter } from 'react-router-dom';
import { afterEach, describe, expect, it, vi } from 'vitest';
import AccountRoute from '../../client/app/routes/account';
import { createNoticeStore } from '../../client/lib/notices';
import { createQueryClient } from '../../client/lib/react-query';
import { queryKeys } from '../../client/lib/query-keys';

afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

const account = { id: 'u-obs', email: 'observer@example.test', displayName: 'Demo Observer' };
const json = (body: unknown) => new Response(JSON.stringify(body), { status: 200, headers: { 'Content-Type': 'application/json' } });

describe('the account page', () => {
  it('keeps review e-mails off when an older read of the account answers after the change', async () => {
    // GET /api/me is held until released, answering with the settings from before the change.
    let releaseRead: (() => void) | null = null;
    const patches: unknown[] = [];
    vi.stubGlobal(
      'fetch',
      vi.fn(async (url: string, init: RequestInit = {}) => {
        const method = init.method ?? 'GET';
        if (method === 'GET' && url.endsWith('/api/me')) {
          await new Promise<void>((r) => (releaseRead = r));
          return json({ ...account, notifyReviews: true });
        }
        if (method === 'PATCH' && url.endsWith('/api/me')) {
          patches.push(JSON.parse(String(init.body)));
          return json({ ...account, notifyReviews: false });
        }
        throw new Error(`unexpected ${method} ${url}`);
      }),
    );
    const store = createNoticeStore({ settleMs: 0 });
    const queryClient = createQueryClient(store);
    queryClient.setQueryData(queryKeys.me, { ...account, notifyReviews: true });
    render(
      <QueryClientProvider client={queryClient}>
        <MemoryRouter>
          <AccountRoute />
        </MemoryRouter>
      </QueryClientProvider>,
    );
    const box = screen.getByRole('checkbox', { name: /E-mail me when a snapshot/ });
    const checkbox = box as HTMLInputElement;
    expect(checkbox.checked).toBe(true);
    await waitFor(() => expect(releaseRead).not.toBeNull());
    act(() => {
      fireEvent.click(box);
    });
    // At once, in the click itself, before any answer: a browser test checks the box right after clicking.
    expect(checkbox.checked).toBe(false);
    expect(checkbox.disabled).toBe(true);
    // Saved: the answer is in and the box is enabled again.
    await waitFor(() => expect(patches).toHaveLength(1));
    await waitFor(() => expect(checkbox.disabled).toBe(false));
    expect(patches).toEqual([{ notifyReviews: false }]);
    expect(checkbox.checked).toBe(false);
    await act(async () => {
      releaseRead!();
      await new Promise((r) => setTimeout(r, 20));
    });
    expect(checkbox.checked).toBe(false);
    expect(queryClient.getQueryData<{ notifyReviews: boolean }>(queryKeys.me)?.notifyReviews).toBe(false);
  });
});
