/**
 * Chain elements compiled for the sweep loops: one small numeric record per element (a kind
 * code and four parameters), so the loops switch on an integer and read a Float64Array instead
 * of walking objects. Also the per-element physics at one frequency (`elementAbcdAt`), used by
 * the single-frequency figures (stages, stress, impedance path); the sweep loops inline the same
 * formulas.
 *
 * Physics (Pozar, Microwave Engineering 4th ed., §2.3 and Table 4.1):
 * - series-l: Z = ωL/Q + jωL; series-c: Z = 1/(ωC/Q + jωC); series-r: Z = R (q ignored).
 * - shunt-l: Y = 1/(ωL/Q + jωL); shunt-c: Y = ωC/Q + jωC; shunt-r: Y = 1/R.
 * - line: ABCD = [cosh γl, Z0 sinh γl; sinh γl / Z0, cosh γl], γl = αl + jβl.
 * - open stub: shunt Y = tanh(γl)/Z0; short stub: shunt Y = coth(γl)/Z0.
 * - transformer n: ABCD = [n, 0; 0, 1/n] (the port side sees n²·Z of the load side).
 * - two-port: ABCD from its S-parameters (abcd.ts), port 1 toward the port unless flipped.
 * Lengths: `{degrees, atHz}` gives βl = (degrees·π/180)·f/atHz; `{meters, velocityFactor}` gives
 * βl = 2πf·l/(v·c). Loss: α = lossDbPerM·ln(10)/20 nepers per metre, constant over frequency;
 * for the degrees form the physical length is taken as (degrees/360)·c/atHz (velocity factor 1).
 */
import { abcdFromS, sFlip } from './abcd';
import { DesignError, type Element, type LineElement } from './design';
import { measuredData, measuredResampled } from './measured';
import { formatEngineering } from './units';

export const SPEED_OF_LIGHT = 299_792_458;
const TWO_PI = 2 * Math.PI;

export const K_SERIES_L = 1;
export const K_SERIES_C = 2;
export const K_SERIES_R = 3;
export const K_SHUNT_L = 4;
export const K_SHUNT_C = 5;
export const K_SHUNT_R = 6;
export const K_LINE = 7;
export const K_OPEN_STUB = 8;
export const K_SHORT_STUB = 9;
export const K_TRANSFORMER = 10;
export const K_TWO_PORT = 11;

const KIND_CODE: Record<Element['kind'], number> = {
  'series-l': K_SERIES_L,
  'series-c': K_SERIES_C,
  'series-r': K_SERIES_R,
  'shunt-l': K_SHUNT_L,
  'shunt-c': K_SHUNT_C,
  'shunt-r': K_SHUNT_R,
  line: K_LINE,
  'open-stub': K_OPEN_STUB,
  'short-stub': K_SHORT_STUB,
  transformer: K_TRANSFORMER,
  'two-port': K_TWO_PORT,
};

/** Smallest |sinh γl| used for a shorted stub, so a zero-length shorted stub is a 1e60·Y0 short instead of an infinite one. */
export const SHORT_STUB_MIN_SINH = 1e-60;

/**
 * A compiled chain. Parameters, 4 per element (`p[4e .. 4e+3]`):
 * - lumped L/C: [value, 1/Q (0 for ideal), 0, 0]; R: [ohms, 0, 0, 0]
 * - line/stubs: [z0, βl per hertz (rad/Hz), cosh αl, sinh αl]
 * - transformer: [n, 0, 0, 0]
 * - two-port: `tables[e]` holds ABCD per grid point (8 doubles per point, abcd.ts layout).
 */
export interface ChainPlan {
  readonly count: number;
  readonly kinds: Uint8Array;
  readonly p: Float64Array;
  readonly tables: (Float64Array | null)[];
  /** The frequency grid the two-port tables were built for. */
  readonly freqs: Float64Array;
}

/** Electrical constants of a line or stub: βl per hertz (radians) and the total attenuation αl (nepers). */
export function lineElectrical(e: Pick<LineElement, 'length' | 'lossDbPerM'>): { radiansPerHz: number; nepers: number } {
  const alpha = ((e.lossDbPerM ?? 0) * Math.LN10) / 20;
  if ('degrees' in e.length) {
    const { degrees, atHz } = e.length;
    const meters = (degrees / 360) * (SPEED_OF_LIGHT / atHz);
    return { radiansPerHz: (degrees * Math.PI) / 180 / atHz, nepers: alpha * meters };
  }
  const { meters, velocityFactor } = e.length;
  return { radiansPerHz: (TWO_PI * meters) / (velocityFactor * SPEED_OF_LIGHT), nepers: alpha * meters };
}

