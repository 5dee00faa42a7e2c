/**
 * Load models over a frequency grid, as interleaved impedances (re, im per frequency, ohms).
 *
 * - impedance: the same at every frequency.
 * - rlc series: Z = R + jωL + 1/(jωC); parallel: Y = 1/R + 1/(jωL) + jωC. An omitted l or c is absent.
 * - measured (.s1p): S11 resampled linearly in re/im (touchstone.ts), then Z = R0(1 + Γ)/(1 − Γ) with the file's R0.
 * - table ([hz, re, im] points): each point turned into Γ on `referenceOhms`, Γ interpolated linearly
 *   in re/im, turned back. A frequency outside the table is an error naming the range; a one-point
 *   table is that impedance at every frequency.
 * Γ = 1 exactly (an open) becomes an impedance of IMPEDANCE_OPEN_OHMS (complex.ts).
 */
import { IMPEDANCE_OPEN_OHMS } from './complex';
import { DesignError, type Complex, type Design, type Load } from './design';
import { measuredData, measuredResampled } from './measured';
import { formatEngineering } from './units';

const TWO_PI = 2 * Math.PI;

/** Z = r0(1 + Γ)/(1 − Γ) into out[o], out[o + 1], with |Z| clamped to IMPEDANCE_OPEN_OHMS. */
function impedanceFromGamma(gr: number, gi: number, r0: number, out: Float64Array, o: number): void {
  const dr = 1 - gr;
  const di = -gi;
  const nr = 1 + gr;
  const ni = gi;
  const d = dr * dr + di * di;
  let zr = (r0 * (nr * dr + ni * di)) / d;
  let zi = (r0 * (ni * dr - nr * di)) / d;
  const m = Math.hypot(zr, zi);
  if (!(m <= IMPEDANCE_OPEN_OHMS)) {
    const pm = Math.hypot(nr, ni) || 1;
    // Direction of (1 + Γ)·conj(1 − Γ); at Γ = 1 exactly that is the positive real axis.
    const ur = d === 0 ? 1 : (nr * dr + ni * di) / (pm * Math.sqrt(d));
    const ui = d === 0 ? 0 : (ni * dr - nr * di) / (pm * Math.sqrt(d));
    zr = ur * IMPEDANCE_OPEN_OHMS;
    zi = ui * IMPEDANCE_OPEN_OHMS;
  }
  out[o] = zr;
  out[o + 1] = zi;
}

function tableImpedances(points: readonly (readonly [number, number, number])[], z0: number, freqs: Float64Array, out: Float64Array): void {
  const n = points.length;
  const fs = new Float64Array(n);
  const g = new Float64Array(2 * n);
  for (let k = 0; k < n; k++) {
    const [f, r, x] = points[k];
    fs[k] = f;
    // Γ = (Z − z0)/(Z + z0); Z + z0 has a positive real part (r ≥ 0).
    const dr = r + z0;
    const d = dr * dr + x * x;
    const nr = r - z0;
    g[2 * k] = (nr * dr + x * x) / d;
    g[2 * k + 1] = (x * dr - nr * x) / d;
  }
  const first = fs[0];
  const last = fs[n - 1];
  const slack = 1e-9 * last;
  let j = 0;
  for (let i = 0; i < freqs.length; i++) {
    const f = freqs[i];
    if (n === 1) {
      impedanceFromGamma(g[0], g[1], z0, out, 2 * i);
      continue;
    }
    if (f < first - slack || f > last + slack)
      throw new DesignError(
        'load.points',
        `frequency ${formatEngineering(f, 'Hz')} lies outside the table's range ${formatEngineering(first, 'Hz')}–${formatEngineering(last, 'Hz')}`,
      );
    const fc = Math.min(last, Math.max(first, f));
    if (!(fc >= fs[j] && fc <= fs[j + 1])) {
      let a = 0;
      let b = n - 1;
      while (b - a > 1) {
        const mid = (a + b) >> 1;
        if (fs[mid] <= fc) a = mid;
        else b = mid;
      }
      j = a;
    }
    const t = (fc - fs[j]) / (fs[j + 1] - fs[j]);
    const gr = g[2 * j] + t * (g[2 * j + 2] - g[2 * j]);
    const gi = g[2 * j + 1] + t * (g[2 * j + 3] - g[2 * j + 1]);
    impedanceFromGamma(gr, gi, z0, out, 2 * i);
  }
}

/** The load's impedance at each frequency (interleaved re, im). Throws DesignError for measured data that does not fit. */
export function loadImpedances(load: Load, referenceOhms: number, freqs: Float64Array, out = new Float64Array(2 * freqs.length)): Float64Array {
  const n = freqs.length;
  switch (load.kind) {
    case 'impedance':
      for (let i = 0; i < n; i++) {
        out[2 * i] = load.ohms[0];
        out[2 * i + 1] = load.ohms[1];
      }
      return out;
    case 'rlc': {
      const { r, l, c } = load;
      if (load.topology === 'series') {
        for (let i = 0; i < n; i++) {
          const w = TWO_PI * freqs[i];
          out[2 * i] = r;
          out[2 * i + 1] = (l === undefined ? 0 : w * l) - (c === undefined ? 0 : 1 / (w * c));
        }
      } else {
        const g = 1 / r;
        for (let i = 0; i < n; i++) {
          const w = TWO_PI * freqs[i];
          const b = (c === undefined ? 0 : w * c) - (l === undefined ? 0 : 1 / (w * l));
          const d = g * g + b * b;
          out[2 * i] = g / d;
          out[2 * i + 1] = -b / d;
        }
      }
      return out;
    }
    case 'measured': {
      const data = measuredData(load.touchstone, 1, 'load.touchstone');
      const s = measuredResampled(data, freqs, 'load.touchstone');
      for (let i = 0; i < n; i++) impedanceFromGamma(s[2 * i], s[2 * i + 1], data.referenceOhms, out, 2 * i);
      return out;
    }
    case 'table':
      tableImpedances(load.points, referenceOhms, freqs, out);
      return out;
  }
}

/** The load impedance at one frequency. */
export function loadImpedanceAt(design: Design, hz: number): Complex {
  const z = loadImpedances(design.load, design.referenceOhms, Float64Array.of(hz));
  return [z[0], z[1]];
}
