/**
 * Who is in the room, for the presence list and the avatars: the event socket's member list
 * (names, roles, who follows whom) joined with Yjs awareness (what each one has selected). When
 * the event socket is not connected, awareness alone still lists everyone.
 */
import type { PresenceMember, RoomRole } from '../../../../shared/collab/events';
import { presenceColour } from '../../../../shared/collab/presence';
import type { Peer } from '../collab/presence-state';

export interface PresenceRow {
  userId: string;
  name: string;
  role: RoomRole;
  colour: string;
  isMe: boolean;
  /** ids of the elements this person has selected (one per open screen) */
  selections: string[];
  /** whose view this person follows (a user id), or null */
  following: string | null;
}

export interface PresenceMe {
  id: string;
  name: string;
  role: RoomRole;
  /** this screen's own selection (awareness lists only the others) */
  selection: string | null;
}

export function presenceRows(members: readonly PresenceMember[], peers: readonly Peer[], me: PresenceMe | null): PresenceRow[] {
  const selections = new Map<string, string[]>();
  const add = (userId: string, id: string) => {
    const list = selections.get(userId) ?? [];
    if (!list.includes(id)) selections.set(userId, [...list, id]);
  };
  if (me?.selection) add(me.id, me.selection);
  for (const p of peers) if (p.selection) add(p.user.id, p.selection);
  const rows = new Map<string, PresenceRow>();
  for (const m of members)
    rows.set(m.userId, {
      userId: m.userId,
      name: m.displayName,
      role: m.role,
      colour: m.colour,
      isMe: m.userId === me?.id,
      selections: selections.get(m.userId) ?? [],
      following: m.following,
    });
  for (const p of peers) {
    if (rows.has(p.user.id)) continue;
    rows.set(p.user.id, {
      userId: p.user.id,
      name: p.user.name,
      role: p.user.role,
      colour: p.user.color,
      isMe: p.user.id === me?.id,
      selections: selections.get(p.user.id) ?? [],
      following: p.following,
    });
  }
  if (me && !rows.has(me.id))
    rows.set(me.id, {
      userId: me.id,
      name: me.name,
      role: me.role,
      colour: presenceColour(me.id),
      isMe: true,
      selections: selections.get(me.id) ?? [],
      following: null,
    });
  const rank: Record<RoomRole, number> = { owner: 0, tuner: 1, observer: 2 };
  return [...rows.values()].sort((a, b) => Number(b.isMe) - Number(a.isMe) || rank[a.role] - rank[b.role] || a.name.localeCompare(b.name));
}
