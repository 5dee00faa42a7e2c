/**
 * The static part of the Smith chart as plain data: circles (in pixels) and labels. Pure; the
 * Konva layer draws it once per size/view/options change and caches it as a bitmap, so redraws
 * while tuning never touch the grid.
 *
 * Every circle is clipped to the rim by the drawing layer (constant-r circles lie inside it anyway;
 * constant-x, constant-b and constant-Q circles are cut to their arcs inside |Γ| ≤ 1).
 */
import { CHART_PALETTE } from './chart-palette';
import {
  constantBCircle,
  constantGCircle,
  constantQCircle,
  constantRCircle,
  constantXCircle,
  gammaToPixel,
  viewFrame,
  zToGamma,
  type ChartView,
  type Circle,
  type Frame,
} from './geometry';

export interface PixelCircle {
  x: number;
  y: number;
  r: number;
  stroke: string;
  width: number;
  dash?: number[];
  /** what it is, for tests and the legend */
  role: 'rim' | 'r' | 'x' | 'g' | 'b' | 'q';
  value: number;
}

export interface GridLabel {
  text: string;
  x: number;
  y: number;
  colour: string;
  /** horizontal anchor of x: 'left' means the text starts at x */
  align: 'left' | 'center' | 'right';
  role: 'r' | 'x' | 'g' | 'b' | 'q';
}

export interface GridModel {
  frame: Frame;
  width: number;
  height: number;
  circles: PixelCircle[];
  /** the real axis, clipped to the rim */
  axis: [number, number, number, number];
  labels: GridLabel[];
}

export interface GridOptions {
  width: number;
  height: number;
  view?: ChartView;
  showAdmittance?: boolean;
  showQ?: readonly number[];
}

const LEVELS: { minZoom: number; major: number[]; minor: number[] }[] = [
  { minZoom: 0, major: [0.2, 0.5, 1, 2, 5], minor: [0.1, 0.3, 0.4, 0.7, 1.5, 3, 10] },
  {
    minZoom: 2.5,
    major: [0.1, 0.2, 0.3, 0.4, 0.5, 0.6, 0.8, 1, 1.5, 2, 3, 5, 10],
    minor: [0.05, 0.15, 0.25, 0.35, 0.45, 0.7, 0.9, 1.2, 1.4, 1.8, 2.5, 4, 7, 20],
  },
  {
    minZoom: 8,
    major: [0.05, 0.1, 0.15, 0.2, 0.25, 0.3, 0.35, 0.4, 0.45, 0.5, 0.6, 0.7, 0.8, 0.9, 1, 1.2, 1.4, 1.6, 1.8, 2, 2.5, 3, 4, 5, 10],
    minor: [0.02, 0.04, 0.06, 0.08, 0.12, 0.14, 0.16, 0.18, 0.22, 0.24, 0.26, 0.28, 0.55, 0.65, 0.75, 0.85, 0.95, 1.1, 1.3, 1.5, 1.7, 1.9, 2.2, 2.4, 2.8, 3.5, 4.5, 7, 20],
  },
];

export function gridLevel(zoom: number): (typeof LEVELS)[number] {
  let level = LEVELS[0];
  for (const l of LEVELS) if (zoom >= l.minZoom) level = l;
  return level;
}

/** "0.5", "2", "0.05": short, no trailing zeros. */
export function gridValueText(v: number): string {
  return String(Number(v.toPrecision(3)));
}

const toPixelCircle = (c: Circle, f: Frame, rest: Omit<PixelCircle, 'x' | 'y' | 'r'>): PixelCircle => {
  const [x, y] = gammaToPixel([c.cx, c.cy], f);
  return { x, y, r: c.radius * f.radius, ...rest };
};

/** True when a circle (pixels) could show inside the canvas and the rim. */
function visible(c: PixelCircle, f: Frame, width: number, height: number): boolean {
  const d = Math.hypot(c.x - f.cx, c.y - f.cy);
  if (d > c.r + f.radius || c.r < 0.5) return false; // no overlap with the rim disc, or too small
  return c.x + c.r >= 0 && c.x - c.r <= width && c.y + c.r >= 0 && c.y - c.r <= height;
}

