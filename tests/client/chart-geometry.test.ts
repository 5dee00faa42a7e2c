import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import {
  constantBCircle,
  constantGCircle,
  constantQCircle,
  constantRCircle,
  constantXCircle,
  gammaAngleDeg,
  gammaMagnitude,
  gammaToPixel,
  gammaToY,
  gammaToZ,
  panView,
  pixelToGamma,
  viewFrame,
  zoomViewAt,
  zToGamma,
  type Circle,
} from '../../client/features/workspace/chart/geometry';

const frame = { cx: 200, cy: 150, radius: 100 };
const close = (a: number, b: number, tol = 1e-9) => expect(Math.abs(a - b)).toBeLessThanOrEqual(tol * Math.max(1, Math.abs(b)));
const onCircle = (g: [number, number], c: Circle, tol = 1e-9) => close(Math.hypot(g[0] - c.cx, g[1] - c.cy), c.radius, tol);

describe('zToGamma and gammaToPixel', () => {
  it('maps a matched load (z = z0) to the centre of the chart (common practice)', () => {
    const g = zToGamma([50, 0], 50);
    close(g[0], 0);
    close(g[1], 0);
    expect(gammaToPixel(g, frame)).toEqual([200, 150]);
  });

  it('maps a short (z = 0) to the left edge, Γ = −1 (common practice)', () => {
    const g = zToGamma([0, 0], 50);
    expect(g).toEqual([-1, 0]);
    expect(gammaToPixel(g, frame)).toEqual([100, 150]);
  });

  it('maps an open (z = ∞) to the right edge, Γ = +1 (common practice)', () => {
    expect(zToGamma([Infinity, 0], 50)).toEqual([1, 0]);
    expect(gammaToPixel(zToGamma([Infinity, 0], 50), frame)).toEqual([300, 150]);
    // the engine's open circuit is a very large finite impedance (shared/rf/complex.ts IMPEDANCE_OPEN_OHMS)
    const big = zToGamma([1e15, 0], 50);
    close(big[0], 1, 1e-12);
  });

  it('maps z = 1 + j1 (normalised) to Γ = 0.2 + j0.4 (from memory; Γ = (z − 1)/(z + 1) = j/(2 + j))', () => {
    const g = zToGamma([50, 50], 50);
    close(g[0], 0.2);
    close(g[1], 0.4);
    const [px, py] = gammaToPixel(g, frame);
    close(px, 220);
    close(py, 110); // +Im Γ is drawn upward
  });

  it('maps z = +j1 to the top of the rim and z = −j1 to the bottom (common practice: inductive upper half)', () => {
    const up = zToGamma([0, 50], 50);
    close(up[0], 0);
    close(up[1], 1);
    const down = zToGamma([0, -50], 50);
    close(down[1], -1);
    expect(gammaToPixel(up, frame)[1]).toBeCloseTo(50, 9);
  });

  it('gives Γ = ±1/3 for z = 2 and z = 0.5 (Pozar, Microwave Engineering, §2.3, Γ = (ZL − Z0)/(ZL + Z0); from memory)', () => {
    close(zToGamma([100, 0], 50)[0], 1 / 3);
    close(zToGamma([25, 0], 50)[0], -1 / 3);
  });

  it('reports |Γ| and its angle in degrees', () => {
    const g = zToGamma([50, 50], 50);
    close(gammaMagnitude(g), Math.sqrt(0.2), 1e-12);
    close(gammaAngleDeg(g), (Math.atan2(0.4, 0.2) * 180) / Math.PI, 1e-12);
    close(gammaAngleDeg([0, 1]), 90);
  });
});

describe('round trips', () => {
  it('gammaToZ(zToGamma(z)) returns z for passive impedances (property)', () => {
    fc.assert(
      fc.property(fc.double({ min: 0, max: 1e4, noNaN: true }), fc.double({ min: -1e4, max: 1e4, noNaN: true }), (r, x) => {
        const z = gammaToZ(zToGamma([r, x], 50), 50);
        // near the rim Γ → z is ill-conditioned: allow rounding that grows like |z|²/z0
        const tol = 1e-12 * (50 + (r * r + x * x) / 50);
        expect(Math.abs(z[0] - r)).toBeLessThanOrEqual(tol);
        expect(Math.abs(z[1] - x)).toBeLessThanOrEqual(tol);
      }),
    );
  });

  it('gammaToZ of Γ = 1 is an open circuit, never NaN', () => {
    expect(gammaToZ([1, 0], 50)).toEqual([Infinity, 0]);
    expect(gammaToZ([-1, 0], 50)).toEqual([0, 0]);
  });

  it('pixelToGamma inverts gammaToPixel (property)', () => {
    fc.assert(
      fc.property(fc.double({ min: -2, max: 2, noNaN: true }), fc.double({ min: -2, max: 2, noNaN: true }), (u, v) => {
        const g = pixelToGamma(gammaToPixel([u, v], frame), frame);
        expect(g[0]).toBeCloseTo(u, 9);
        expect(g[1]).toBeCloseTo(v, 9);
      }),
    );
  });

  it('gammaToY gives the admittance 1/z (z = 50 + j50 → 10 − j10 mS; common practice)', () => {
    const y = gammaToY(zToGamma([50, 50], 50), 50);
    close(y[0], 0.01, 1e-9);
    close(y[1], -0.01, 1e-9);
    expect(gammaToY([-1, 0], 50)).toEqual([Infinity, 0]); // a short has infinite admittance
  });
});

