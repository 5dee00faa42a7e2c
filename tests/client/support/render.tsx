import { QueryClientProvider } from '@tanstack/react-query';
import { render, type RenderResult } from '@testing-library/react';
import type { ReactElement } from 'react';
import { MemoryRouter } from 'react-router-dom';
import { vi } from 'vitest';
import { createNoticeStore, type NoticeStore } from '../../../client/lib/notices';
import { createQueryClient } from '../../../client/lib/react-query';

/** A canned answer from the server, for one request. */
export interface Reply {
  status: number;
  body?: unknown;
}

export interface FakeServer {
  /** Every request made, in order: method, URL and parsed JSON body. */
  requests: { method: string; url: string; body: unknown }[];
}

/**
 * Replaces `fetch` with one that answers each request with the next reply in the list (as the
 * real server would, JSON bodies), and records what was asked.
 */
export function answerWith(...replies: Reply[]): FakeServer {
  const server: FakeServer = { requests: [] };
  vi.stubGlobal(
    'fetch',
    vi.fn(async (url: string, init: RequestInit = {}) => {
      server.requests.push({ method: init.method ?? 'GET', url, body: typeof init.body === 'string' ? JSON.parse(init.body) : undefined });
      const reply = replies.shift();
      if (!reply) throw new Error(`no reply left for ${init.method ?? 'GET'} ${url}`);
      return new Response(reply.body === undefined ? null : JSON.stringify(reply.body), {
        status: reply.status,
        headers: { 'Content-Type': 'application/json' },
      });
    }),
  );
  return server;
}

/** Renders inside a fresh query client (with its own notice store) and a memory router. */
export function renderApp(ui: ReactElement, { store = createNoticeStore({ settleMs: 0 }) }: { store?: NoticeStore } = {}): RenderResult & {
  store: NoticeStore;
} {
  const queryClient = createQueryClient(store);
  const result = render(
    <QueryClientProvider client={queryClient}>
      <MemoryRouter>{ui}</MemoryRouter>
    </QueryClientProvider>,
  );
  return { ...result, store };
}
