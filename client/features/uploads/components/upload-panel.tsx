/**
 * FOR THE WORKSPACE: `<UploadPanel roomId role />` — Touchstone measurements of the room. Owners and
 * tuners upload a `.s1p` / `.s2p` (a file that does not parse is refused with the line at fault),
 * use one as the load or as a two-port element, or replace the load with a newer measurement in one
 * step (the design before is kept as a snapshot, and the comparison of old and new is one click away).
 * Everyone sees the list (who, when, ports, points, range), live.
 */
import { useId, useRef, useState } from 'react';
import { Link } from 'react-router-dom';
import { UPLOAD_MAX_BYTES } from '../../../../shared/api/uploads';
import { formatEngineering } from '../../../../shared/rf/units';
import { Button, buttonClass } from '../../../components/button';
import { Loading } from '../../../components/page-status';
import { paths } from '../../../config/paths';
import { dateFrom, dateTimeLabel, timeAgo } from '../../../lib/format-time';
import { notices } from '../../../lib/notices';
import type { RoomRole } from '../../../lib/room-role';
import { livePollInterval, useRoomLiveData } from '../../../lib/use-room-live-data';
import { useApplyUpload, type ApplyUploadOutcome } from '../api/apply-upload';
import { useUploads, type Upload } from '../api/get-uploads';
import { useUploadTouchstone } from '../api/upload-touchstone';

export interface UploadPanelProps {
  roomId: string;
  role: RoomRole;
}

const TOUCHSTONE_NAME = /\.s[12]p$/i;

/** The range of a measurement: "2.0 GHz – 3.0 GHz". */
export const uploadRange = (u: Pick<Upload, 'startHz' | 'stopHz'>) =>
  `${formatEngineering(u.startHz, 'Hz', { digits: 4 })} – ${formatEngineering(u.stopHz, 'Hz', { digits: 4 })}`;

/** A file the browser can refuse before sending it: wrong extension or too large. */
export function checkTouchstoneFile(file: { name: string; size: number }): string | null {
  if (!TOUCHSTONE_NAME.test(file.name)) return `“${file.name}” is not a Touchstone file: choose a .s1p (one port) or .s2p (two ports).`;
  if (file.size > UPLOAD_MAX_BYTES) return `“${file.name}” is larger than the ${UPLOAD_MAX_BYTES / 1024 / 1024} MiB limit.`;
  if (file.size === 0) return `“${file.name}” is empty.`;
  return null;
}

function UploadForm({ roomId }: { roomId: string }) {
  const id = useId();
  const input = useRef<HTMLInputElement>(null);
  const [error, setError] = useState<string | null>(null);
  const upload = useUploadTouchstone(roomId, {
    onSuccess: (u) => {
      setError(null);
      if (input.current) input.current.value = '';
      notices.post({ tone: 'success', title: 'Measurement uploaded', message: `${u.fileName}: ${u.ports}-port, ${u.points} points, ${uploadRange(u)}.` });
    },
    onError: (e, { file }) => setError(`“${file.name}” was not accepted: ${e.message}`),
  });
  return (
    <form
      aria-label="Upload a measurement"
      noValidate
      className="flex flex-col gap-3"
      onSubmit={(event) => {
        event.preventDefault();
        const file = input.current?.files?.[0];
        if (!file) return setError('Choose a .s1p or .s2p file first.');
        const refused = checkTouchstoneFile(file);
        if (refused) return setError(refused);
        setError(null);
        upload.mutate({ roomId, file });
      }}
    >
      {error && (
        <p role="alert" className="rounded-lg border border-coral/40 bg-coral-soft px-3 py-2 text-sm font-semibold whitespace-pre-wrap text-coral-deep" data-testid="upload-error">
          {error}
        </p>
      )}
      <div className="flex flex-col gap-3 sm:flex-row sm:items-end">
        <div className="flex flex-1 flex-col gap-1">
          <label htmlFor={`${id}-file`} className="text-sm font-semibold">
            Touchstone file (.s1p or .s2p, up to 5 MiB)
          </label>
          <input
            ref={input}
            id={`${id}-file`}
            type="file"
            accept=".s1p,.s2p,.S1P,.S2P"
            className="block w-full rounded-lg border border-rule bg-card px-3 py-2 text-sm file:mr-3 file:rounded-md file:border-0 file:bg-paper-deep file:px-3 file:py-1 file:font-semibold"
            onChange={() => setError(null)}
          />
        </div>
        <Button type="submit" busy={upload.isPending} busyLabel="Uploading…">
          Upload
        </Button>
      </div>
    </form>
  );
}

function When({ time }: { time: number }) {
  const date = dateFrom(time);
  if (!date) return <>—</>;
  return (
    <time dateTime={date.toISOString()} title={dateTimeLabel(date)}>
      {timeAgo(date)}
    </time>
  );
}

type Done = { upload: Upload; outcome: ApplyUploadOutcome };