// Two-port ABCD tables, cached per (text, flipped) and per frequency grid object.
const twoPortCache = new Map<string, WeakMap<Float64Array, Float64Array>>();
const TWO_PORT_CACHE_LIMIT = 16;

/** ABCD of a measured two-port at each frequency (8 doubles per point). Throws DesignError at `path`. */
export function twoPortAbcd(e: Extract<Element, { kind: 'two-port' }>, freqs: Float64Array, path: string): Float64Array {
  const key = `${e.flipped ? 1 : 0}\u0000${e.touchstone}`;
  let byGrid = twoPortCache.get(key);
  const hit = byGrid?.get(freqs);
  if (hit) return hit;
  const data = measuredData(e.touchstone, 2, `${path}.touchstone`);
  const s = measuredResampled(data, freqs, `${path}.touchstone`);
  const abcd = new Float64Array(8 * freqs.length);
  for (let i = 0; i < freqs.length; i++) {
    if (e.flipped) sFlip(s, 8 * i);
    if (!abcdFromS(s, 8 * i, data.referenceOhms, abcd, 8 * i))
      throw new DesignError(
        `${path}.touchstone`,
        `S21 is zero at ${formatEngineering(freqs[i], 'Hz')}: a two-port that passes no signal has no chain matrix`,
      );
  }
  if (!byGrid) {
    if (twoPortCache.size >= TWO_PORT_CACHE_LIMIT) twoPortCache.delete(twoPortCache.keys().next().value as string);
    byGrid = new WeakMap();
    twoPortCache.set(key, byGrid);
  }
  byGrid.set(freqs, abcd);
  return abcd;
}

const UNIT: Record<string, string> = { l: 'henries', c: 'farads', r: 'ohms' };

const isPositive = (v: unknown): boolean => typeof v === 'number' && v > 0 && v < Infinity;
const isNonNegative = (v: unknown): boolean => typeof v === 'number' && v >= 0 && v < Infinity;
function invalid(path: string, field: string, reason: string): never {
  throw new DesignError(`${path}.${field}`, reason);
}

/**
 * The numeric checks of the design schema, repeated cheaply for chains built in code (refine,
 * yield, the match finder), so a negative or non-finite value is a DesignError, never NaN.
 */
function elementCheck(e: Element, path: string): void {
  switch (e.kind) {
    case 'series-l':
    case 'series-c':
    case 'series-r':
    case 'shunt-l':
    case 'shunt-c':
    case 'shunt-r':
      if (!isPositive(e.value)) invalid(path, 'value', `must be a positive number of ${UNIT[e.kind.slice(-1)]}`);
      if (e.q !== undefined && !isPositive(e.q)) invalid(path, 'q', 'must be a positive number of (quality factor)');
      return;
    case 'line':
    case 'open-stub':
    case 'short-stub': {
      if (!isPositive(e.z0)) invalid(path, 'z0', 'must be a positive number of ohms');
      if (e.lossDbPerM !== undefined && !isNonNegative(e.lossDbPerM)) invalid(path, 'lossDbPerM', 'must be zero or a positive number of dB per metre');
      const len = e.length as Record<string, unknown>;
      if ('degrees' in len) {
        if (!isNonNegative(len.degrees)) invalid(path, 'length.degrees', 'must be zero or a positive number of degrees');
        if (!isPositive(len.atHz)) invalid(path, 'length.atHz', 'must be a positive number of hertz');
      } else {
        if (!isNonNegative(len.meters)) invalid(path, 'length.meters', 'must be zero or a positive number of metres');
        if (!isPositive(len.velocityFactor) || (len.velocityFactor as number) > 1)
          invalid(path, 'length.velocityFactor', 'must be a velocity factor, 0 < v ≤ 1');
      }
      return;
    }
    case 'transformer':
      if (!isPositive(e.ratio)) invalid(path, 'ratio', 'must be a positive number of (turns ratio)');
      return;
    case 'two-port':
      return;
  }
}

