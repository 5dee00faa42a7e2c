import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { analyze } from '../../shared/rf/analyze';
import { goalMaxGamma } from '../../shared/rf/design';
import { engineCore } from '../../client/features/workspace/analysis/engine-core';
import { elementKindColour } from '../../client/features/workspace/chart/chart-palette';
import { constantRCircle, constantXCircle, gammaToPixel, viewFrame, zToGamma } from '../../client/features/workspace/chart/geometry';
import { buildGridModel, labelWidth, placeLabels } from '../../client/features/workspace/chart/grid-model';
import { chartReadout, chartSummary, formatComplex } from '../../client/features/workspace/chart/readout';
import { buildTraceModel, gammaAtHz, nearestTracePoint, pathElementAt, traceGammas } from '../../client/features/workspace/chart/trace-model';
import { chipAntennaDesign } from './analysis-fixtures';

const W = 480;
const H = 440;

describe('buildGridModel', () => {
  const grid = buildGridModel({ width: W, height: H });
  const f = viewFrame(W, H);

  it('draws the rim first, centred on Γ = 0', () => {
    expect(grid.circles[0]).toMatchObject({ role: 'rim', x: f.cx, y: f.cy, r: f.radius });
  });

  it('places each constant-r circle at centre r/(1+r), radius 1/(1+r) in pixels (Pozar §2.4; from memory)', () => {
    for (const r of [0.2, 0.5, 1, 2, 5]) {
      const c = grid.circles.find((k) => k.role === 'r' && k.value === r)!;
      const want = constantRCircle(r);
      const [x, y] = gammaToPixel([want.cx, want.cy], f);
      expect(c.x).toBeCloseTo(x, 9);
      expect(c.y).toBeCloseTo(y, 9);
      expect(c.r).toBeCloseTo(want.radius * f.radius, 9);
    }
  });

  it('draws constant-x arcs above and below the axis (centre (1, ±1/x), Pozar §2.4; from memory)', () => {
    for (const x of [0.5, 1, 2]) {
      const up = grid.circles.find((k) => k.role === 'x' && k.value === x)!;
      const down = grid.circles.find((k) => k.role === 'x' && k.value === -x)!;
      expect(up.y).toBeLessThan(f.cy); // +x above the axis
      expect(down.y).toBeGreaterThan(f.cy);
      expect(up.r).toBeCloseTo(constantXCircle(x).radius * f.radius, 9);
    }
  });

  it('labels the major circles and arcs, with no two labels overlapping and all inside the canvas', () => {
    const texts = grid.labels.map((l) => l.text);
    for (const t of ['0.2', '0.5', '1', '2', '5', '+j1', '−j1', '+j0.5', '−j2']) expect(texts).toContain(t);
    const boxes = grid.labels.map((l) => {
      const w = labelWidth(l.text);
      const x0 = l.align === 'left' ? l.x : l.align === 'right' ? l.x - w : l.x - w / 2;
      return { x0, x1: x0 + w, y0: l.y, y1: l.y + 12 };
    });
    for (const b of boxes) {
      expect(b.x0).toBeGreaterThanOrEqual(0);
      expect(b.x1).toBeLessThanOrEqual(W);
      expect(b.y0).toBeGreaterThanOrEqual(0);
      expect(b.y1).toBeLessThanOrEqual(H);
    }
    for (let i = 0; i < boxes.length; i++)
      for (let j = i + 1; j < boxes.length; j++) {
        const a = boxes[i];
        const b = boxes[j];
        expect(a.x0 < b.x1 && a.x1 > b.x0 && a.y0 < b.y1 && a.y1 > b.y0).toBe(false);
      }
  });

  it('adds the admittance grid (violet, mirrored) only when asked', () => {
    expect(grid.circles.some((c) => c.role === 'g' || c.role === 'b')).toBe(false);
    const withY = buildGridModel({ width: W, height: H, showAdmittance: true });
    const g1 = withY.circles.find((c) => c.role === 'g' && c.value === 1)!;
    expect(g1.x).toBeCloseTo(f.cx - 0.5 * f.radius, 9); // centre (−g/(1+g), 0)
    expect(withY.labels.some((l) => l.role === 'g')).toBe(true);
  });

  it('draws constant-Q arcs for the requested Q values', () => {
    const q = buildGridModel({ width: W, height: H, showQ: [2] });
    const arcs = q.circles.filter((c) => c.role === 'q');
    expect(arcs).toHaveLength(2);
    expect(arcs[0].y).toBeCloseTo(f.cy + 0.5 * f.radius, 9); // upper arc's centre (0, −1/Q)
    expect(q.labels.find((l) => l.role === 'q')?.text).toBe('Q 2');
  });

  it('shows a finer grid when zoomed in, and drops circles that fall outside the view', () => {
    const zoomed = buildGridModel({ width: W, height: H, view: { zoom: 4, cx: 0, cy: 0 } });
    const rz = zoomed.circles.filter((c) => c.role === 'r').map((c) => c.value);
    expect(rz).toContain(0.3);
    expect(rz).toContain(0.6);
    // zoomed far into the short-circuit end: the small large-r circles near the open end are out of view
    const edge = buildGridModel({ width: W, height: H, view: { zoom: 20, cx: -0.9, cy: 0 } });
    expect(edge.circles.some((c) => c.role === 'r' && c.value === 10)).toBe(false);
    expect(edge.circles.some((c) => c.role === 'r' && c.value === 0.05)).toBe(true);
  });

  it('placeLabels keeps the first of two overlapping labels', () => {
    const out = placeLabels(
      [
        { text: 'first', x: 10, y: 10, colour: 'x', align: 'left', role: 'r' },
        { text: 'second', x: 14, y: 12, colour: 'x', align: 'left', role: 'r' },
        { text: 'third', x: 200, y: 10, colour: 'x', align: 'left', role: 'r' },
      ],
      400,
      400,
    );
    expect(out.map((l) => l.text)).toEqual(['first', 'third']);
  });
});

