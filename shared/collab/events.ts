/**
 * Room events over socket.io (path `/socket.io`, same origin as the API): event names in one constants
 * object and every payload as a zod schema. The server parses each client payload with these schemas;
 * the client may parse the server's with them too.
 *
 * Client -> server (each takes an acknowledgement callback as its last argument):
 *   join   {roomId}                 -> JoinReply: your role, the presence list and recent room log
 *   leave  {roomId}                 -> Reply
 *   view   {roomId, view}           -> Reply   (your current view; relayed to those following you)
 *   follow {roomId, userId | null}  -> FollowReply (start following a member's view, or stop)
 * Server -> client:
 *   presence, room-log, role-changed, snapshot-created, view, room-deleted
 */
import { z } from 'zod';

export const ROOM_EVENTS = {
  join: 'room:join',
  leave: 'room:leave',
  follow: 'follow',
  /** Both directions: a client sends its own view; followers receive `{roomId, userId, view}`. */
  view: 'view',
  presence: 'presence',
  log: 'room-log',
  roleChanged: 'role-changed',
  snapshotCreated: 'snapshot-created',
  roomDeleted: 'room-deleted',
} as const;
export type RoomEventName = (typeof ROOM_EVENTS)[keyof typeof ROOM_EVENTS];

export const ROOM_ROLES = ['owner', 'tuner', 'observer'] as const;
export const roomRoleSchema = z.enum(ROOM_ROLES);
export type RoomRole = z.infer<typeof roomRoleSchema>;

const id = z.string().min(1).max(100);
const finite = z.number().refine(Number.isFinite, 'must be a finite number');

// ---- client -> server ----

export const joinPayloadSchema = z.object({ roomId: id });
export const leavePayloadSchema = z.object({ roomId: id });
export const followPayloadSchema = z.object({ roomId: id, userId: id.nullable() });

/** One chart's visible window: zoom and pan (a Smith chart) and/or axis ranges (a band trace). */
export const chartViewSchema = z.object({
  zoom: finite.refine((v) => v > 0 && v <= 1e6, 'must be between 0 and 1e6').optional(),
  panX: finite.optional(),
  panY: finite.optional(),
  xRange: z.tuple([finite, finite]).optional(),
  yRange: z.tuple([finite, finite]).optional(),
});
export type ChartView = z.infer<typeof chartViewSchema>;

/** What a member is looking at: the selected element, each chart's window, the open panel. */
export const viewStateSchema = z.object({
  selectedElementId: id.nullable().optional(),
  charts: z
    .record(z.string().min(1).max(40), chartViewSchema)
    .refine((r) => Object.keys(r).length <= 8, 'at most 8 charts')
    .optional(),
  panel: z.string().max(40).optional(),
});
export type ViewState = z.infer<typeof viewStateSchema>;

export const viewPayloadSchema = z.object({ roomId: id, view: viewStateSchema });

// ---- server -> client ----

export const presenceMemberSchema = z.object({
  userId: z.string(),
  displayName: z.string(),
  role: roomRoleSchema,
  /** `#rrggbb`, stable per user (shared/collab/presence.ts). */
  colour: z.string(),
  /** The member whose view this member follows, or null. */
  following: z.string().nullable(),
});
export type PresenceMember = z.infer<typeof presenceMemberSchema>;

export const presencePayloadSchema = z.object({ roomId: z.string(), members: z.array(presenceMemberSchema) });
export type PresencePayload = z.infer<typeof presencePayloadSchema>;

/**
 * One room log entry. Rapid edits of one field by one person are merged into a single entry: the
 * server sends the same `id` again with the new wording and time; replace the entry with that id.
 */
export const roomLogEntrySchema = z.object({
  id: z.number().int(),
  roomId: z.string(),
  userId: z.string().nullable(),
  displayName: z.string(),
  message: z.string(),
  /** Unix milliseconds of the latest edit the entry covers. */
  at: z.number(),
});
export type RoomLogEntry = z.infer<typeof roomLogEntrySchema>;

export const roleChangedPayloadSchema = z.object({ roomId: z.string(), userId: z.string(), role: roomRoleSchema.nullable() });
export type RoleChangedPayload = z.infer<typeof roleChangedPayloadSchema>;

export const viewRelayPayloadSchema = z.object({ roomId: z.string(), userId: z.string(), view: viewStateSchema });
export type ViewRelayPayload = z.infer<typeof viewRelayPayloadSchema>;

export const roomDeletedPayloadSchema = z.object({ roomId: z.string() });

// ---- acknowledgements ----

export interface ReplyError {
  code: 'bad-request' | 'not-a-member' | 'not-joined' | 'not-present' | 'server-error';
  message: string;
}
export type Reply = { ok: true } | { ok: false; error: ReplyError };
export type JoinReply =
  | { ok: true; roomId: string; userId: string; role: RoomRole; presence: PresenceMember[]; log: RoomLogEntry[] }
  | { ok: false; error: ReplyError };
/** `view` is the followed member's latest view, when they have sent one. */
export type FollowReply = { ok: true; view: ViewState | null } | { ok: false; error: ReplyError };
