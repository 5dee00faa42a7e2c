/**
 * Edits the server makes to a room's design on a member's behalf, each as one change of the shared
 * document (server/rooms/document-edit.ts): restoring a snapshot, and putting an uploaded Touchstone
 * measurement in as the load or as a two-port element.
 */
import type * as Y from 'yjs';
import type { Knex } from 'knex';
import { HttpError, notFound } from '../errors';
import { newId } from '../ids';
import { editRoomDocument, type RoomUpdateSink } from '../rooms/document-edit';
import { loadRoomDesign } from '../collab/store';
import { createSnapshot, type SnapshotView } from './snapshots';
import {
  DESIGN_FIELDS,
  insertElement,
  orderedElementIds,
  readDesign,
  readDesignInput,
  removeElement,
  replaceElements,
  setDesignField,
} from '../../shared/collab/schema';
import { jsonEqual } from '../../shared/api/design-diff';
import { DesignError, type Design, type Element } from '../../shared/rf/design';
import { formatEngineering } from '../../shared/rf/units';
import type { UploadWithText } from '../../shared/api/uploads';

export interface RoomEditDeps {
  knex: Knex;
  sink: RoomUpdateSink;
}

const invalidRoomDesign = (e: DesignError) =>
  new HttpError(409, 'invalid-design', `The room document does not hold a valid design: ${e.message}`, {
    path: e.path,
  });

/** The room's design, or null when the document holds no valid design. */
async function currentDesign(knex: Knex, roomId: string): Promise<Design | null> {
  try {
    return await loadRoomDesign(knex, roomId);
  } catch (e) {
    if (e instanceof DesignError) return null;
    throw e;
  }
}

async function designAfterEdit(knex: Knex, roomId: string): Promise<Design> {
  try {
    return await loadRoomDesign(knex, roomId);
  } catch (e) {
    if (e instanceof DesignError) throw invalidRoomDesign(e);
    throw e;
  }
}

/**
 * Make the document hold `target` (all but its name, which stays the room's): every top-level field
 * that differs is set, and the chain is replaced when it differs. Fields that already match are left
 * alone, so collaborators' work on them is untouched.
 */
export function writeDesignOver(doc: Y.Doc, target: Design): void {
  const current = readDesignInput(doc) as unknown as Record<string, unknown>;
  const wanted = target as unknown as Record<string, unknown>;
  for (const key of DESIGN_FIELDS) {
    if (key === 'name') continue;
    if (!jsonEqual(current[key], wanted[key])) setDesignField(doc, key, wanted[key]);
  }
  if (!jsonEqual(current.elements, target.elements)) replaceElements(doc, target.elements);
}

const sameApartFromName = (a: Design, b: Design) => jsonEqual({ ...a, name: '' }, { ...b, name: '' });

function undoLabel(label: string): string {
  const text = `Before restoring “${label}”`;
  return text.length <= 200 ? text : `${text.slice(0, 198)}…”`;
}

export interface RestoreOutcome {
  changed: boolean;
  undoSnapshot: SnapshotView | null;
  design: Design;
}

/**
 * Restore a snapshot's design into the room as one edit. The state before it is kept as a snapshot
 * ("Before restoring “label”"), so restoring that one undoes this; a room that already holds the
 * snapshot's design is left alone. A document that holds no valid design is restored all the same
 * (that is how it gets mended), without the undo snapshot.
 */
export async function restoreSnapshot(
  deps: RoomEditDeps,
  input: { roomId: string; snapshot: { id: string; label: string; design: Design }; userId: string },
): Promise<RestoreOutcome> {
  const before = await currentDesign(deps.knex, input.roomId);
  if (before && sameApartFromName(before, input.snapshot.design))
    return { changed: false, undoSnapshot: null, design: before };
  const undoSnapshot = before
    ? await createSnapshot(deps.knex, {
        roomId: input.roomId,
        label: undoLabel(input.snapshot.label),
        userId: input.userId,
      })
    : null;
  const { changed } = await editRoomDocument(deps, input.roomId, input.userId, (doc) =>
    writeDesignOver(doc, input.snapshot.design),
  );
  return { changed, undoSnapshot, design: await designAfterEdit(deps.knex, input.roomId) };
}