export function buildGridModel(opts: GridOptions): GridModel {
  const { width, height } = opts;
  const f = viewFrame(width, height, opts.view);
  const zoom = opts.view?.zoom ?? 1;
  const level = gridLevel(zoom);
  const circles: PixelCircle[] = [];
  const labels: GridLabel[] = [];
  const majorW = 1;
  const minorW = 0.7;

  const push = (c: PixelCircle) => {
    if (visible(c, f, width, height)) circles.push(c);
  };

  // impedance grid
  for (const [values, major] of [
    [level.minor, false],
    [level.major, true],
  ] as const) {
    const stroke = major ? CHART_PALETTE.gridMajor : CHART_PALETTE.gridMinor;
    const w = major ? majorW : minorW;
    for (const v of values) {
      push(toPixelCircle(constantRCircle(v), f, { stroke, width: w, role: 'r', value: v }));
      push(toPixelCircle(constantXCircle(v), f, { stroke, width: w, role: 'x', value: v }));
      push(toPixelCircle(constantXCircle(-v), f, { stroke, width: w, role: 'x', value: -v }));
    }
  }
  for (const v of level.major) {
    // r label: just above the axis where the circle meets it on the left
    const [rx, ry] = gammaToPixel([(v - 1) / (v + 1), 0], f);
    labels.push({ text: gridValueText(v), x: rx + 3, y: ry - 12, colour: CHART_PALETTE.gridLabel, align: 'left', role: 'r' });
    // x labels: just outside the rim where the arc meets it
    for (const sign of [1, -1]) {
      const g = zToGamma([0, sign * v], 1);
      const [px, py] = gammaToPixel(g, f);
      const ux = (px - f.cx) / f.radius;
      const uy = (py - f.cy) / f.radius;
      const text = `${sign < 0 ? '−' : '+'}j${gridValueText(v)}`;
      labels.push({ text, x: px + ux * 14, y: py + uy * 11 - 6, colour: CHART_PALETTE.gridLabel, align: 'center', role: 'x' });
    }
  }

  // Zoomed in, the rim and often the axis are out of view: label the major circles where they
  // cross the canvas's top and left edges too (placeLabels drops any that collide).
  if (zoom >= 2.5) {
    for (const v of level.major) {
      const r = toPixelCircle(constantRCircle(v), f, { stroke: '', width: 0, role: 'r', value: v });
      const at = edgeCrossing(r, f, width, height);
      if (at) labels.push({ text: gridValueText(v), x: at[0] + 3, y: at[1], colour: CHART_PALETTE.gridLabel, align: 'left', role: 'r' });
      for (const sign of [1, -1]) {
        const c = toPixelCircle(constantXCircle(sign * v), f, { stroke: '', width: 0, role: 'x', value: sign * v });
        const p = edgeCrossing(c, f, width, height);
        if (p)
          labels.push({ text: `${sign < 0 ? '−' : '+'}j${gridValueText(v)}`, x: p[0] + 3, y: p[1], colour: CHART_PALETTE.gridLabel, align: 'left', role: 'x' });
      }
    }
  }

  if (opts.showAdmittance) {
    for (const [values, major] of [
      [level.minor, false],
      [level.major, true],
    ] as const) {
      const stroke = major ? CHART_PALETTE.admittanceMajor : CHART_PALETTE.admittanceMinor;
      const w = major ? majorW : minorW;
      for (const v of values) {
        push(toPixelCircle(constantGCircle(v), f, { stroke, width: w, dash: [5, 3], role: 'g', value: v }));
        push(toPixelCircle(constantBCircle(v), f, { stroke, width: w, dash: [5, 3], role: 'b', value: v }));
        push(toPixelCircle(constantBCircle(-v), f, { stroke, width: w, dash: [5, 3], role: 'b', value: -v }));
      }
    }
    for (const v of level.major) {
      // g label: below the axis where the circle meets it on the right
      const [gx, gy] = gammaToPixel([(1 - v) / (1 + v), 0], f);
      labels.push({ text: gridValueText(v), x: gx - 3, y: gy + 3, colour: CHART_PALETTE.admittanceLabel, align: 'right', role: 'g' });
      // b labels: just inside the rim (the x labels sit outside it)
      for (const sign of [1, -1]) {
        const gm = zToGamma([0, sign * v], 1);
        const [px, py] = gammaToPixel([-gm[0], -gm[1]], f);
        const ux = (px - f.cx) / f.radius;
        const uy = (py - f.cy) / f.radius;
        labels.push({
          text: `${sign < 0 ? '−' : '+'}j${gridValueText(v)}`,
          x: px - ux * 16,
          y: py - uy * 14 - 6,
          colour: CHART_PALETTE.admittanceLabel,
          align: 'center',
          role: 'b',
        });
      }
    }
  }

  for (const q of opts.showQ ?? []) {
    if (!(q > 0) || !Number.isFinite(q)) continue;
    for (const half of ['upper', 'lower'] as const)
      push(toPixelCircle(constantQCircle(q, half), f, { stroke: CHART_PALETTE.q, width: 1.1, dash: [2, 4], role: 'q', value: q }));
    // label the upper arc at its top (Γ = (0, √(1 + 1/q²) − 1/q))
    const top = Math.sqrt(1 + 1 / (q * q)) - 1 / q;
    const [qx, qy] = gammaToPixel([0, top], f);
    labels.push({ text: `Q ${gridValueText(q)}`, x: qx + 4, y: qy - 13, colour: CHART_PALETTE.inkSoft, align: 'left', role: 'q' });
  }

  circles.unshift({ x: f.cx, y: f.cy, r: f.radius, stroke: CHART_PALETTE.ink, width: 1.5, role: 'rim', value: 0 });
  const [ax0, ay] = gammaToPixel([-1, 0], f);
  const [ax1] = gammaToPixel([1, 0], f);

  return { frame: f, width, height, circles, axis: [ax0, ay, ax1, ay], labels: placeLabels(labels, width, height) };
}

