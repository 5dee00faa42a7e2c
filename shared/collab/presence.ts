/**
 * Presence colours: each user gets a stable colour from Matchloom's own palette, the same in every room
 * and on every screen (presence list, cursors in the chain, follow badge). Chosen to stay distinct from
 * one another on the light workspace background.
 */
export const PRESENCE_PALETTE = [
  '#c2410c', // rust
  '#0f766e', // deep teal
  '#7c3aed', // violet
  '#b45309', // ochre
  '#1d4ed8', // cobalt
  '#be185d', // raspberry
  '#4d7c0f', // moss
  '#0e7490', // lagoon
  '#9f1239', // garnet
  '#6d28d9', // iris
  '#a16207', // mustard
  '#334155', // slate
] as const;

/** FNV-1a over the UTF-16 code units: a small, stable string hash (common practice). */
function stringHash(s: string): number {
  let h = 0x811c9dc5;
  for (let i = 0; i < s.length; i++) {
    h ^= s.charCodeAt(i);
    h = Math.imul(h, 0x01000193);
  }
  return h >>> 0;
}

/** The user's presence colour (a `#rrggbb` string from `PRESENCE_PALETTE`). */
export function presenceColour(userId: string): string {
  return PRESENCE_PALETTE[stringHash(userId) % PRESENCE_PALETTE.length];
}
