import { useId, useRef, useState } from 'react';
import { Button } from '../../../components/button';
import { useCreateRoom } from '../api/create-room';

/** The largest design file sent (the server's JSON limit is 2 MB). */
const MAX_DESIGN_BYTES = 2 * 1024 * 1024;

/** A room name for an imported design: its own `name`, else the file's name without `.matchloom.json`. */
export function importedRoomName(design: unknown, fileName: string): string {
  const own = typeof design === 'object' && design !== null && 'name' in design ? (design as { name: unknown }).name : undefined;
  if (typeof own === 'string' && own.trim()) return own.trim().slice(0, 200);
  const base = fileName.replace(/\.matchloom\.json$/i, '').replace(/\.json$/i, '').trim();
  return (base || 'Imported design').slice(0, 200);
}

/** Reads a design file's text as JSON, or says in one sentence why it is not. */
export function readDesignText(text: string, fileName: string): { ok: true; design: unknown } | { ok: false; message: string } {
  try {
    return { ok: true, design: JSON.parse(text) as unknown };
  } catch (error) {
    const reason = error instanceof Error ? error.message : 'it does not parse';
    return { ok: false, message: `“${fileName}” is not a JSON file (${reason}). A design file is the .matchloom.json a room’s hand-off exports.` };
  }
}

/** Opens a `.matchloom.json` and starts a room from it; the server's message (naming the JSON path at fault) is shown as it is. */
export function ImportDesignForm({ onCreated }: { onCreated: (roomId: string) => void }) {
  const id = useId();
  const input = useRef<HTMLInputElement>(null);
  const [error, setError] = useState<string | null>(null);
  const [reading, setReading] = useState(false);
  const create = useCreateRoom({
    onSuccess: (room) => onCreated(room.id),
    onError: (e) => setError(e.message),
  });

  return (
    <form
      aria-label="Import a design file"
      noValidate
      className="flex flex-col gap-3"
      onSubmit={async (event) => {
        event.preventDefault();
        setError(null);
        const file = input.current?.files?.[0];
        if (!file) return setError('Choose a .matchloom.json file first.');
        if (file.size > MAX_DESIGN_BYTES) return setError(`“${file.name}” is larger than 2 MB, the most a design file may be.`);
        setReading(true);
        let text: string;
        try {
          text = await file.text();
        } catch {
          setReading(false);
          return setError(`“${file.name}” could not be read.`);
        }
        setReading(false);
        const read = readDesignText(text, file.name);
        if (!read.ok) return setError(read.message);
        create.mutate({ name: importedRoomName(read.design, file.name), design: read.design });
      }}
    >
      {error && (
        <p role="alert" className="rounded-lg border border-coral/40 bg-coral-soft px-3 py-2 text-sm font-semibold text-coral-deep" data-testid="import-error">
          {error}
        </p>
      )}
      <div className="flex flex-col gap-3 sm:flex-row sm:items-end">
        <div className="flex flex-1 flex-col gap-1">
          <label htmlFor={`${id}-file`} className="text-sm font-semibold">
            Design file (.matchloom.json)
          </label>
          <input
            ref={input}
            id={`${id}-file`}
            type="file"
            accept=".json,application/json"
            onChange={() => setError(null)}
            className="block w-full rounded-lg border border-rule bg-card px-3 py-2 text-sm file:mr-3 file:rounded-md file:border-0 file:bg-paper-deep file:px-3 file:py-1 file:font-semibold"
          />
        </div>
        <Button type="submit" variant="secondary" busy={reading || create.isPending} busyLabel="Importing…">
          Import design file
        </Button>
      </div>
    </form>
  );
}