/**
 * Where a grid circle first meets the top edge (just inside it) or the left edge, inside the rim;
 * null if it meets neither within the canvas.
 */
export function edgeCrossing(c: { x: number; y: number; r: number }, f: Frame, width: number, height: number): [number, number] | null {
  const inside = (x: number, y: number) => Math.hypot(x - f.cx, y - f.cy) <= f.radius - 1 && x >= 0 && x <= width - 30 && y >= 0 && y <= height - 14;
  const top = 6;
  const dyTop = top - c.y;
  if (Math.abs(dyTop) <= c.r) {
    const dx = Math.sqrt(c.r * c.r - dyTop * dyTop);
    for (const x of [c.x - dx, c.x + dx]) if (inside(x, top)) return [x, top];
  }
  const left = 4;
  const dxLeft = left - c.x;
  if (Math.abs(dxLeft) <= c.r) {
    const dy = Math.sqrt(c.r * c.r - dxLeft * dxLeft);
    for (const y of [c.y - dy, c.y + dy]) if (inside(left, y - 6)) return [left, y - 6];
  }
  return null;
}

/** Approximate width of a 10 px label (Nunito Sans averages a little over half the size per glyph). */
export function labelWidth(text: string): number {
  return text.length * 5.8 + 2;
}

/** Keep labels inside the canvas and drop any that would overlap one already placed (earlier wins). */
export function placeLabels(labels: GridLabel[], width: number, height: number): GridLabel[] {
  const placed: { x0: number; y0: number; x1: number; y1: number }[] = [];
  const out: GridLabel[] = [];
  for (const l of labels) {
    const w = labelWidth(l.text);
    const x0 = l.align === 'left' ? l.x : l.align === 'right' ? l.x - w : l.x - w / 2;
    const box = { x0, y0: l.y, x1: x0 + w, y1: l.y + 12 };
    if (box.x0 < 0 || box.y0 < 0 || box.x1 > width || box.y1 > height) continue;
    if (placed.some((p) => box.x0 < p.x1 && box.x1 > p.x0 && box.y0 < p.y1 && box.y1 > p.y0)) continue;
    placed.push(box);
    out.push(l);
  }
  return out;
}
