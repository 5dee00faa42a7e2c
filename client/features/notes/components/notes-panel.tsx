/**
 * FOR THE WORKSPACE: `<NotesPanel roomId role elementIds? elementLabels? pin? onFocusElement? onFocusFrequency? />`
 * — the room's review notes, live (socket events, polling while the socket is away). Any member,
 * observers included, writes notes and replies; the author, owners and tuners resolve or reopen a
 * thread; the author or an owner deletes. `elementIds` (the chain now) offers elements to pin to and
 * marks pins to removed elements; `pin` pre-selects a pin chosen elsewhere (a chart click);
 * `onFocusElement` / `onFocusFrequency` make a note's pin a button that shows it.
 */
import { useState } from 'react';
import { Loading } from '../../../components/page-status';
import { cx } from '../../../lib/cx';
import type { RoomRole } from '../../../lib/room-role';
import { livePollInterval, useRoomLiveData } from '../../../lib/use-room-live-data';
import { useMe } from '../../auth/api/get-me';
import { useNotes } from '../api/get-notes';
import { NewNoteForm, type NotePinRequest } from './new-note-form';
import { NoteThreadCard } from './note-thread-card';
import { filterThreads, noteThreads, type ThreadFilter } from './note-threads';

export interface NotesPanelProps {
  roomId: string;
  role: RoomRole;
  elementIds?: readonly string[];
  /** Names to show for element ids ("C1 (series C)"). */
  elementLabels?: Readonly<Record<string, string>>;
  pin?: NotePinRequest | null;
  onFocusElement?: (elementId: string) => void;
  onFocusFrequency?: (hz: number) => void;
}

const filters: { value: ThreadFilter; label: string }[] = [
  { value: 'open', label: 'Open' },
  { value: 'resolved', label: 'Resolved' },
  { value: 'all', label: 'All' },
];

export function NotesPanel({ roomId, role, elementIds, elementLabels, pin, onFocusElement, onFocusFrequency }: NotesPanelProps) {
  const { data: me } = useMe();
  const status = useRoomLiveData(roomId);
  const notes = useNotes(roomId, { refetchInterval: livePollInterval(status) });
  const [filter, setFilter] = useState<ThreadFilter>('open');
  const threads = notes.data ? noteThreads(notes.data) : [];
  const shown = filterThreads(threads, filter);
  const count = (f: ThreadFilter) => filterThreads(threads, f).length;

  return (
    <div className="flex flex-col gap-4" data-testid="notes-panel" data-live={status}>
      <section aria-label="Write a note" className="rounded-2xl border border-rule bg-card p-4 shadow-xs">
        <NewNoteForm roomId={roomId} elementIds={elementIds} elementLabels={elementLabels} pin={pin} />
      </section>
      <div className="flex flex-wrap items-center justify-between gap-2">
        <div role="group" aria-label="Show notes" className="flex gap-1">
          {filters.map((f) => (
            <button
              key={f.value}
              type="button"
              aria-pressed={filter === f.value}
              onClick={() => setFilter(f.value)}
              className={cx('rounded-md border px-2.5 py-1 text-sm font-semibold', filter === f.value ? 'border-ink bg-ink text-paper' : 'border-rule text-ink-soft hover:border-ink-faint')}
            >
              {f.label} ({count(f.value)})
            </button>
          ))}
        </div>
        <span className="text-xs text-ink-faint" aria-live="polite">
          {status === 'live' ? 'Live' : status === 'connecting' ? 'Connecting…' : 'Offline: checking every 15 s'}
        </span>
      </div>
      {notes.data ? (
        shown.length ? (
          <div aria-label="Note threads" role="list" className="flex flex-col gap-3">
            {shown.map((thread) => (
              <div role="listitem" key={thread.root.id}>
                <NoteThreadCard
                  roomId={roomId}
                  thread={thread}
                  role={role}
                  userId={me?.id ?? null}
                  elementIds={elementIds}
                  elementLabels={elementLabels}
                  onFocusElement={onFocusElement}
                  onFocusFrequency={onFocusFrequency}
                />
              </div>
            ))}
          </div>
        ) : (
          <p className="rounded-xl border border-dashed border-rule bg-card px-4 py-5 text-center text-ink-soft">
            {filter === 'open' ? 'No open notes.' : filter === 'resolved' ? 'No resolved notes.' : 'No notes yet.'}
          </p>
        )
      ) : notes.isError ? (
        <p role="alert" className="text-coral-deep">
          {notes.error.message}
        </p>
      ) : (
        <Loading label="Loading the notes…" />
      )}
    </div>
  );
}