describe('grid circles', () => {
  it('constant-r circle: centre r/(1+r), radius 1/(1+r) (Pozar, Microwave Engineering, §2.4; from memory)', () => {
    expect(constantRCircle(1)).toEqual({ cx: 0.5, cy: 0, radius: 0.5 });
    expect(constantRCircle(0)).toEqual({ cx: 0, cy: 0, radius: 1 });
    for (const r of [0.2, 0.5, 1, 2, 5])
      for (const x of [-5, -1, -0.2, 0, 0.3, 1, 4]) onCircle(zToGamma([r * 50, x * 50], 50), constantRCircle(r));
  });

  it('constant-x circle: centre (1, 1/x), radius 1/|x| (Pozar, Microwave Engineering, §2.4; from memory)', () => {
    expect(constantXCircle(1)).toEqual({ cx: 1, cy: 1, radius: 1 });
    expect(constantXCircle(-0.5)).toEqual({ cx: 1, cy: -2, radius: 2 });
    for (const x of [-5, -1, -0.2, 0.3, 1, 4])
      for (const r of [0, 0.2, 1, 3, 10]) onCircle(zToGamma([r * 50, x * 50], 50), constantXCircle(x));
  });

  it('admittance circles are the impedance circles mirrored through the centre (common practice)', () => {
    // y = g + jb corresponds to z = 1/y; its Γ lies on the constant-g and constant-b circles
    for (const g of [0.2, 1, 3])
      for (const b of [-2, -0.5, 0.5, 2]) {
        const d = g * g + b * b;
        const z: [number, number] = [(50 * g) / d, (-50 * b) / d];
        const gm = zToGamma(z, 50);
        onCircle(gm, constantGCircle(g));
        onCircle(gm, constantBCircle(b));
      }
  });

  it('constant-Q arcs hold every z = r(1 ± jQ) (derived from Γ = (z − 1)/(z + 1); common practice)', () => {
    for (const q of [0.5, 1, 3])
      for (const r of [0.1, 0.5, 1, 2]) {
        onCircle(zToGamma([50 * r, 50 * r * q], 50), constantQCircle(q, 'upper'));
        onCircle(zToGamma([50 * r, -50 * r * q], 50), constantQCircle(q, 'lower'));
      }
  });
});

describe('view', () => {
  it('viewFrame centres Γ = 0 at zoom 1 and leaves a margin for the rim labels', () => {
    const f = viewFrame(400, 300);
    expect(f.cx).toBe(200);
    expect(f.cy).toBe(150);
    expect(f.radius).toBeLessThan(150);
    expect(f.radius).toBeGreaterThan(100);
  });

  it('zoomViewAt keeps the Γ point under the mouse fixed', () => {
    const view = { zoom: 1, cx: 0, cy: 0 };
    const p: [number, number] = [260, 90];
    const before = pixelToGamma(p, viewFrame(400, 300, view));
    const next = zoomViewAt(400, 300, view, p, 2.5);
    expect(next.zoom).toBe(2.5);
    const after = pixelToGamma(p, viewFrame(400, 300, next));
    close(after[0], before[0]);
    close(after[1], before[1]);
  });

  it('zoomViewAt clamps the zoom to its limits', () => {
    expect(zoomViewAt(400, 300, { zoom: 1, cx: 0, cy: 0 }, [200, 150], 1e6).zoom).toBe(40);
    expect(zoomViewAt(400, 300, { zoom: 1, cx: 0, cy: 0 }, [200, 150], 1e-6).zoom).toBe(0.5);
  });

  it('panView moves the chart with the mouse', () => {
    const view = { zoom: 2, cx: 0, cy: 0 };
    const g = [0.3, -0.2] as [number, number];
    const p0 = gammaToPixel(g, viewFrame(400, 300, view));
    const moved = panView(400, 300, view, 15, -7);
    const p1 = gammaToPixel(g, viewFrame(400, 300, moved));
    close(p1[0] - p0[0], 15);
    close(p1[1] - p0[1], -7);
  });
});
