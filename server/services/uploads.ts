/**
 * Touchstone uploads (the `uploads` table): a measured `.s1p` (a load) or `.s2p` (a two-port element),
 * checked by name and by content with the engine's parser, kept with its uploader and time.
 */
import type { Knex } from 'knex';
import { HttpError } from '../errors';
import { newId } from '../ids';
import { parseTouchstone, TouchstoneError } from '../../shared/rf/touchstone';
import type { Upload, UploadWithText } from '../../shared/api/uploads';

export interface CheckedUpload {
  fileName: string;
  ports: 1 | 2;
  points: number;
  startHz: number;
  stopHz: number;
  text: string;
}

const FILE_NAME_MAX = 255;

/** The last path segment, without control characters, at most 255 characters (extension kept). */
export function cleanFileName(name: string): string {
  // eslint-disable-next-line no-control-regex
  const base = (name.split(/[\\/]/).pop() ?? '').replace(/[\u0000-\u001f\u007f]/g, '').trim();
  if (base.length <= FILE_NAME_MAX) return base;
  const dot = base.lastIndexOf('.');
  const ext = dot > 0 && base.length - dot <= 10 ? base.slice(dot) : '';
  return base.slice(0, FILE_NAME_MAX - ext.length) + ext;
}

function decodeText(bytes: Buffer, fileName: string): string {
  if (bytes.includes(0))
    throw new HttpError(
      400,
      'not-text',
      `“${fileName}” is not a text file; a Touchstone file is plain text.`,
    );
  try {
    return new TextDecoder('utf-8', { fatal: true }).decode(bytes);
  } catch {
    return bytes.toString('latin1'); // an older file with a Latin-1 comment (µ, °) is still readable
  }
}

/** Check an uploaded file by its name (`.s1p`/`.s2p`) and by parsing it. Throws a 400 naming the line. */
export function checkTouchstoneUpload(originalName: string, bytes: Buffer): CheckedUpload {
  const fileName = cleanFileName(originalName);
  const m = /\.s([12])p$/i.exec(fileName);
  if (!m)
    throw new HttpError(
      400,
      'unsupported-file',
      `Only Touchstone .s1p and .s2p files can be uploaded${fileName ? ` (got “${fileName}”)` : ''}.`,
    );
  const ports = Number(m[1]) as 1 | 2;
  const text = decodeText(bytes, fileName);
  try {
    const data = parseTouchstone(text, { ports });
    const f = data.frequenciesHz;
    return { fileName, ports, points: f.length, startHz: f[0], stopHz: f[f.length - 1], text };
  } catch (e) {
    if (e instanceof TouchstoneError)
      throw new HttpError(400, 'invalid-touchstone', e.message, { line: e.line, fileName });
    throw e;
  }
}

interface UploadRow {
  id: string;
  room_id: string;
  uploader_id: string | null;
  display_name: string | null;
  file_name: string;
  ports: number;
  points: number;
  start_hz: number;
  stop_hz: number;
  created_at: number;
}

function toUpload(r: UploadRow): Upload {
  return {
    id: r.id,
    roomId: r.room_id,
    fileName: r.file_name,
    ports: Number(r.ports),
    points: Number(r.points),
    startHz: Number(r.start_hz),
    stopHz: Number(r.stop_hz),
    uploadedBy: r.uploader_id && r.display_name ? { id: r.uploader_id, displayName: r.display_name } : null,
    createdAt: Number(r.created_at),
  };
}

function uploadQuery(knex: Knex | Knex.Transaction) {
  return knex('uploads as up')
    .leftJoin('users as u', 'u.id', 'up.uploader_id')
    .select(
      'up.id',
      'up.room_id',
      'up.uploader_id',
      'u.display_name',
      'up.file_name',
      'up.ports',
      'up.points',
      'up.start_hz',
      'up.stop_hz',
      'up.created_at',
    );
}

export async function insertUpload(
  knex: Knex | Knex.Transaction,
  input: CheckedUpload & { roomId: string; uploaderId: string | null; now?: number },
): Promise<Upload> {
  const id = newId();
  await knex('uploads').insert({
    id,
    room_id: input.roomId,
    uploader_id: input.uploaderId,
    file_name: input.fileName,
    ports: input.ports,
    points: input.points,
    start_hz: input.startHz,
    stop_hz: input.stopHz,
    text: input.text,
    created_at: input.now ?? Date.now(),
  });
  return toUpload((await uploadQuery(knex).where('up.id', id).first()) as UploadRow);
}

/** A room's uploads, newest first (without their text). */
export async function listUploads(knex: Knex | Knex.Transaction, roomId: string): Promise<Upload[]> {
  const rows = (await uploadQuery(knex)
    .where('up.room_id', roomId)
    .orderBy([
      { column: 'up.created_at', order: 'desc' },
      { column: 'up.rowid' as string, order: 'desc' },
    ])) as UploadRow[];
  return rows.map(toUpload);
}

/** One upload of the room, with its text; null when the room has no such upload. */
export async function getUpload(
  knex: Knex | Knex.Transaction,
  roomId: string,
  uploadId: string,
): Promise<UploadWithText | null> {
  const row = (await uploadQuery(knex)
    .select('up.text')
    .where({ 'up.id': uploadId, 'up.room_id': roomId })
    .first()) as (UploadRow & { text: string }) | undefined;
  return row ? { ...toUpload(row), text: row.text } : null;
}
