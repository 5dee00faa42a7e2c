/**
 * Single shunt-stub matching: from the load, a line section of impedance Z_line and length d, then
 * an open or shorted shunt stub of impedance Z_stub and length l, so that the port sees the target.
 *
 * With z = Z_L/Z_line = r + jx and t = tan βd, the admittance after the line, normalised to
 * 1/Z_line, is y(t) = (1 + j z t)/(z + j t), whose real part is r(1 + t²)/(r² + (x + t)²). Setting it to
 * the target conductance g = G_t·Z_line gives (r − g)t² − 2gx·t + r − g(r² + x²) = 0; for Z_line = Z0
 * and a real target this is Pozar's single-stub shunt tuner (Microwave Engineering, §5.2, from memory).
 * A vanishing leading coefficient means one root is at t = ∞ (d = λ/4). The stub supplies the missing
 * susceptance B = B_t − Im Y(d). Lengths are the shortest equivalents: d in [0°, 180°), l in (0°, 180°).
 */
import type { Complex } from './design';

export type StubKind = 'open-stub' | 'short-stub';

export interface StubMatchSolution {
  /** Length of the line section next to the load, degrees at the design frequency (0 = no line). */
  readonly lineDegrees: number;
  readonly lineZ0: number;
  readonly stubKind: StubKind;
  /** Stub length in degrees at the design frequency (0 = no stub needed). */
  readonly stubDegrees: number;
  readonly stubZ0: number;
  /** Susceptance the stub must supply, siemens. */
  readonly stubSusceptance: number;
}

const DEG = 180 / Math.PI;

/** An angle in degrees reduced into [0, 180). */
function halfTurn(deg: number): number {
  const r = deg % 180;
  const v = r < 0 ? r + 180 : r;
  return v >= 180 - 1e-12 ? 0 : v;
}

/** Electrical lengths (degrees, in [0, 180)) of a line of impedance `lineZ0` after which the load's conductance equals `gTarget`. */
export function stubLineLengths(zLoad: Complex, lineZ0: number, gTarget: number): number[] {
  const r = zLoad[0] / lineZ0;
  const x = zLoad[1] / lineZ0;
  const g = gTarget * lineZ0;
  if (!(r > 0) || !(g > 0)) return [];
  const a = r - g;
  const b = -2 * g * x;
  const c = r - g * (r * r + x * x);
  const scale = Math.max(r, g * (1 + r * r + x * x), Math.abs(b));
  const ts: number[] = [];
  let quarter = false;
  if (Math.abs(a) <= 1e-12 * scale) {
    quarter = true;
    if (Math.abs(b) > 1e-12 * scale) ts.push(-c / b);
  } else {
    const disc = b * b - 4 * a * c;
    if (disc < -1e-12 * scale * scale) return [];
    const s = Math.sqrt(Math.max(0, disc));
    // numerically stable pair of roots
    const q = -0.5 * (b + (b >= 0 ? s : -s));
    if (q !== 0) ts.push(q / a, c / q);
    else ts.push(0);
  }
  const out = ts.map((t) => halfTurn(Math.atan(t) * DEG));
  if (quarter) out.push(90);
  const unique: number[] = [];
  for (const d of out) if (!unique.some((u) => Math.abs(u - d) < 1e-9)) unique.push(d);
  return unique.sort((p, q) => p - q);
}

/** Admittance [G, B] seen into a lossless line of impedance `z0` and electrical length `deg` ending in `zLoad`. */
export function lineAdmittance(zLoad: Complex, z0: number, deg: number): Complex {
  const t = Math.tan(deg / DEG);
  const [rl, xl] = zLoad;
  if (!Number.isFinite(t) || Math.abs(t) > 1e15) {
    // quarter wave: Y = Z_L / z0²
    return [rl / (z0 * z0), xl / (z0 * z0)];
  }
  // Z = z0 (Z_L + j z0 t)/(z0 + j Z_L t); Y = 1/Z = (z0 + j Z_L t)/(z0 (Z_L + j z0 t))
  const nr = z0 - xl * t;
  const ni = rl * t;
  const dr = z0 * rl;
  const di = z0 * (xl + z0 * t);
  const m = dr * dr + di * di;
  return [(nr * dr + ni * di) / m, (ni * dr - nr * di) / m];
}

/** Stub length (degrees in [0, 180)) giving susceptance `b`: open tan βl = b·Z, shorted −cot βl = b·Z. */
export function stubDegreesFor(kind: StubKind, b: number, stubZ0: number): number {
  const bz = b * stubZ0;
  if (kind === 'open-stub') return halfTurn(Math.atan(bz) * DEG);
  if (bz === 0) return 90;
  return halfTurn(Math.atan(-1 / bz) * DEG);
}

export interface StubMatchOptions {
  readonly lineZ0: number;
  readonly stubZ0: number;
  readonly kinds?: readonly StubKind[];
}

/** Every single-shunt-stub solution from `zLoad` to `zTarget`: both line lengths, each with an open and a shorted stub. */
export function stubMatches(zLoad: Complex, zTarget: Complex, options: StubMatchOptions): StubMatchSolution[] {
  const [rt, xt] = zTarget;
  const mt2 = rt * rt + xt * xt;
  if (!(rt > 0) || !(zLoad[0] > 0)) return [];
  const gt = rt / mt2;
  const bt = -xt / mt2;
  const out: StubMatchSolution[] = [];
  for (const d of stubLineLengths(zLoad, options.lineZ0, gt)) {
    const y = lineAdmittance(zLoad, options.lineZ0, d);
    const b = bt - y[1];
    for (const kind of options.kinds ?? (['open-stub', 'short-stub'] as const)) {
      out.push({
        lineDegrees: d,
        lineZ0: options.lineZ0,
        stubKind: kind,
        stubDegrees: stubDegreesFor(kind, b, options.stubZ0),
        stubZ0: options.stubZ0,
        stubSusceptance: b,
      });
    }
  }
  return out;
}
