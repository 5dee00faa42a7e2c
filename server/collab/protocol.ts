/**
 * The y-websocket wire protocol, as the y-websocket 3.1.0 client speaks it: each binary message starts
 * with a varint message type (0 sync, 1 awareness, 3 query awareness); a sync message then has a varint
 * step (0 step 1 = a state vector, i.e. a read; 1 step 2 and 2 update = document writes) and a
 * length-prefixed payload. Parsing is strict: anything else, or trailing bytes, is a `ProtocolError`.
 */
import * as encoding from 'lib0/encoding';
import * as decoding from 'lib0/decoding';
import * as Y from 'yjs';
import * as syncProtocol from 'y-protocols/sync';
import * as awarenessProtocol from 'y-protocols/awareness';

export const MESSAGE_SYNC = 0;
export const MESSAGE_AWARENESS = 1;
export const MESSAGE_AUTH = 2;
export const MESSAGE_QUERY_AWARENESS = 3;

export type ClientMessage =
  | { kind: 'sync-step-1'; stateVector: Uint8Array }
  | { kind: 'sync-step-2'; update: Uint8Array }
  | { kind: 'update'; update: Uint8Array }
  | { kind: 'awareness'; update: Uint8Array }
  | { kind: 'query-awareness' };

export class ProtocolError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'ProtocolError';
  }
}

function guarded<T>(what: string, read: () => T): T {
  try {
    return read();
  } catch {
    throw new ProtocolError(`truncated ${what}`);
  }
}

/** Classify one client message without applying anything. Throws `ProtocolError`. */
export function parseClientMessage(buf: Uint8Array): ClientMessage {
  if (buf.byteLength === 0) throw new ProtocolError('empty message');
  const d = decoding.createDecoder(buf);
  const type = guarded('message type', () => decoding.readVarUint(d));
  let msg: ClientMessage;
  if (type === MESSAGE_SYNC) {
    const step = guarded('sync step', () => decoding.readVarUint(d));
    const payload = guarded('sync payload', () => decoding.readVarUint8Array(d));
    if (step === syncProtocol.messageYjsSyncStep1) msg = { kind: 'sync-step-1', stateVector: payload };
    else if (step === syncProtocol.messageYjsSyncStep2) msg = { kind: 'sync-step-2', update: payload };
    else if (step === syncProtocol.messageYjsUpdate) msg = { kind: 'update', update: payload };
    else throw new ProtocolError(`unknown sync step ${step}`);
  } else if (type === MESSAGE_AWARENESS) {
    msg = { kind: 'awareness', update: guarded('awareness payload', () => decoding.readVarUint8Array(d)) };
  } else if (type === MESSAGE_QUERY_AWARENESS) {
    msg = { kind: 'query-awareness' };
  } else {
    throw new ProtocolError(`unknown message type ${type}`);
  }
  if (decoding.hasContent(d)) throw new ProtocolError('trailing bytes after the message');
  return msg;
}

/** One entry of an awareness update. */
export interface AwarenessEntry {
  clientId: number;
  clock: number;
  /** null: the client left. */
  state: unknown;
}

/** Decode an awareness update (count, then client id, clock and JSON state per entry). Throws `ProtocolError`. */
export function parseAwarenessUpdate(update: Uint8Array): AwarenessEntry[] {
  const d = decoding.createDecoder(update);
  const out: AwarenessEntry[] = [];
  try {
    const n = decoding.readVarUint(d);
    for (let i = 0; i < n; i++) {
      const clientId = decoding.readVarUint(d);
      const clock = decoding.readVarUint(d);
      const state: unknown = JSON.parse(decoding.readVarString(d));
      out.push({ clientId, clock, state });
    }
  } catch {
    throw new ProtocolError('malformed awareness update');
  }
  if (decoding.hasContent(d)) throw new ProtocolError('trailing bytes after the awareness update');
  return out;
}

/** Check that bytes decode as a Yjs (v1) update, without applying them. Throws `ProtocolError`. */
export function decodeDocumentUpdate(update: Uint8Array): ReturnType<typeof Y.decodeUpdate> {
  try {
    return Y.decodeUpdate(update);
  } catch {
    throw new ProtocolError('malformed document update');
  }
}

function message(write: (e: encoding.Encoder) => void): Uint8Array {
  const e = encoding.createEncoder();
  write(e);
  return encoding.toUint8Array(e);
}

export function syncStep1Message(doc: Y.Doc): Uint8Array {
  return message((e) => {
    encoding.writeVarUint(e, MESSAGE_SYNC);
    syncProtocol.writeSyncStep1(e, doc);
  });
}

/** The answer to a client's sync step 1. Throws `ProtocolError` for a malformed state vector. */
export function syncStep2Message(doc: Y.Doc, stateVector: Uint8Array): Uint8Array {
  try {
    return message((e) => {
      encoding.writeVarUint(e, MESSAGE_SYNC);
      syncProtocol.writeSyncStep2(e, doc, stateVector);
    });
  } catch {
    throw new ProtocolError('malformed state vector');
  }
}

export function updateMessage(update: Uint8Array): Uint8Array {
  return message((e) => {
    encoding.writeVarUint(e, MESSAGE_SYNC);
    syncProtocol.writeUpdate(e, update);
  });
}

export function awarenessMessage(awareness: awarenessProtocol.Awareness, clients: number[]): Uint8Array {
  return message((e) => {
    encoding.writeVarUint(e, MESSAGE_AWARENESS);
    encoding.writeVarUint8Array(e, awarenessProtocol.encodeAwarenessUpdate(awareness, clients));
  });
}