describe('buildTraceModel', () => {
  const design = chipAntennaDesign();
  const { result, path } = engineCore.analyze(design);
  const f = viewFrame(W, H);
  const model = buildTraceModel({ width: W, height: H, design, result, path, selectedElementId: 'l1' });

  it('draws the impedance path element by element, tinted by kind (teal series, coral shunt)', () => {
    expect(model.path.map((s) => s.elementId)).toEqual(['c1', 'l1']);
    expect(model.path[0].colour).toBe(elementKindColour('shunt-c'));
    expect(model.path[1].colour).toBe(elementKindColour('series-l'));
    expect(elementKindColour('shunt-c')).toMatch(/^#(a9412b|e06a4f)$/i);
    expect(elementKindColour('series-l')).toBe('#1d8a84');
    expect(elementKindColour('line')).toBe('#5b6b80');
    expect(model.path.map((s) => s.selected)).toEqual([false, true]);
  });

  it('starts the path at the load and marks every stage, the last as the port', () => {
    const loadPx = gammaToPixel(zToGamma(result.stagesAtCenter[0].z, 50), f);
    // the series L follows its constant-r circle: every point of its run has the same r (common practice)
    const seg = path.segments[1].gamma;
    const rOf = (u: number, v: number) => (1 - u * u - v * v) / ((1 - u) ** 2 + v * v);
    for (let k = 0; k < seg.length; k += 2) expect(rOf(seg[k], seg[k + 1])).toBeCloseTo(rOf(seg[0], seg[1]), 6);
    expect(model.path[1].points.length).toBe(seg.length);
    expect(model.path[0].points[0]).toBeCloseTo(loadPx[0], 9);
    expect(model.path[0].points[1]).toBeCloseTo(loadPx[1], 9);
    expect(model.stages.map((s) => [s.after, s.role])).toEqual([
      ['load', 'load'],
      ['c1', 'stage'],
      ['l1', 'port'],
    ]);
    const endPx = gammaToPixel(zToGamma(result.stagesAtCenter[2].z, 50), f);
    expect(model.stages[2].x).toBeCloseTo(endPx[0], 6);
  });

  it('splits the band trace at the band edges and marks the edges and the centre', () => {
    expect(model.bandMarks.map((b) => b.role)).toEqual(['start', 'stop', 'centre']);
    expect(model.bandMarks.map((b) => b.hz)).toEqual([2.4e9, 2.4835e9, 2.44e9]);
    const t = model.trace!;
    expect(t.outside).toHaveLength(2);
    // thick part begins at the interpolated band start and the thin parts meet it
    expect(t.inBand[0]).toBeCloseTo(model.bandMarks[0].x, 9);
    const low = t.outside[0];
    expect(low[low.length - 2]).toBeCloseTo(model.bandMarks[0].x, 9);
    // every sweep point is drawn once, plus the two interpolated edge points in each joined piece
    const inBandPoints = Array.from(result.frequenciesHz).filter((hz) => hz >= 2.4e9 && hz <= 2.4835e9).length;
    expect(t.inBand.length / 2).toBe(inBandPoints + 2);
  });

  it('draws the goal circle at |Γ| = (VSWR − 1)/(VSWR + 1) (common practice)', () => {
    expect(model.goal!.gamma).toBeCloseTo(1 / 3, 12);
    expect(model.goal!.r).toBeCloseTo((f.radius * 1) / 3, 9);
    expect(goalMaxGamma(design.goal)).toBeCloseTo(1 / 3, 12);
  });

  it('finds the sweep point under the pointer and the path element under a click', () => {
    const i = 37;
    const px = model.hit!.pixels[2 * i];
    const py = model.hit!.pixels[2 * i + 1];
    expect(nearestTracePoint(model, px, py)?.hz).toBe(result.frequenciesHz[i]);
    const near = nearestTracePoint(model, px + 3, py - 2)!;
    const j = near.index;
    expect(Math.hypot(model.hit!.pixels[2 * j] - px - 3, model.hit!.pixels[2 * j + 1] - py + 2)).toBeLessThanOrEqual(Math.hypot(3, 2));
    expect(nearestTracePoint(model, -500, -500)).toBeNull();
    const s = model.path[1].points;
    const mid = 2 * Math.floor(s.length / 4);
    expect(pathElementAt(model, s[mid] + 2, s[mid + 1] - 2)).toBe('l1');
    expect(pathElementAt(model, 2, 2)).toBeNull();
  });

  it('places other people’s cursors and skips a cursor with a non-finite Γ', () => {
    const m = buildTraceModel({
      width: W,
      height: H,
      design,
      result,
      path,
      cursors: [
        { userId: 'u1', name: 'Tuner', color: '#1d8a84', gamma: [0.5, -0.25] },
        { userId: 'u2', name: 'Ghost', color: '#000', gamma: [Number.NaN, 0] },
      ],
    });
    expect(m.cursors).toHaveLength(1);
    expect(m.cursors[0].x).toBeCloseTo(f.cx + 0.5 * f.radius, 9);
    expect(m.cursors[0].y).toBeCloseTo(f.cy + 0.25 * f.radius, 9);
  });

  it('marks each other person’s selected element on its own stage of the path, in their colour', () => {
    const m = buildTraceModel({
      width: W,
      height: H,
      design,
      result,
      path,
      peerSelections: [
        { userId: 'u1', name: 'Tuner', color: '#1d8a84', elementId: 'l1' },
        { userId: 'u2', name: 'Watcher', color: '#7a4fc2', elementId: 'c1' },
        { userId: 'u3', name: 'Stale', color: '#000000', elementId: 'gone' },
      ],
    });
    expect(m.peerSelections.map((p) => [p.userId, p.elementId, p.colour])).toEqual([
      ['u1', 'l1', '#1d8a84'],
      ['u2', 'c1', '#7a4fc2'],
    ]);
    // the very pixels of that element's segment, not another stage's
    expect(m.peerSelections[0].points).toEqual(m.path.find((s) => s.elementId === 'l1')!.points);
    expect(m.peerSelections[1].points).toEqual(m.path.find((s) => s.elementId === 'c1')!.points);
    expect(buildTraceModel({ width: W, height: H, design, result, path }).peerSelections).toEqual([]);
  });

  it('draws compare and preview overlays and the yield envelope as a closed band', () => {
    const other = engineCore.analyze(chipAntennaDesign({ elements: [] }));
    const n = result.frequenciesHz.length;
    const mag = result.gammaMagnitude;
    const envelope = { minGamma: mag.map((g) => Math.max(0, g - 0.05)), maxGamma: mag.map((g) => Math.min(1, g + 0.05)) };
    const m = buildTraceModel({ width: W, height: H, design, result, path, envelope, compare: { ...other, label: 'before' }, preview: other });
    expect(m.compare?.label).toBe('before');
    expect(m.compare?.path).toHaveLength(0); // the bare load has no elements
    expect(m.preview?.trace?.inBand.length).toBeGreaterThan(4);
    expect(m.envelope).toHaveLength(4 * n);
  });

  it('handles no design and no result', () => {
    const empty = buildTraceModel({ width: W, height: H, design: null, result: null, path: null });
    expect(empty.trace).toBeNull();
    expect(empty.goal).toBeNull();
    expect(empty.path).toEqual([]);
  });

  it('traceGammas agrees with the engine’s Γ when the port is the reference (CONTRACT §1)', () => {
    const g = traceGammas(result, 50);
    for (let i = 0; i < g.length; i++) expect(g[i]).toBeCloseTo(result.gamma[i], 12);
    const a = analyze(design);
    expect(gammaAtHz(a.frequenciesHz, a.gamma, a.frequenciesHz[10])).toEqual([a.gamma[20], a.gamma[21]]);
    expect(gammaAtHz(a.frequenciesHz, a.gamma, 1e9)).toBeNull();
  });
});

describe('chart read-out', () => {
  it('reads the centre as a match: z = z0, Γ = 0, VSWR 1 (common practice)', () => {
    const r = chartReadout([0, 0], 50, 2.44e9);
    expect(r).toEqual({
      frequency: '2.44 GHz',
      z: '50.00 + j0.00 Ω',
      y: '20.00 + j0.00 mS',
      gamma: '0.000 ∠ 0.0°',
      vswr: '1.00',
      returnLoss: '> 120 dB',
    });
  });

  it('reads z = 1 + j1 as Γ 0.447∠63.4°, VSWR 2.62, RL 7.0 dB (from memory: |Γ| = √0.2)', () => {
    const r = chartReadout(zToGamma([50, 50], 50), 50, null);
    expect(r.frequency).toBeNull();
    expect(r.z).toBe('50.00 + j50.00 Ω');
    expect(r.y).toBe('10.00 − j10.00 mS');
    expect(r.gamma).toBe('0.447 ∠ 63.4°');
    expect(chartReadout(zToGamma([50, -50], 50), 50, null).gamma).toBe('0.447 ∠ −63.4°');
    expect(r.vswr).toBe('2.62');
    expect(r.returnLoss).toBe('7.0 dB');
  });

  it('names an open and a short instead of printing NaN or Infinity', () => {
    expect(chartReadout([1, 0], 50, null)).toMatchObject({ z: 'open', vswr: '∞', returnLoss: '0 dB' });
    expect(chartReadout([-1, 0], 50, null)).toMatchObject({ z: 'short', y: 'short', vswr: '∞' });
  });

  it('never shows NaN for any point on or inside the rim (property)', () => {
    fc.assert(
      fc.property(fc.double({ min: 0, max: 1, noNaN: true }), fc.double({ min: -Math.PI, max: Math.PI, noNaN: true }), (m, a) => {
        const r = chartReadout([m * Math.cos(a), m * Math.sin(a)], 50, 1e9);
        for (const v of Object.values(r)) expect(String(v)).not.toMatch(/NaN|Infinity|undefined/);
      }),
    );
  });

  it('formatComplex shares one prefix between the parts', () => {
    expect(formatComplex(1200, -330, 'Ω')).toBe('1.200 − j0.330 kΩ');
    expect(formatComplex(0.004, 0.0125, 'S')).toBe('4.00 + j12.50 mS');
  });

  it('summarises the match for assistive technology', () => {
    const design = chipAntennaDesign();
    const { result } = engineCore.analyze(design);
    const s = chartSummary(design, result);
    expect(s).toMatch(/^Smith chart of the load and 2 matching elements\. Worst in band: VSWR \d+\.\d\d, (meets|misses) the goal of VSWR ≤ 2\./);
    expect(chartSummary(null, null)).toBe('Smith chart: no design loaded.');
  });
});
