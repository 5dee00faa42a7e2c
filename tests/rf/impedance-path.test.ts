import { describe, expect, it } from 'vitest';
import { analyze } from '../../shared/rf/analyze';
import { reflectionFromImpedance } from '../../shared/rf/complex';
import { type Complex, type Element } from '../../shared/rf/design';
import { impedancePath } from '../../shared/rf/impedance-path';
import { designOf } from './helpers';

const F0 = 2.44e9;
const zOf = (g: Complex): Complex => {
  // z = (1 + Γ)/(1 − Γ), normalised to 50 Ω
  const dr = 1 - g[0], di = -g[1], d = dr * dr + di * di;
  return [((1 + g[0]) * dr + g[1] * di) / d, (g[1] * dr - (1 + g[0]) * di) / d];
};
const points = (a: Float64Array): Complex[] => Array.from({ length: a.length / 2 }, (_, k) => [a[2 * k], a[2 * k + 1]]);

const chain: Element[] = [
  { id: 'sl', kind: 'series-l', value: 3e-9 },
  { id: 'sc', kind: 'shunt-c', value: 1.2e-12 },
  { id: 'ln', kind: 'line', z0: 50, length: { degrees: 70, atHz: F0 } },
  { id: 'cs', kind: 'series-c', value: 2e-12 },
  { id: 'st', kind: 'short-stub', z0: 50, length: { degrees: 40, atHz: F0 } },
  { id: 'ls', kind: 'shunt-l', value: 8e-9, q: 30 },
  { id: 'tr', kind: 'transformer', ratio: 1.4 },
  { id: 'lossy', kind: 'line', z0: 75, length: { degrees: 120, atHz: F0 }, lossDbPerM: 40 },
];
const design = designOf({ load: { kind: 'impedance', ohms: [20, -35] }, elements: chain });

describe('impedancePath (the chart’s impedance path)', () => {
  const path = impedancePath(design);
  const stages = analyze(design).stagesAtCenter;

  it('starts at the load and each segment ends at that element’s stage (continuous path)', () => {
    const g0 = reflectionFromImpedance([20, -35], [50, 0]);
    expect(path.load[0]).toBeCloseTo(g0[0], 14);
    let prev = path.load;
    path.segments.forEach((seg, k) => {
      const pts = points(seg.gamma);
      expect(pts[0][0]).toBeCloseTo(prev[0], 12);
      expect(pts[0][1]).toBeCloseTo(prev[1], 12);
      const want = reflectionFromImpedance(stages[k + 1].z, [50, 0]);
      const last = pts[pts.length - 1];
      expect(last[0]).toBeCloseTo(want[0], 10);
      expect(last[1]).toBeCloseTo(want[1], 10);
      prev = last;
    });
  });

  it('an ideal series L moves along a constant-resistance circle; a shunt C along a constant-conductance circle (Smith chart, common practice)', () => {
    const sl = points(path.segments[0].gamma).map(zOf);
    for (const z of sl) expect(z[0]).toBeCloseTo(20 / 50, 10);
    const sc = points(path.segments[1].gamma).map(zOf).map(([r, x]) => r / (r * r + x * x));
    for (const g of sc) expect(g).toBeCloseTo(sc[0], 10);
  });

  it('a lossless line on Z0 = referenceOhms rotates about the centre by 2βl (Smith chart, common practice)', () => {
    const pts = points(path.segments[2].gamma);
    const r = Math.hypot(...pts[0]);
    for (const p of pts) expect(Math.hypot(...p)).toBeCloseTo(r, 12);
    const a0 = Math.atan2(pts[0][1], pts[0][0]);
    const a1 = Math.atan2(pts[pts.length - 1][1], pts[pts.length - 1][0]);
    const turn = (((a0 - a1) % (2 * Math.PI)) + 2 * Math.PI) % (2 * Math.PI); // clockwise, toward the generator
    expect(turn).toBeCloseTo((2 * 70 * Math.PI) / 180, 10);
  });

  it('a lossy line spirals inward (|Γ| decreases along the path toward the port)', () => {
    const pts = points(path.segments[7].gamma).map((p) => Math.hypot(...p));
    expect(pts[pts.length - 1]).toBeLessThan(pts[0]);
  });

  it('neighbouring points are at most maxStep apart on the Γ plane', () => {
    for (const seg of path.segments) {
      const pts = points(seg.gamma);
      for (let k = 1; k < pts.length; k++) expect(Math.hypot(pts[k][0] - pts[k - 1][0], pts[k][1] - pts[k - 1][1])).toBeLessThanOrEqual(0.01 + 1e-12);
    }
  });

  it('a measured two-port is a jump: two points, before and after', () => {
    const s2p = '# Hz S RI R 50\n1e9 0.1 0 0.9 0 0.9 0 0.1 0\n5e9 0.1 0 0.9 0 0.9 0 0.1 0\n';
    const p = impedancePath(designOf({ elements: [{ id: 'tp', kind: 'two-port', touchstone: s2p }] }));
    expect(p.segments[0].gamma.length).toBe(4);
  });
});
