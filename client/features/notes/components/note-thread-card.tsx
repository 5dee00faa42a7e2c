import { useState } from 'react';
import type { Note } from '../../../../shared/api/notes';
import { formatEngineering } from '../../../../shared/rf/units';
import { Button } from '../../../components/button';
import { FormError } from '../../../components/form-field';
import { cx } from '../../../lib/cx';
import { dateFrom, dateTimeLabel, timeAgo } from '../../../lib/format-time';
import type { RoomRole } from '../../../lib/room-role';
import { useCreateNote } from '../api/create-note';
import { useDeleteNote } from '../api/delete-note';
import { useUpdateNote } from '../api/update-note';
import { canDeleteNote, canResolveNote } from './note-permissions';
import { NoteTextArea } from './note-text-area';
import { notePins, type NotePin, type NoteThread } from './note-threads';

export interface NoteThreadCardProps {
  roomId: string;
  thread: NoteThread;
  role: RoomRole;
  userId: string | null;
  /** The chain's element ids now; a pin to another id is marked as gone. Unknown when absent. */
  elementIds?: readonly string[];
  elementLabels?: Readonly<Record<string, string>>;
  onFocusElement?: (elementId: string) => void;
  onFocusFrequency?: (hz: number) => void;
}

function Byline({ note }: { note: Note }) {
  const date = dateFrom(note.createdAt);
  return (
    <p className="text-xs text-ink-faint">
      <strong className="font-bold text-ink-soft">{note.author?.displayName ?? 'A former member'}</strong>
      {date && (
        <>
          {' · '}
          <time dateTime={date.toISOString()} title={dateTimeLabel(date)}>
            {timeAgo(date)}
          </time>
        </>
      )}
      {note.editedAt !== null && ' · edited'}
    </p>
  );
}

function PinChip({ pin, elementIds, elementLabels = {}, onFocusElement, onFocusFrequency }: Omit<NoteThreadCardProps, 'roomId' | 'thread' | 'role' | 'userId'> & { pin: NotePin }) {
  const chip = 'inline-flex items-center gap-1 rounded-full border px-2 py-0.5 text-xs font-bold';
  if (pin.kind === 'room') return <span className={cx(chip, 'border-rule bg-paper text-ink-soft')}>the whole room</span>;
  if (pin.kind === 'frequency') {
    const text = `at ${formatEngineering(pin.hz, 'Hz', { digits: 6 })}`;
    return onFocusFrequency ? (
      <button type="button" className={cx(chip, 'border-amber/60 bg-amber-soft text-amber-deep hover:border-amber-deep')} onClick={() => onFocusFrequency(pin.hz)} title="Show this frequency on the chart">
        {text}
      </button>
    ) : (
      <span className={cx(chip, 'border-amber/60 bg-amber-soft text-amber-deep')}>{text}</span>
    );
  }
  const gone = elementIds !== undefined && !elementIds.includes(pin.elementId);
  const text = `on ${elementLabels[pin.elementId] ?? pin.elementId}${gone ? ' (no longer in the chain)' : ''}`;
  return onFocusElement && !gone ? (
    <button type="button" className={cx(chip, 'border-teal/50 bg-teal-soft text-teal-deep hover:border-teal-deep')} onClick={() => onFocusElement(pin.elementId)} title="Select this element">
      {text}
    </button>
  ) : (
    <span className={cx(chip, gone ? 'border-rule bg-paper text-ink-faint line-through' : 'border-teal/50 bg-teal-soft text-teal-deep')}>{text}</span>
  );
}

function ReplyForm({ roomId, rootId, onDone }: { roomId: string; rootId: string; onDone: () => void }) {
  const [body, setBody] = useState('');
  const [error, setError] = useState<string | null>(null);
  const reply = useCreateNote(roomId, {
    onSuccess: () => {
      setBody('');
      onDone();
    },
    onError: (e) => setError(e.message),
  });
  return (
    <form
      aria-label="Reply"
      noValidate
      className="flex flex-col gap-2"
      onSubmit={(event) => {
        event.preventDefault();
        if (!body.trim()) return setError('Write the reply first');
        setError(null);
        reply.mutate({ roomId, body: body.trim(), parentId: rootId });
      }}
    >
      <FormError message={error} />
      <NoteTextArea label="Your reply" rows={2} value={body} onChange={(e) => setBody(e.target.value)} autoFocus />
      <div className="flex gap-2">
        <Button type="submit" size="sm" busy={reply.isPending} busyLabel="Posting…">
          Post reply
        </Button>
        <Button variant="quiet" size="sm" onClick={onDone}>
          Cancel
        </Button>
      </div>
    </form>
  );
}

