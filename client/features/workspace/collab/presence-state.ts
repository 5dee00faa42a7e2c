/**
 * What each person in the room shares through Yjs awareness: who they are (name, role, colour),
 * the element they have selected, their pointer over the chart or the chain canvas, and their
 * chart view (so an observer can follow them). Remote states are checked before use.
 */
import { z } from 'zod';

export const presenceRoleSchema = z.enum(['owner', 'tuner', 'observer']);

export const presenceUserSchema = z.object({
  id: z.string().min(1).max(200),
  name: z.string().max(200),
  role: presenceRoleSchema,
  color: z.string().regex(/^#[0-9a-fA-F]{6}$/),
});

const finitePair = z.tuple([z.number().finite(), z.number().finite()]);

export const presenceCursorSchema = z.union([
  z.object({ area: z.literal('chart'), gamma: finitePair }),
  z.object({ area: z.literal('canvas'), x: z.number().finite(), y: z.number().finite() }),
]);

export const chartViewSchema = z.object({ zoom: z.number().finite().positive(), cx: z.number().finite(), cy: z.number().finite() });

export const presenceStateSchema = z.object({
  user: presenceUserSchema,
  selection: z.string().max(200).nullable().optional(),
  cursor: presenceCursorSchema.nullable().optional(),
  view: chartViewSchema.nullable().optional(),
  following: z.string().max(200).nullable().optional(),
});

export type PresenceUser = z.infer<typeof presenceUserSchema>;
export type PresenceCursor = z.infer<typeof presenceCursorSchema>;
export type ChartViewState = z.infer<typeof chartViewSchema>;
export type PresenceState = z.infer<typeof presenceStateSchema>;

export interface Peer {
  clientId: number;
  user: PresenceUser;
  selection: string | null;
  cursor: PresenceCursor | null;
  view: ChartViewState | null;
  following: string | null;
}

/** Initials for an avatar: "Tina Tuner" -> "TT", "observer@demo.test" -> "OB". */
export function initials(name: string): string {
  const words = name
    .replace(/@.*$/, '')
    .split(/[\s._-]+/)
    .filter(Boolean);
  if (words.length >= 2) return (words[0][0] + words[1][0]).toUpperCase();
  return (words[0] ?? '?').slice(0, 2).toUpperCase();
}

/** Remote awareness states as peers: our own entry and malformed states left out. */
export function peersFrom(states: Map<number, unknown>, ownClientId: number): Peer[] {
  const peers: Peer[] = [];
  states.forEach((raw, clientId) => {
    if (clientId === ownClientId) return;
    const parsed = presenceStateSchema.safeParse(raw);
    if (!parsed.success) return;
    const s = parsed.data;
    peers.push({
      clientId,
      user: s.user,
      selection: s.selection ?? null,
      cursor: s.cursor ?? null,
      view: s.view ?? null,
      following: s.following ?? null,
    });
  });
  return peers.sort((a, b) => a.user.name.localeCompare(b.user.name) || a.clientId - b.clientId);
}