const hz = (v: number) => formatEngineering(v, 'Hz');

/** The sweep narrowed to the measured range; 400 when the band itself reaches outside it. */
function sweepWithin(design: Design, upload: UploadWithText): Design['sweep'] | null {
  const { band, sweep } = design;
  if (band.startHz < upload.startHz || band.stopHz > upload.stopHz)
    throw new HttpError(
      400,
      'out-of-range',
      `“${upload.fileName}” covers ${hz(upload.startHz)}–${hz(upload.stopHz)}, but the band ${hz(band.startHz)}–${hz(band.stopHz)} reaches outside it. Measure across the whole band, or narrow the band first.`,
    );
  if (sweep.startHz >= upload.startHz && sweep.stopHz <= upload.stopHz) return null;
  return {
    ...sweep,
    startHz: Math.max(sweep.startHz, upload.startHz),
    stopHz: Math.min(sweep.stopHz, upload.stopHz),
  };
}

function wrongPorts(upload: UploadWithText, as: 'load' | 'two-port'): HttpError {
  const want = as === 'load' ? 'a one-port (.s1p) measurement' : 'a two-port (.s2p) measurement';
  return new HttpError(
    400,
    'wrong-ports',
    `“${upload.fileName}” has ${upload.ports} port${upload.ports === 1 ? '' : 's'}; ${as === 'load' ? 'a load' : 'a two-port element'} needs ${want}.`,
  );
}

function newTwoPortId(doc: Y.Doc): string {
  const ids = new Set(orderedElementIds(doc));
  for (;;) {
    const id = `two-port-${newId().slice(0, 6).toLowerCase()}`;
    if (!ids.has(id)) return id;
  }
}

export interface UseUploadOutcome {
  elementId: string | null;
  sweepAdjusted: boolean;
  design: Design;
}

/**
 * Put an upload into the design as one edit: as the load (a measured load naming the upload), or as a
 * two-port element (replacing `elementId` in its place, or added at the port end). A sweep reaching
 * outside the measured range is narrowed to it in the same edit.
 */
export async function useUpload(
  deps: RoomEditDeps,
  input: {
    roomId: string;
    upload: UploadWithText;
    as: 'load' | 'two-port';
    elementId?: string;
    userId: string;
  },
): Promise<UseUploadOutcome> {
  const { upload } = input;
  if ((input.as === 'load') !== (upload.ports === 1)) throw wrongPorts(upload, input.as);
  if (input.as === 'load' && input.elementId !== undefined)
    throw new HttpError(
      400,
      'invalid-input',
      'elementId: only a two-port element replaces an element; a load has none',
      {
        field: 'elementId',
      },
    );

  const { result } = await editRoomDocument(deps, input.roomId, input.userId, (doc) => {
    let design: Design;
    try {
      design = readDesign(doc);
    } catch (e) {
      if (e instanceof DesignError) throw invalidRoomDesign(e);
      throw e;
    }
    const sweep = sweepWithin(design, upload);
    const ids = orderedElementIds(doc);
    const index = input.elementId === undefined ? ids.length : ids.indexOf(input.elementId);
    if (index < 0) throw notFound(`There is no element “${input.elementId}” in this room’s chain.`);
    // Checked above; from here on, only writes.
    if (sweep) setDesignField(doc, 'sweep', sweep);
    if (input.as === 'load') {
      setDesignField(doc, 'load', {
        kind: 'measured',
        touchstone: upload.text,
        uploadId: upload.id,
        fileName: upload.fileName,
      });
      return { elementId: null, sweepAdjusted: sweep !== null };
    }
    if (input.elementId !== undefined) removeElement(doc, input.elementId);
    const element: Element = {
      id: input.elementId ?? newTwoPortId(doc),
      kind: 'two-port',
      label: upload.fileName,
      touchstone: upload.text,
      flipped: false,
      uploadId: upload.id,
    };
    insertElement(doc, element, index);
    return { elementId: element.id, sweepAdjusted: sweep !== null };
  });
  return { ...result, design: await designAfterEdit(deps.knex, input.roomId) };
}
