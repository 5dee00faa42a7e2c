// The room socket's message parsing (against y-protocols' own encoders) and the redundant-update check
// that keeps no-op resyncs out of the log.
import { describe, expect, it } from 'vitest';
import * as Y from 'yjs';
import * as encoding from 'lib0/encoding';
import * as syncProtocol from 'y-protocols/sync';
import * as awarenessProtocol from 'y-protocols/awareness';
import { parseAwarenessUpdate, parseClientMessage, ProtocolError } from '../../server/collab/protocol';
import { updateIsRedundant } from '../../server/collab/room';
import { createDesignDoc, removeElement, setElementField } from '../../shared/collab/schema';
import { designWith } from './helpers/world';

function encoded(write: (e: encoding.Encoder) => void): Uint8Array {
  const e = encoding.createEncoder();
  write(e);
  return encoding.toUint8Array(e);
}

describe('parseClientMessage', () => {
  const doc = createDesignDoc(designWith([{ id: 'c1', kind: 'shunt-c', value: 1e-12 }]));

  it('classifies what the y-websocket client sends', () => {
    const step1 = encoded((e) => {
      encoding.writeVarUint(e, 0);
      syncProtocol.writeSyncStep1(e, doc);
    });
    expect(parseClientMessage(step1)).toEqual({ kind: 'sync-step-1', stateVector: Y.encodeStateVector(doc) });
    const step2 = encoded((e) => {
      encoding.writeVarUint(e, 0);
      syncProtocol.writeSyncStep2(e, doc);
    });
    expect(parseClientMessage(step2)).toMatchObject({ kind: 'sync-step-2' });
    const update = encoded((e) => {
      encoding.writeVarUint(e, 0);
      syncProtocol.writeUpdate(e, Y.encodeStateAsUpdate(doc));
    });
    expect(parseClientMessage(update)).toEqual({ kind: 'update', update: Y.encodeStateAsUpdate(doc) });
    const awareness = new awarenessProtocol.Awareness(doc);
    awareness.setLocalState({ cursor: 'c1' });
    const aw = encoded((e) => {
      encoding.writeVarUint(e, 1);
      encoding.writeVarUint8Array(e, awarenessProtocol.encodeAwarenessUpdate(awareness, [doc.clientID]));
    });
    const parsed = parseClientMessage(aw);
    expect(parsed.kind).toBe('awareness');
    if (parsed.kind === 'awareness') expect(parseAwarenessUpdate(parsed.update)).toEqual([{ clientId: doc.clientID, clock: 1, state: { cursor: 'c1' } }]);
    expect(parseClientMessage(new Uint8Array([3]))).toEqual({ kind: 'query-awareness' });
    awareness.destroy();
  });

  it.each([
    ['empty', []],
    ['unknown type', [4]],
    ['unknown sync step', [0, 3, 0]],
    ['length past the end', [0, 2, 9, 1]],
    ['trailing bytes', [3, 0]],
  ])('throws ProtocolError for %s', (_n, bytes) => {
    expect(() => parseClientMessage(new Uint8Array(bytes))).toThrow(ProtocolError);
  });
});

describe('updateIsRedundant', () => {
  it('is true only when the update adds no struct and no deletion', () => {
    const server = createDesignDoc(designWith([{ id: 'c1', kind: 'shunt-c', value: 1e-12 }, { id: 'c2', kind: 'shunt-c', value: 2e-12 }]));
    const client = new Y.Doc();
    Y.applyUpdate(client, Y.encodeStateAsUpdate(server));
    const updates: Uint8Array[] = [];
    client.on('update', (u: Uint8Array) => updates.push(u));

    expect(updateIsRedundant(server, Y.decodeUpdate(Y.encodeStateAsUpdate(client)))).toBe(true);
    setElementField(client, 'c1', 'value', 3e-12);
    expect(updateIsRedundant(server, Y.decodeUpdate(updates[0]))).toBe(false);
    Y.applyUpdate(server, updates[0]);
    expect(updateIsRedundant(server, Y.decodeUpdate(updates[0]))).toBe(true);
    // A pure deletion: only a delete set.
    removeElement(client, 'c2');
    expect(updateIsRedundant(server, Y.decodeUpdate(updates[1]))).toBe(false);
    Y.applyUpdate(server, updates[1]);
    expect(updateIsRedundant(server, Y.decodeUpdate(updates[1]))).toBe(true);
    // The client's full state (every struct and its whole delete set) is now old news.
    expect(updateIsRedundant(server, Y.decodeUpdate(Y.encodeStateAsUpdate(client)))).toBe(true);
    server.destroy();
    client.destroy();
  });
});
