/**
 * Keeps the team features' cached answers (notes, snapshots, uploads, lineage, the room's design)
 * current from the room's live events: a note or snapshot that arrives is put straight into the
 * cache; anything else makes the affected queries fetch again. After every (re)join the lists are
 * fetched again, so nothing sent while the socket was away is missed.
 *
 * Returns the stream's status: while it is not `live`, callers poll instead (`livePollInterval`).
 */
import { useQueryClient, type QueryClient } from '@tanstack/react-query';
import { useContext, useEffect, useState } from 'react';
import { ROOM_EVENTS } from '../../shared/collab/events';
import {
  noteDeletedPayloadSchema,
  noteEventPayloadSchema,
  snapshotUpdatedPayloadSchema,
  TEAM_EVENTS,
  uploadCreatedPayloadSchema,
} from '../../shared/collab/team-events';
import type { Note } from '../../shared/api/notes';
import type { Snapshot } from '../../shared/api/snapshots';
import type { Upload } from '../../shared/api/uploads';
import { queryKeys } from './query-keys';
import { roomEventStreams, RoomEventStreamsContext, STREAM_JOINED, type RoomStreamStatus } from './room-event-stream';

/** Puts `item` in a cached list by id: replaced where it is, else added (at the front when `newestFirst`). */
export function upsertById<T extends { id: string }>(list: readonly T[] | undefined, item: T, newestFirst = false): T[] | undefined {
  if (!list) return list;
  const at = list.findIndex((x) => x.id === item.id);
  if (at >= 0) return list.map((x, i) => (i === at ? item : x));
  return newestFirst ? [item, ...list] : [...list, item];
}

/** Applies one room event to the cache; exported for tests. */
export function applyRoomEvent(queryClient: QueryClient, roomId: string, event: string, payload: unknown): void {
  const refetch = (queryKey: readonly unknown[]) => void queryClient.invalidateQueries({ queryKey });
  switch (event) {
    case STREAM_JOINED:
      refetch(queryKeys.rooms.notes(roomId));
      refetch(queryKeys.rooms.snapshots(roomId));
      refetch(queryKeys.rooms.uploads(roomId));
      return;
    case TEAM_EVENTS.noteCreated:
    case TEAM_EVENTS.noteUpdated: {
      const parsed = noteEventPayloadSchema.safeParse(payload);
      if (!parsed.success || parsed.data.roomId !== roomId) return refetch(queryKeys.rooms.notes(roomId));
      queryClient.setQueryData<Note[]>(queryKeys.rooms.notes(roomId), (list) => upsertById(list, parsed.data.note));
      return;
    }
    case TEAM_EVENTS.noteDeleted: {
      const parsed = noteDeletedPayloadSchema.safeParse(payload);
      if (!parsed.success || parsed.data.roomId !== roomId) return refetch(queryKeys.rooms.notes(roomId));
      const gone = new Set(parsed.data.deletedIds);
      queryClient.setQueryData<Note[]>(queryKeys.rooms.notes(roomId), (list) => list?.filter((n) => !gone.has(n.id)));
      return;
    }
    case ROOM_EVENTS.snapshotCreated:
    case TEAM_EVENTS.snapshotUpdated: {
      const parsed = snapshotUpdatedPayloadSchema.safeParse(payload);
      if (!parsed.success || parsed.data.roomId !== roomId) return refetch(queryKeys.rooms.snapshots(roomId));
      queryClient.setQueryData<Snapshot[]>(queryKeys.rooms.snapshots(roomId), (list) => upsertById(list, parsed.data.snapshot, true));
      refetch(queryKeys.rooms.lineage(roomId));
      return;
    }
    case TEAM_EVENTS.snapshotRestored:
      refetch(queryKeys.rooms.design(roomId));
      refetch(queryKeys.rooms.snapshots(roomId));
      refetch(['rooms', 'detail', roomId, 'compare']);
      return;
    case TEAM_EVENTS.uploadCreated: {
      const parsed = uploadCreatedPayloadSchema.safeParse(payload);
      if (!parsed.success || parsed.data.roomId !== roomId) return refetch(queryKeys.rooms.uploads(roomId));
      queryClient.setQueryData<Upload[]>(queryKeys.rooms.uploads(roomId), (list) => upsertById(list, parsed.data.upload, true));
      return;
    }
    case TEAM_EVENTS.branchCreated:
      refetch(queryKeys.rooms.lineage(roomId));
      refetch(queryKeys.rooms.list());
      return;
    case ROOM_EVENTS.log:
      // Someone edited the room: the design (and a comparison with it) is out of date.
      refetch(queryKeys.rooms.design(roomId));
      refetch(['rooms', 'detail', roomId, 'compare']);
      return;
    default:
      return;
  }
}

/** Subscribes while mounted (and while `enabled`); returns the stream's status. */
export function useRoomLiveData(roomId: string, { enabled = true }: { enabled?: boolean } = {}): RoomStreamStatus {
  const queryClient = useQueryClient();
  const streams = useContext(RoomEventStreamsContext);
  const [status, setStatus] = useState<RoomStreamStatus>('connecting');
  useEffect(() => {
    if (!enabled || !roomId) return;
    return (streams ?? roomEventStreams()).subscribe(roomId, (event, payload) => applyRoomEvent(queryClient, roomId, event, payload), setStatus);
  }, [enabled, roomId, queryClient, streams]);
  return status;
}

/** How often a list polls while the live stream is away (never while it is live). */
export const livePollInterval = (status: RoomStreamStatus): number | false => (status === 'live' ? false : 15_000);
