import { QueryClient } from '@tanstack/react-query';
import { describe, expect, it } from 'vitest';
import type { Lineage } from '../../shared/api/lineage';
import type { Snapshot } from '../../shared/api/snapshots';
import { TEAM_EVENTS } from '../../shared/collab/team-events';
import { ROOM_EVENTS } from '../../shared/collab/events';
import { lineageCounts, lineageTree } from '../../client/features/lineage/components/lineage-model';
import { linkedText } from '../../client/features/mailbox/components/linked-text';
import { importedRoomName, readDesignText } from '../../client/features/rooms/components/import-design-form';
import { checkTouchstoneFile, uploadRange } from '../../client/features/uploads/components/upload-panel';
import { attachmentName, exportHref } from '../../client/features/handoff/api/download-export';
import { queryKeys } from '../../client/lib/query-keys';
import { applyRoomEvent, upsertById } from '../../client/lib/use-room-live-data';

const snap = (id: string, roomId: string, createdAt: number): Snapshot => ({
  id,
  roomId,
  label: id,
  createdAt,
  createdBy: null,
  figures: null,
  forReview: false,
});

describe('lineageTree', () => {
  const lineage: Lineage = {
    roomId: 'b1',
    rootRoomId: 'root',
    rooms: [
      { id: 'root', member: true, name: 'Whip', role: 'owner', createdAt: 1, parent: null, snapshots: [snap('s2', 'root', 20), snap('s1', 'root', 10)] },
      { id: 'b1', member: true, name: 'Branch one', role: 'tuner', createdAt: 30, parent: { snapshotId: 's2', roomId: 'root' }, snapshots: [snap('s3', 'b1', 40)] },
      { id: 'hidden', member: false, parent: { snapshotId: 's1', roomId: 'root' } },
      { id: 'deep', member: true, name: 'Under the hidden one', role: 'observer', createdAt: 50, parent: { snapshotId: 'sx', roomId: 'hidden' }, snapshots: [] },
      { id: 'orphan', member: true, name: 'Parent gone', role: 'owner', createdAt: 60, parent: { snapshotId: 'sy', roomId: null }, snapshots: [] },
    ],
  };

  it('hangs each branch under its snapshot, snapshots oldest first, and marks the current room', () => {
    const [root, orphan] = lineageTree(lineage);
    expect(root.room.id).toBe('root');
    expect(root.snapshots.map((s) => s.snapshot.id)).toEqual(['s1', 's2']);
    expect(root.snapshots[1].branches.map((b) => b.room.id)).toEqual(['b1']);
    expect(root.snapshots[1].branches[0].current).toBe(true);
    expect(root.snapshots[0].branches.map((b) => b.room.id)).toEqual(['hidden']);
    // A branch of a snapshot the caller cannot see hangs under that room directly.
    expect(root.snapshots[0].branches[0].looseBranches.map((b) => b.room.id)).toEqual(['deep']);
    expect(orphan.room.id).toBe('orphan');
    expect(orphan.orphan).toBe('parent-room-deleted');
    expect(lineageCounts(lineage)).toEqual({ rooms: 5, snapshots: 3, hidden: 1 });
  });
});

describe('linkedText', () => {
  it('cuts addresses out of text, leaving a sentence’s full stop outside the link', () => {
    expect(linkedText('Accept here: http://127.0.0.1:4000/invitations/abc_D-9. Thanks')).toEqual([
      { kind: 'text', text: 'Accept here: ' },
      { kind: 'link', href: 'http://127.0.0.1:4000/invitations/abc_D-9', text: 'http://127.0.0.1:4000/invitations/abc_D-9' },
      { kind: 'text', text: '. Thanks' },
    ]);
    expect(linkedText('no links')).toEqual([{ kind: 'text', text: 'no links' }]);
    expect(linkedText('javascript:alert(1) ftp://x')).toEqual([{ kind: 'text', text: 'javascript:alert(1) ftp://x' }]);
  });
});

describe('design import helpers', () => {
  it('names the room from the design, else from the file', () => {
    expect(importedRoomName({ name: '  Whip rev C ' }, 'x.matchloom.json')).toBe('Whip rev C');
    expect(importedRoomName({}, 'bench-antenna.matchloom.json')).toBe('bench-antenna');
    expect(importedRoomName(null, '.json')).toBe('Imported design');
  });

  it('says why a file is not JSON, naming the file', () => {
    const read = readDesignText('{"format": ', 'half.matchloom.json');
    expect(read.ok).toBe(false);
    if (!read.ok) expect(read.message).toMatch(/^“half\.matchloom\.json” is not a JSON file \(/);
    expect(readDesignText('{"a":1}', 'ok.json')).toEqual({ ok: true, design: { a: 1 } });
  });
});

describe('upload and hand-off helpers', () => {
  it('refuses a file that is not Touchstone, too large or empty before sending it', () => {
    expect(checkTouchstoneFile({ name: 'ant.S1P', size: 100 })).toBeNull();
    expect(checkTouchstoneFile({ name: 'ant.csv', size: 100 })).toMatch(/is not a Touchstone file/);
    expect(checkTouchstoneFile({ name: 'big.s2p', size: 6 * 1024 * 1024 })).toMatch(/larger than the 5 MiB limit/);
    expect(checkTouchstoneFile({ name: 'empty.s1p', size: 0 })).toMatch(/is empty/);
    expect(uploadRange({ startHz: 2e9, stopHz: 2.9e9 })).toBe('2 GHz – 2.9 GHz');
  });

  it('builds export addresses and reads the attachment name', () => {
    expect(exportHref('r 1', 'handoff.zip')).toBe('/api/rooms/r%201/handoff.zip');
    expect(exportHref('r1', 'bom.csv', 'E12')).toBe('/api/rooms/r1/exports/bom.csv?series=E12');
    expect(attachmentName('attachment; filename="whip-bom.csv"', 'bom.csv')).toBe('whip-bom.csv');
    expect(attachmentName(null, 'bom.csv')).toBe('bom.csv');
  });
});

describe('applyRoomEvent', () => {
  it('puts a new snapshot at the top of the cached list and ignores another room’s', () => {
    const client = new QueryClient();
    client.setQueryData(queryKeys.rooms.snapshots('r1'), [snap('old', 'r1', 1)]);
    applyRoomEvent(client, 'r1', ROOM_EVENTS.snapshotCreated, { roomId: 'r1', snapshot: snap('new', 'r1', 2) });
    applyRoomEvent(client, 'r1', TEAM_EVENTS.snapshotUpdated, { roomId: 'r2', snapshot: snap('foreign', 'r2', 3) });
    expect((client.getQueryData(queryKeys.rooms.snapshots('r1')) as Snapshot[]).map((s) => s.id)).toEqual(['new', 'old']);
  });

  it('replaces an entry in place by id', () => {
    expect(upsertById([{ id: 'a', v: 1 }, { id: 'b', v: 1 }], { id: 'a', v: 2 })).toEqual([{ id: 'a', v: 2 }, { id: 'b', v: 1 }]);
    expect(upsertById(undefined, { id: 'a' })).toBeUndefined();
  });
});
