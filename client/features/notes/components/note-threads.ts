/**
 * Notes as threads: each first note with its replies (oldest first), threads with open questions
 * first and, within each group, the most recently active first. Pure.
 */
import type { Note } from '../../../../shared/api/notes';

export interface NoteThread {
  root: Note;
  replies: Note[];
  /** The newest time in the thread (its last reply, or the note itself). */
  lastActivity: number;
}

export type ThreadFilter = 'open' | 'resolved' | 'all';

export function noteThreads(notes: readonly Note[]): NoteThread[] {
  const threads = new Map<string, NoteThread>();
  for (const note of notes) if (note.parentId === null) threads.set(note.id, { root: note, replies: [], lastActivity: note.createdAt });
  for (const note of notes) {
    if (note.parentId === null) continue;
    const thread = threads.get(note.parentId);
    // A reply whose thread is not (yet) known is left out until the thread arrives.
    if (!thread) continue;
    thread.replies.push(note);
    thread.lastActivity = Math.max(thread.lastActivity, note.createdAt);
  }
  for (const thread of threads.values()) thread.replies.sort((a, b) => a.createdAt - b.createdAt);
  return [...threads.values()].sort(
    (a, b) => Number(a.root.resolved) - Number(b.root.resolved) || b.lastActivity - a.lastActivity,
  );
}

export function filterThreads(threads: readonly NoteThread[], filter: ThreadFilter): NoteThread[] {
  if (filter === 'all') return [...threads];
  return threads.filter((t) => t.root.resolved === (filter === 'resolved'));
}

export type NotePin = { kind: 'room' } | { kind: 'element'; elementId: string } | { kind: 'frequency'; hz: number };

/** Where a note is pinned: an element, a frequency, both, or (neither) the whole room. */
export function notePins(note: Note): NotePin[] {
  const pins: NotePin[] = [];
  if (note.elementId !== null) pins.push({ kind: 'element', elementId: note.elementId });
  if (note.frequencyHz !== null) pins.push({ kind: 'frequency', hz: note.frequencyHz });
  return pins.length ? pins : [{ kind: 'room' }];
}