/** One thread: the first note with its pin, the replies, and what the reader may do (reply, resolve or reopen, delete). */
export function NoteThreadCard(props: NoteThreadCardProps) {
  const { roomId, thread, role, userId } = props;
  const { root, replies } = thread;
  const [replying, setReplying] = useState(false);
  const [confirmDelete, setConfirmDelete] = useState(false);
  const update = useUpdateNote(roomId);
  const remove = useDeleteNote(roomId);
  const who = root.author?.displayName ?? 'a former member';
  return (
    <article
      aria-label={`Note by ${who}`}
      data-note-id={root.id}
      data-resolved={root.resolved}
      className={cx('flex flex-col gap-2 rounded-xl border bg-card p-3 shadow-xs', root.resolved ? 'border-rule opacity-80' : 'border-amber/50')}
    >
      <div className="flex flex-wrap items-center justify-between gap-2">
        <span className="flex flex-wrap gap-1.5">
          {notePins(root).map((pin) => (
            <PinChip key={pin.kind} pin={pin} elementIds={props.elementIds} elementLabels={props.elementLabels} onFocusElement={props.onFocusElement} onFocusFrequency={props.onFocusFrequency} />
          ))}
        </span>
        {root.resolved && (
          <span className="text-xs font-bold text-teal-deep">
            Resolved{root.resolvedBy ? ` by ${root.resolvedBy.displayName}` : ''}
          </span>
        )}
      </div>
      <p className="text-sm whitespace-pre-wrap text-ink">{root.body}</p>
      <Byline note={root} />
      {replies.length > 0 && (
        <ol aria-label="Replies" className="mt-1 flex flex-col gap-2 border-l-2 border-rule pl-3">
          {replies.map((r) => (
            <li key={r.id} data-note-id={r.id}>
              <p className="text-sm whitespace-pre-wrap">{r.body}</p>
              <div className="flex items-center gap-2">
                <Byline note={r} />
                {canDeleteNote(r, userId, role) && (
                  <button type="button" className="text-xs text-ink-faint underline hover:text-coral-deep" onClick={() => remove.mutate({ roomId, noteId: r.id })}>
                    Delete reply
                  </button>
                )}
              </div>
            </li>
          ))}
        </ol>
      )}
      {replying ? (
        <ReplyForm roomId={roomId} rootId={root.id} onDone={() => setReplying(false)} />
      ) : (
        <div className="flex flex-wrap gap-2">
          <Button variant="secondary" size="sm" onClick={() => setReplying(true)} aria-label={`Reply to ${who}`}>
            Reply
          </Button>
          {canResolveNote(root, userId, role) && (
            <Button variant="quiet" size="sm" busy={update.isPending} onClick={() => update.mutate({ roomId, noteId: root.id, resolved: !root.resolved })}>
              {root.resolved ? 'Reopen' : 'Resolve'}
            </Button>
          )}
          {canDeleteNote(root, userId, role) &&
            (confirmDelete ? (
              <span className="flex items-center gap-1.5">
                <Button variant="danger" size="sm" busy={remove.isPending} busyLabel="Deleting…" onClick={() => remove.mutate({ roomId, noteId: root.id })}>
                  Delete{replies.length ? ` with ${replies.length} repl${replies.length === 1 ? 'y' : 'ies'}` : ''}
                </Button>
                <Button variant="quiet" size="sm" onClick={() => setConfirmDelete(false)}>
                  Keep
                </Button>
              </span>
            ) : (
              <Button variant="quiet" size="sm" onClick={() => setConfirmDelete(true)} aria-label={`Delete the note by ${who}`}>
                Delete
              </Button>
            ))}
        </div>
      )}
    </article>
  );
}
