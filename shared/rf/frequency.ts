/**
 * Frequency grids: the design's sweep (linear or logarithmic spacing) and the in-band
 * evaluation set (sweep points inside the band plus both band edges). All in hertz.
 */
import { bandCenterHz, type Design, type Sweep } from './design';

/**
 * The sweep grid. Linear: f_i = start + (stop − start)·i/(n − 1). Log: f_i = start·(stop/start)^(i/(n − 1)).
 * Both end points are exact; a one-point sweep is `[startHz]`.
 */
export function sweepFrequencies(sweep: Sweep): Float64Array {
  const n = sweep.points;
  const out = new Float64Array(n);
  const { startHz: a, stopHz: b } = sweep;
  if (n === 1) {
    out[0] = a;
    return out;
  }
  if (sweep.spacing === 'log') {
    const lr = Math.log(b / a);
    for (let i = 0; i < n; i++) out[i] = a * Math.exp((lr * i) / (n - 1));
  } else {
    const step = (b - a) / (n - 1);
    for (let i = 0; i < n; i++) out[i] = a + step * i;
  }
  out[n - 1] = b;
  return out;
}

/** Sweep points inside [band.startHz, band.stopHz] plus both band edges, ascending, without duplicates. */
export function bandFrequencies(design: Design, sweep: Float64Array = sweepFrequencies(design.sweep)): Float64Array {
  const { startHz, stopHz } = design.band;
  const inside: number[] = [startHz];
  for (let i = 0; i < sweep.length; i++) {
    const f = sweep[i];
    if (f > startHz && f < stopHz) inside.push(f);
  }
  if (stopHz > startHz) inside.push(stopHz);
  return Float64Array.from(inside);
}

/** The band centre (hertz): `band.centerHz`, or the arithmetic middle of the band. */
export function centerFrequency(design: Design): number {
  return bandCenterHz(design.band);
}
