/** A raw `ws` client speaking (or abusing) the y-websocket protocol by hand, for hostile-client tests. */
import WebSocket from 'ws';
import * as Y from 'yjs';
import * as encoding from 'lib0/encoding';
import * as decoding from 'lib0/decoding';
import * as syncProtocol from 'y-protocols/sync';

export interface RawClient {
  ws: WebSocket;
  received: Uint8Array[];
  opened: Promise<void>;
  closed: Promise<{ code: number; reason: string }>;
  isOpen(): boolean;
  send(bytes: Uint8Array | string): void;
  /** The document as the server sent it in its answers (sync step 2 and updates). */
  serverDoc(): Y.Doc;
  close(): void;
}

export function rawClient(url: string, headers: Record<string, string> = {}): RawClient {
  const ws = new WebSocket(url, { headers });
  const received: Uint8Array[] = [];
  ws.binaryType = 'nodebuffer';
  ws.on('message', (data: Buffer) => received.push(new Uint8Array(data)));
  ws.on('error', () => {});
  const opened = new Promise<void>((resolve, reject) => {
    ws.once('open', () => resolve());
    ws.once('unexpected-response', (_req, res) => reject(new Error(`HTTP ${res.statusCode}`)));
  });
  const closed = new Promise<{ code: number; reason: string }>((resolve) => ws.once('close', (code, reason) => resolve({ code, reason: reason.toString() })));
  return {
    ws,
    received,
    opened,
    closed,
    isOpen: () => ws.readyState === WebSocket.OPEN,
    send: (bytes) => ws.send(bytes),
    serverDoc() {
      const doc = new Y.Doc();
      for (const m of received) {
        const d = decoding.createDecoder(m);
        if (decoding.readVarUint(d) !== 0) continue;
        const step = decoding.readVarUint(d);
        if (step === 1 || step === 2) Y.applyUpdate(doc, decoding.readVarUint8Array(d));
      }
      return doc;
    },
    close: () => ws.close(),
  };
}

function message(write: (e: encoding.Encoder) => void): Uint8Array {
  const e = encoding.createEncoder();
  write(e);
  return encoding.toUint8Array(e);
}

export const syncStep1 = (doc: Y.Doc) =>
  message((e) => {
    encoding.writeVarUint(e, 0);
    syncProtocol.writeSyncStep1(e, doc);
  });
export const syncStep2 = (update: Uint8Array) =>
  message((e) => {
    encoding.writeVarUint(e, 0);
    encoding.writeVarUint(e, 1);
    encoding.writeVarUint8Array(e, update);
  });
export const updateMsg = (update: Uint8Array) =>
  message((e) => {
    encoding.writeVarUint(e, 0);
    encoding.writeVarUint(e, 2);
    encoding.writeVarUint8Array(e, update);
  });
export const awarenessMsg = (entries: { clientId: number; clock: number; state: unknown }[]) =>
  message((e) => {
    encoding.writeVarUint(e, 1);
    const inner = encoding.createEncoder();
    encoding.writeVarUint(inner, entries.length);
    for (const x of entries) {
      encoding.writeVarUint(inner, x.clientId);
      encoding.writeVarUint(inner, x.clock);
      encoding.writeVarString(inner, JSON.stringify(x.state));
    }
    encoding.writeVarUint8Array(e, encoding.toUint8Array(inner));
  });

/** The update an edit makes on a copy of `base`. */
export function editUpdate(base: Y.Doc, edit: (doc: Y.Doc) => void): Uint8Array {
  const doc = new Y.Doc();
  Y.applyUpdate(doc, Y.encodeStateAsUpdate(base));
  let update: Uint8Array | null = null;
  doc.on('update', (u: Uint8Array) => (update = update ? Y.mergeUpdates([update, u]) : u));
  edit(doc);
  doc.destroy();
  if (!update) throw new Error('the edit changed nothing');
  return update;
}
