/**
 * The lineage answer as a tree to draw: each room holds its snapshots (oldest first, the order they
 * were taken), and each snapshot the rooms branched from it. A room whose parent snapshot cannot be
 * seen (it belongs to a room you are not in) hangs under that room directly; one whose parent room
 * is gone becomes a root of its own. Pure.
 */
import type { Lineage, LineageRoom } from '../../../../shared/api/lineage';
import type { Snapshot } from '../../../../shared/api/snapshots';

export interface LineageRoomNode {
  room: LineageRoom;
  /** The room the page is about. */
  current: boolean;
  snapshots: LineageSnapshotNode[];
  /** Branches whose snapshot is not visible (a room you are not in). */
  looseBranches: LineageRoomNode[];
  /** Why this room is a root although it has a parent. */
  orphan: 'parent-room-deleted' | null;
}

export interface LineageSnapshotNode {
  snapshot: Snapshot;
  branches: LineageRoomNode[];
}

export function lineageTree(lineage: Lineage): LineageRoomNode[] {
  const nodes = new Map<string, LineageRoomNode>();
  const snapshotNodes = new Map<string, LineageSnapshotNode>();
  for (const room of lineage.rooms) {
    const snapshots = room.member ? [...room.snapshots].sort((a, b) => a.createdAt - b.createdAt) : [];
    const node: LineageRoomNode = {
      room,
      current: room.id === lineage.roomId,
      snapshots: snapshots.map((snapshot) => ({ snapshot, branches: [] })),
      looseBranches: [],
      orphan: null,
    };
    node.snapshots.forEach((s) => snapshotNodes.set(s.snapshot.id, s));
    nodes.set(room.id, node);
  }
  const roots: LineageRoomNode[] = [];
  for (const room of lineage.rooms) {
    const node = nodes.get(room.id)!;
    const parent = room.parent;
    if (!parent) {
      roots.push(node);
      continue;
    }
    const fromSnapshot = snapshotNodes.get(parent.snapshotId);
    const fromRoom = parent.roomId ? nodes.get(parent.roomId) : undefined;
    if (fromSnapshot) fromSnapshot.branches.push(node);
    else if (fromRoom) fromRoom.looseBranches.push(node);
    else {
      node.orphan = 'parent-room-deleted';
      roots.push(node);
    }
  }
  // The root room first, then any orphans.
  return roots.sort((a, b) => Number(b.room.id === lineage.rootRoomId) - Number(a.room.id === lineage.rootRoomId));
}

/** How many rooms and snapshots the tree shows (for its summary line). */
export function lineageCounts(lineage: Lineage): { rooms: number; snapshots: number; hidden: number } {
  let snapshots = 0;
  let hidden = 0;
  for (const room of lineage.rooms) {
    if (room.member) snapshots += room.snapshots.length;
    else hidden += 1;
  }
  return { rooms: lineage.rooms.length, snapshots, hidden };
}