/** Compile a chain (load -> port) for the grid `freqs`. `pathOf(i)` names element i in errors. */
export function chainPlan(
  elements: readonly Element[],
  freqs: Float64Array,
  pathOf: (i: number) => string = (i) => `elements[${i}]`,
): ChainPlan {
  const count = elements.length;
  const kinds = new Uint8Array(count);
  const p = new Float64Array(4 * count);
  const tables: (Float64Array | null)[] = new Array(count).fill(null);
  for (let i = 0; i < count; i++) {
    const e = elements[i];
    const code = KIND_CODE[e.kind];
    if (code === undefined) throw new DesignError(`${pathOf(i)}.kind`, `unknown kind ${JSON.stringify((e as { kind: unknown }).kind)}`);
    kinds[i] = code;
    try {
      elementCheck(e, '');
    } catch (err) {
      throw err instanceof DesignError ? new DesignError(`${pathOf(i)}${err.path}`, err.reason) : err;
    }
    const o = 4 * i;
    switch (e.kind) {
      case 'series-l':
      case 'series-c':
      case 'shunt-l':
      case 'shunt-c':
        p[o] = e.value;
        p[o + 1] = e.q === undefined ? 0 : 1 / e.q;
        break;
      case 'series-r':
      case 'shunt-r':
        p[o] = e.value;
        break;
      case 'line':
      case 'open-stub':
      case 'short-stub': {
        const { radiansPerHz, nepers } = lineElectrical(e);
        p[o] = e.z0;
        p[o + 1] = radiansPerHz;
        p[o + 2] = Math.cosh(nepers);
        p[o + 3] = Math.sinh(nepers);
        break;
      }
      case 'transformer':
        p[o] = e.ratio;
        break;
      case 'two-port':
        tables[i] = twoPortAbcd(e, freqs, pathOf(i));
        break;
    }
  }
  return { count, kinds, p, tables, freqs };
}

/**
 * ABCD of element `e` of `plan` at frequency `hz` (the plan's grid point `index`, used only by
 * two-ports), into `out[0..7]`.
 */
export function elementAbcdAt(plan: ChainPlan, e: number, hz: number, index: number, out: Float64Array): Float64Array {
  const w = TWO_PI * hz;
  const o = 4 * e;
  const p = plan.p;
  out.fill(0);
  out[0] = 1;
  out[6] = 1;
  switch (plan.kinds[e]) {
    case K_SERIES_L: {
      const x = w * p[o];
      out[2] = x * p[o + 1];
      out[3] = x;
      break;
    }
    case K_SERIES_C: {
      const b = w * p[o];
      const g = b * p[o + 1];
      const d = g * g + b * b;
      out[2] = g / d;
      out[3] = -b / d;
      break;
    }
    case K_SERIES_R:
      out[2] = p[o];
      break;
    case K_SHUNT_L: {
      const x = w * p[o];
      const r = x * p[o + 1];
      const d = r * r + x * x;
      out[4] = r / d;
      out[5] = -x / d;
      break;
    }
    case K_SHUNT_C: {
      const b = w * p[o];
      out[4] = b * p[o + 1];
      out[5] = b;
      break;
    }
    case K_SHUNT_R:
      out[4] = 1 / p[o];
      break;
    case K_LINE:
    case K_OPEN_STUB:
    case K_SHORT_STUB: {
      const z0 = p[o];
      const th = p[o + 1] * hz;
      const c = Math.cos(th);
      const s = Math.sin(th);
      const chr = p[o + 2] * c, chi = p[o + 3] * s; // cosh(αl + jβl)
      const shr = p[o + 3] * c, shi = p[o + 2] * s; // sinh(αl + jβl)
      const kind = plan.kinds[e];
      if (kind === K_LINE) {
        out[0] = chr;
        out[1] = chi;
        out[2] = z0 * shr;
        out[3] = z0 * shi;
        out[4] = shr / z0;
        out[5] = shi / z0;
        out[6] = chr;
        out[7] = chi;
      } else {
        // Y = (num/den)/z0 with num/den = sinh/cosh (open) or cosh/sinh (short).
        let nr = shr, ni = shi, dr = chr, di = chi;
        if (kind === K_SHORT_STUB) {
          nr = chr;
          ni = chi;
          dr = shr;
          di = shi;
          if (Math.hypot(dr, di) < SHORT_STUB_MIN_SINH) {
            dr = SHORT_STUB_MIN_SINH;
            di = 0;
          }
        }
        const d = dr * dr + di * di;
        out[4] = (nr * dr + ni * di) / d / z0;
        out[5] = (ni * dr - nr * di) / d / z0;
      }
      break;
    }
    case K_TRANSFORMER:
      out[0] = p[o];
      out[6] = 1 / p[o];
      break;
    case K_TWO_PORT: {
      const t = plan.tables[e] as Float64Array;
      for (let k = 0; k < 8; k++) out[k] = t[8 * index + k];
      break;
    }
  }
  return out;
}
