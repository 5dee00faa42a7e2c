// @vitest-environment jsdom
import { QueryClientProvider } from '@tanstack/react-query';
import { act, cleanup, render, screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import type { ReactElement } from 'react';
import { MemoryRouter } from 'react-router-dom';
import { afterEach, describe, expect, it, vi } from 'vitest';
import type { Note } from '../../shared/api/notes';
import { TEAM_EVENTS } from '../../shared/collab/team-events';
import { NotesPanel } from '../../client/features/notes/components/notes-panel';
import { filterThreads, noteThreads } from '../../client/features/notes/components/note-threads';
import { parseNoteFrequency } from '../../client/features/notes/components/new-note-form';
import { createNoticeStore } from '../../client/lib/notices';
import { createQueryClient } from '../../client/lib/react-query';
import { RoomEventStreamsContext, STREAM_JOINED, type RoomEventListener, type RoomEventStreams } from '../../client/lib/room-event-stream';

afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

const t0 = Date.UTC(2026, 11, 15, 9);
const tuner = { id: 'u-tuner', displayName: 'Demo Tuner' };
const observer = { id: 'u-obs', displayName: 'Demo Observer' };

function note(id: string, over: Partial<Note> = {}): Note {
  return {
    id,
    roomId: 'r1',
    parentId: null,
    author: tuner,
    body: `note ${id}`,
    elementId: null,
    frequencyHz: null,
    resolved: false,
    resolvedBy: null,
    resolvedAt: null,
    createdAt: t0,
    editedAt: null,
    ...over,
  };
}

const notes: Note[] = [
  note('n1', { body: 'Is C2 rated for the drive power?', elementId: 'c-shunt', author: observer, createdAt: t0 }),
  note('n2', { body: 'Worst VSWR sits at the top band edge', frequencyHz: 2.4835e9, createdAt: t0 + 1000 }),
  note('r1', { parentId: 'n1', body: 'Yes: 50 V part, 3 V peak here', createdAt: t0 + 2000 }),
  note('n3', { body: 'Old question', resolved: true, resolvedBy: tuner, resolvedAt: t0 + 500, createdAt: t0 - 5000 }),
  note('n4', { body: 'Pinned to a removed element', elementId: 'gone', createdAt: t0 + 3000, author: observer }),
  note('n5', { body: 'C1 at the band centre', elementId: 'c-series', frequencyHz: 2.44175e9, createdAt: t0 - 9000, resolved: true }),
];

/** A fetch that answers by method and path, and records each request. */
function server(routes: Record<string, (body: unknown) => { status: number; body?: unknown }>) {
  const requests: { method: string; url: string; body: unknown }[] = [];
  vi.stubGlobal(
    'fetch',
    vi.fn(async (url: string, init: RequestInit = {}) => {
      const method = init.method ?? 'GET';
      const body = typeof init.body === 'string' ? JSON.parse(init.body) : undefined;
      requests.push({ method, url, body });
      const route = routes[`${method} ${url}`];
      if (!route) throw new Error(`no route for ${method} ${url}`);
      const reply = route(body);
      return new Response(reply.body === undefined ? null : JSON.stringify(reply.body), { status: reply.status, headers: { 'Content-Type': 'application/json' } });
    }),
  );
  return requests;
}

/** Room streams that the test drives: it says when the room is joined and sends events. */
function fakeStreams() {
  const listeners = new Set<RoomEventListener>();
  const streams: RoomEventStreams = {
    subscribe(_roomId, listener, onStatus) {
      listeners.add(listener);
      onStatus?.('live');
      return () => listeners.delete(listener);
    },
  };
  return { streams, send: (event: string, payload: unknown) => act(() => listeners.forEach((l) => l(event, payload))) };
}

function renderPanel(ui: ReactElement, streams: RoomEventStreams) {
  const queryClient = createQueryClient(createNoticeStore({ settleMs: 0 }));
  return render(
    <QueryClientProvider client={queryClient}>
      <RoomEventStreamsContext.Provider value={streams}>
        <MemoryRouter>{ui}</MemoryRouter>
      </RoomEventStreamsContext.Provider>
    </QueryClientProvider>,
  );
}

const me = (user: { id: string; displayName: string }) => () => ({ status: 200, body: { ...user, email: `${user.id}@example.test` } });
const labels = { 'c-series': 'C1 (series C)', 'c-shunt': 'C2 (shunt C)' };
const threadCards = () => screen.getAllByRole('article');

describe('noteThreads', () => {
  it('puts replies under their first note and lists open threads first, most recently active first', () => {
    const threads = noteThreads(notes);
    expect(threads.map((t) => t.root.id)).toEqual(['n4', 'n1', 'n2', 'n3', 'n5']);
    expect(threads[1].replies.map((r) => r.id)).toEqual(['r1']);
    expect(threads[1].lastActivity).toBe(t0 + 2000);
    expect(filterThreads(threads, 'resolved').map((t) => t.root.id)).toEqual(['n3', 'n5']);
    expect(filterThreads(threads, 'open')).toHaveLength(3);
  });

  it('leaves out a reply whose thread has not arrived', () => {
    expect(noteThreads([note('x', { parentId: 'missing' })])).toEqual([]);
  });
});

describe('parseNoteFrequency', () => {
  it('reads engineering text as hertz and refuses other units or nonsense', () => {
    expect(parseNoteFrequency('2.45 GHz')).toEqual({ hz: 2.45e9 });
    expect(parseNoteFrequency('433.92M')).toEqual({ hz: 433.92e6 });
    expect(parseNoteFrequency('2.2 pF')).toEqual({ error: '"2.2 pF" is in farads, expected hertz (Hz)' });
    expect(parseNoteFrequency('-5 MHz')).toEqual({ error: 'Give a positive frequency (up to 10 THz)' });
  });
});

describe('NotesPanel', () => {
  it('renders threads with their pins, replies and state, and filters open and resolved', async () => {
    server({ 'GET /api/me': me(tuner), 'GET /api/rooms/r1/notes': () => ({ status: 200, body: notes }) });
    const { streams } = fakeStreams();
    renderPanel(<NotesPanel roomId="r1" role="tuner" elementIds={['c-series', 'c-shunt']} elementLabels={labels} />, streams);
    await waitFor(() => expect(threadCards()).toHaveLength(3));
    const [gone, c2, edge] = threadCards();
    expect(within(c2).getByText('on C2 (shunt C)')).toBeTruthy();
    expect(within(c2).getByText('Is C2 rated for the drive power?')).toBeTruthy();
    const replies = within(c2).getByRole('list', { name: 'Replies' });
    expect(within(replies).getByText('Yes: 50 V part, 3 V peak here')).toBeTruthy();
    // Band edges and centres to six figures, trailing zeros dropped (common practice).
    expect(within(edge).getByText('at 2.4835 GHz')).toBeTruthy();
    expect(within(gone).getByText('on gone (no longer in the chain)')).toBeTruthy();
    expect(screen.getByRole('button', { name: 'Open (3)' }).getAttribute('aria-pressed')).toBe('true');

    await userEvent.click(screen.getByRole('button', { name: 'Resolved (2)' }));
    expect(threadCards()).toHaveLength(2);
    expect(within(threadCards()[0]).getByText('Resolved by Demo Tuner')).toBeTruthy();
    expect(within(threadCards()[0]).getByRole('button', { name: 'Reopen' })).toBeTruthy();
    // Pinned to an element and a frequency: both are shown.
    expect(within(threadCards()[1]).getByText('on C1 (series C)')).toBeTruthy();
    expect(within(threadCards()[1]).getByText('at 2.44175 GHz')).toBeTruthy();
  });

  it('gives an observer Reply and Post note, Resolve and Delete only on their own notes', async () => {
    server({ 'GET /api/me': me(observer), 'GET /api/rooms/r1/notes': () => ({ status: 200, body: notes }) });
    renderPanel(<NotesPanel roomId="r1" role="observer" elementIds={['c-series', 'c-shunt']} elementLabels={labels} />, fakeStreams().streams);
    await waitFor(() => expect(threadCards()).toHaveLength(3));
    const [own, ownToo, tunersNote] = threadCards();
    expect(screen.getByRole('button', { name: 'Post note' })).toBeTruthy();
    for (const card of [own, ownToo, tunersNote]) expect(within(card).getByRole('button', { name: /^Reply to/ })).toBeTruthy();
    expect(within(own).getByRole('button', { name: 'Resolve' })).toBeTruthy();
    expect(within(own).getByRole('button', { name: 'Delete the note by Demo Observer' })).toBeTruthy();
    expect(within(tunersNote).queryByRole('button', { name: 'Resolve' })).toBeNull();
    expect(within(tunersNote).queryByRole('button', { name: /^Delete/ })).toBeNull();
    // The tuner's reply in the observer's own thread cannot be deleted by the observer.
    expect(within(ownToo).queryByRole('button', { name: 'Delete reply' })).toBeNull();
  });

  it('posts a note pinned to a frequency, and refuses a value that is not one without asking the server', async () => {
    const created = note('n9', { body: 'Check here', frequencyHz: 2.45e9, author: observer, createdAt: t0 + 9000 });
    const requests = server({
      'GET /api/me': me(observer),
      'GET /api/rooms/r1/notes': () => ({ status: 200, body: [] }),
      'POST /api/rooms/r1/notes': () => ({ status: 201, body: created }),
    });
    renderPanel(<NotesPanel roomId="r1" role="observer" />, fakeStreams().streams);
    await screen.findByText('No open notes.');
    const form = screen.getByRole('form', { name: 'New note' });
    await userEvent.type(within(form).getByLabelText('Note'), 'Check here');
    await userEvent.click(within(form).getByRole('radio', { name: 'A frequency' }));
    await userEvent.type(within(form).getByLabelText('Frequency'), '2.45 pF');
    await userEvent.click(within(form).getByRole('button', { name: 'Post note' }));
    expect(await within(form).findByText('"2.45 pF" is in farads, expected hertz (Hz)')).toBeTruthy();
    expect(requests.filter((r) => r.method === 'POST')).toHaveLength(0);

    await userEvent.clear(within(form).getByLabelText('Frequency'));
    await userEvent.type(within(form).getByLabelText('Frequency'), '2.45 GHz');
    await userEvent.click(within(form).getByRole('button', { name: 'Post note' }));
    await waitFor(() => expect(threadCards()).toHaveLength(1));
    expect(requests.find((r) => r.method === 'POST')?.body).toEqual({ body: 'Check here', frequencyHz: 2.45e9 });
    expect((within(form).getByLabelText('Note') as HTMLTextAreaElement).value).toBe('');
  });

  it('shows a note someone else writes, and drops a deleted thread, from the live events alone', async () => {
    const requests = server({ 'GET /api/me': me(tuner), 'GET /api/rooms/r1/notes': () => ({ status: 200, body: [notes[1]] }) });
    const live = fakeStreams();
    renderPanel(<NotesPanel roomId="r1" role="tuner" />, live.streams);
    await waitFor(() => expect(threadCards()).toHaveLength(1));
    const fetched = requests.length;
    live.send(TEAM_EVENTS.noteCreated, { roomId: 'r1', note: note('n7', { body: 'Seen from the bench', author: observer, createdAt: t0 + 7000 }) });
    await screen.findByText('Seen from the bench');
    expect(threadCards()).toHaveLength(2);
    live.send(TEAM_EVENTS.noteCreated, { roomId: 'other-room', note: note('n8', { body: 'not ours' }) });
    live.send(TEAM_EVENTS.noteDeleted, { roomId: 'r1', noteId: 'n2', deletedIds: ['n2'] });
    await waitFor(() => expect(threadCards()).toHaveLength(1));
    expect(screen.queryByText('not ours')).toBeNull();
    // A malformed or foreign event is not trusted: the list is fetched again instead.
    expect(requests.length).toBeGreaterThan(fetched);
    expect(screen.getByText('Live')).toBeTruthy();

    // After a (re)join, the list is fetched again so nothing sent meanwhile is missed.
    const before = requests.length;
    live.send(STREAM_JOINED, { roomId: 'r1' });
    await waitFor(() => expect(requests.length).toBe(before + 1));
  });
});
