import { useEffect, useId, useState } from 'react';
import { NOTE_BODY_MAX } from '../../../../shared/api/notes';
import { formatEngineering, parseEngineering } from '../../../../shared/rf/units';
import { Button } from '../../../components/button';
import { controlClass, FormError } from '../../../components/form-field';
import { isApiError } from '../../../lib/api-client';
import { useCreateNote } from '../api/create-note';
import { NoteTextArea } from './note-text-area';

export interface NotePinRequest {
  elementId?: string;
  frequencyHz?: number;
}

export interface NewNoteFormProps {
  roomId: string;
  /** Elements a note may be pinned to (the chain now). */
  elementIds?: readonly string[];
  elementLabels?: Readonly<Record<string, string>>;
  /** A pin chosen elsewhere (a click on the chart or the chain) to start from. */
  pin?: NotePinRequest | null;
}

type PinKind = 'room' | 'element' | 'frequency';

function checkBody(body: string): string | null {
  if (!body.trim()) return 'Write the note first';
  if (body.length > NOTE_BODY_MAX) return `Keep the note under ${NOTE_BODY_MAX} characters`;
  return null;
}

/** Reads "2.45 GHz", "2450 MHz", "2.45G" as hertz; anything else is a sentence saying why not. */
export function parseNoteFrequency(text: string): { hz: number } | { error: string } {
  try {
    const hz = parseEngineering(text, 'Hz');
    if (!(hz > 0) || hz > 1e13) return { error: 'Give a positive frequency (up to 10 THz)' };
    return { hz };
  } catch (error) {
    return { error: error instanceof Error ? error.message : 'Not a frequency' };
  }
}

/** A new thread: the note, and where it is pinned (the whole room, an element, a frequency). Any member may write one. */
export function NewNoteForm({ roomId, elementIds = [], elementLabels = {}, pin }: NewNoteFormProps) {
  const id = useId();
  const [body, setBody] = useState('');
  const [pinKind, setPinKind] = useState<PinKind>('room');
  const [elementId, setElementId] = useState(elementIds[0] ?? '');
  const [frequency, setFrequency] = useState('');
  const [errors, setErrors] = useState<{ body?: string; frequency?: string; form?: string }>({});
  const create = useCreateNote(roomId, {
    onSuccess: () => {
      setBody('');
      setErrors({});
    },
    onError: (error) => {
      const fields = isApiError(error) ? error.fields : undefined;
      setErrors({
        body: fields?.body,
        frequency: fields?.frequencyHz,
        form: fields?.body || fields?.frequencyHz ? undefined : error.message,
      });
    },
  });

  // A pin asked for from outside (a chart click) replaces the current choice.
  useEffect(() => {
    if (pin?.elementId) {
      setPinKind('element');
      setElementId(pin.elementId);
    } else if (pin?.frequencyHz) {
      setPinKind('frequency');
      setFrequency(formatEngineering(pin.frequencyHz, 'Hz', { digits: 6 }));
    }
  }, [pin?.elementId, pin?.frequencyHz]);

  const elementChoices = elementIds.includes(elementId) || !elementId ? elementIds : [elementId, ...elementIds];

  return (
    <form
      aria-label="New note"
      noValidate
      className="flex flex-col gap-3"
      onSubmit={(event) => {
        event.preventDefault();
        const bodyError = checkBody(body);
        const freq = pinKind === 'frequency' ? parseNoteFrequency(frequency) : null;
        const frequencyError = freq && 'error' in freq ? freq.error : undefined;
        const elementError = pinKind === 'element' && !elementId ? 'Choose an element' : undefined;
        if (bodyError || frequencyError || elementError) {
          setErrors({ body: bodyError ?? undefined, frequency: frequencyError, form: elementError });
          return;
        }
        setErrors({});
        create.mutate({
          roomId,
          body: body.trim(),
          ...(pinKind === 'element' ? { elementId } : {}),
          ...(freq && 'hz' in freq ? { frequencyHz: freq.hz } : {}),
        });
      }}
    >
      <FormError message={errors.form} />
      <NoteTextArea label="Note" placeholder="What should the team look at?" value={body} error={errors.body} onChange={(e) => setBody(e.target.value)} />
      <fieldset className="flex flex-col gap-2">
        <legend className="mb-1 text-sm font-semibold">Pinned to</legend>
        <div className="flex flex-wrap items-center gap-x-4 gap-y-2 text-sm">
          <label className="flex items-center gap-1.5">
            <input type="radio" className="accent-teal-deep" name={`${id}-pin`} checked={pinKind === 'room'} onChange={() => setPinKind('room')} />
            The whole room
          </label>
          <label className="flex items-center gap-1.5">
            <input type="radio" className="accent-teal-deep" name={`${id}-pin`} checked={pinKind === 'element'} disabled={elementChoices.length === 0} onChange={() => setPinKind('element')} />
            An element
          </label>
          <label className="flex items-center gap-1.5">
            <input type="radio" className="accent-teal-deep" name={`${id}-pin`} checked={pinKind === 'frequency'} onChange={() => setPinKind('frequency')} />A frequency
          </label>
        </div>
        {pinKind === 'element' && (
          <div className="flex flex-col gap-1">
            <label htmlFor={`${id}-element`} className="text-sm font-semibold">
              Element
            </label>
            <select id={`${id}-element`} className={controlClass(false)} value={elementId} onChange={(e) => setElementId(e.target.value)}>
              {elementChoices.map((eid) => (
                <option key={eid} value={eid}>
                  {elementLabels[eid] ?? eid}
                </option>
              ))}
            </select>
          </div>
        )}
        {pinKind === 'frequency' && (
          <div className="flex flex-col gap-1">
            <label htmlFor={`${id}-frequency`} className="text-sm font-semibold">
              Frequency
            </label>
            <input
              id={`${id}-frequency`}
              className={controlClass(!!errors.frequency)}
              placeholder="e.g. 2.45 GHz"
              value={frequency}
              aria-invalid={errors.frequency ? true : undefined}
              aria-describedby={errors.frequency ? `${id}-frequency-error` : undefined}
              onChange={(e) => setFrequency(e.target.value)}
            />
            {errors.frequency && (
              <p id={`${id}-frequency-error`} className="text-sm font-semibold text-coral-deep">
                {errors.frequency}
              </p>
            )}
          </div>
        )}
      </fieldset>
      <div>
        <Button type="submit" busy={create.isPending} busyLabel="Posting…">
          Post note
        </Button>
      </div>
    </form>
  );
}