function UploadActions({ roomId, upload, onDone }: { roomId: string; upload: Upload; onDone: (done: Done) => void }) {
  const apply = useApplyUpload(roomId, { onSuccess: (outcome) => onDone({ upload, outcome }) });
  const busy = apply.isPending;
  if (upload.ports === 1)
    return (
      <div className="flex flex-wrap gap-2">
        <Button variant="secondary" size="sm" disabled={busy} aria-label={`Use ${upload.fileName} as the load`} onClick={() => apply.mutate({ roomId, uploadId: upload.id, as: 'load' })}>
          Use as load
        </Button>
        <Button
          size="sm"
          busy={busy}
          busyLabel="Replacing…"
          aria-label={`Replace the load with ${upload.fileName}, keeping a snapshot first`}
          onClick={() => apply.mutate({ roomId, uploadId: upload.id, as: 'load', snapshotFirst: `Before ${upload.fileName}` })}
        >
          Replace load with this measurement
        </Button>
      </div>
    );
  return (
    <Button variant="secondary" size="sm" busy={busy} busyLabel="Adding…" aria-label={`Use ${upload.fileName} as a two-port`} onClick={() => apply.mutate({ roomId, uploadId: upload.id, as: 'two-port' })}>
      Use as two-port
    </Button>
  );
}

function DoneNote({ roomId, done, onClose }: { roomId: string; done: Done; onClose: () => void }) {
  const { upload, outcome } = done;
  return (
    <div role="status" className="flex flex-col gap-2 rounded-xl border border-teal/50 bg-teal-soft/60 p-4">
      <p>
        {outcome.as === 'load' ? (
          <>
            The load is now the measurement <strong>{upload.fileName}</strong>.
          </>
        ) : (
          <>
            <strong>{upload.fileName}</strong> is in the chain as a two-port{outcome.elementId ? ` (element ${outcome.elementId})` : ''}.
          </>
        )}
        {outcome.sweepAdjusted && ` The sweep was narrowed to the measured range (${uploadRange(upload)}).`}
      </p>
      <div className="flex flex-wrap gap-2">
        {outcome.before && (
          <Link to={paths.compare.getHref(roomId, outcome.before.id, 'live')} className={buttonClass('primary', 'sm')}>
            Compare old and new
          </Link>
        )}
        <Link to={paths.room.getHref(roomId)} className={buttonClass('secondary', 'sm')}>
          Open the workspace
        </Link>
        <Button variant="quiet" size="sm" onClick={onClose}>
          Done
        </Button>
      </div>
    </div>
  );
}

export function UploadPanel({ roomId, role }: UploadPanelProps) {
  const canEdit = role === 'owner' || role === 'tuner';
  const status = useRoomLiveData(roomId);
  const uploads = useUploads(roomId, { refetchInterval: livePollInterval(status) });
  const [done, setDone] = useState<Done | null>(null);

  return (
    <div className="flex flex-col gap-4" data-testid="upload-panel">
      {canEdit ? (
        <section aria-label="Upload" className="rounded-2xl border border-rule bg-card p-4 shadow-xs">
          <UploadForm roomId={roomId} />
        </section>
      ) : (
        <p className="rounded-xl border border-rule bg-paper-deep/60 px-4 py-3 text-sm text-ink-soft">
          Owners and tuners upload measurements and put them in the design; you can see what has been measured.
        </p>
      )}
      {done && <DoneNote roomId={roomId} done={done} onClose={() => setDone(null)} />}
      {uploads.data ? (
        uploads.data.length ? (
          <div className="overflow-x-auto rounded-xl border border-rule bg-card">
            <table className="w-full border-collapse text-left text-sm" aria-label="Uploaded measurements">
              <thead className="border-b border-rule bg-paper-deep/50">
                <tr>
                  {['File', 'Who', 'When', 'Ports', 'Points', 'Range', ...(canEdit ? ['Use'] : [])].map((h) => (
                    <th key={h} scope="col" className="px-3 py-2 font-bold whitespace-nowrap text-ink-soft">
                      {h}
                    </th>
                  ))}
                </tr>
              </thead>
              <tbody className="divide-y divide-rule">
                {uploads.data.map((u) => (
                  <tr key={u.id} data-upload-id={u.id} className="align-top">
                    <td className="numeric px-3 py-2 font-semibold break-all">{u.fileName}</td>
                    <td className="px-3 py-2">{u.uploadedBy?.displayName ?? 'a former member'}</td>
                    <td className="px-3 py-2 whitespace-nowrap">
                      <When time={u.createdAt} />
                    </td>
                    <td className="numeric px-3 py-2">{u.ports}</td>
                    <td className="numeric px-3 py-2">{u.points}</td>
                    <td className="numeric px-3 py-2 whitespace-nowrap">{uploadRange(u)}</td>
                    {canEdit && (
                      <td className="px-3 py-2">
                        <UploadActions roomId={roomId} upload={u} onDone={setDone} />
                      </td>
                    )}
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
        ) : (
          <p className="rounded-xl border border-dashed border-rule bg-card px-4 py-5 text-center text-ink-soft">No measurements uploaded yet.</p>
        )
      ) : uploads.isError ? (
        <p role="alert" className="text-coral-deep">
          {uploads.error.message}
        </p>
      ) : (
        <Loading label="Loading the uploads…" />
      )}
    </div>
  );
}
