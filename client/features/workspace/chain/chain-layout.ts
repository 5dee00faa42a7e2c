/**
 * Where things sit on the chain canvas. The schematic reads like the chart walk in reverse: the
 * port on the left, the load on the right, and the chain's first element (next to the load) at
 * the right end of the row.
 */

export const CELL_WIDTH = 120;
export const PORT_WIDTH = 96;
export const LOAD_WIDTH = 112;
export const RAIL_Y = 64;
export const GROUND_Y = 150;
export const CANVAS_HEIGHT = 176;
/** room left between port and load while the chain is empty, for the "no network" note */
export const EMPTY_GAP = 180;

export interface ChainLayout {
  width: number;
  height: number;
  /** left edge of the cell of chain element `index` (0 = next to the load) */
  cellX(index: number): number;
  portX: number;
  loadX: number;
}

export function chainLayout(count: number): ChainLayout {
  const n = Math.max(0, count);
  const loadX = PORT_WIDTH + (n === 0 ? EMPTY_GAP : n * CELL_WIDTH);
  return {
    width: loadX + LOAD_WIDTH,
    height: CANVAS_HEIGHT,
    cellX: (index: number) => PORT_WIDTH + (n - 1 - index) * CELL_WIDTH,
    portX: 0,
    loadX,
  };
}

/**
 * The chain index (load -> port, counted without the dragged element itself, as moveElement takes
 * it) for a dragged element whose cell now starts at `x`.
 */
export function dropIndex(x: number, count: number): number {
  if (count <= 1) return 0;
  const slot = Math.round((x - PORT_WIDTH) / CELL_WIDTH);
  const clamped = Math.max(0, Math.min(count - 1, slot));
  return count - 1 - clamped;
}

/** The element index under canvas point `x`, or -1 over the port, the load or past them. */
export function indexAtX(x: number, count: number): number {
  const slot = Math.floor((x - PORT_WIDTH) / CELL_WIDTH);
  if (slot < 0 || slot >= count) return -1;
  return count - 1 - slot;
}
