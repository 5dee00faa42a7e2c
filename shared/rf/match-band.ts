/**
 * Band figures shared by the match finder, refine and the yield run: the worst |Γ| of a chain over a
 * frequency grid (the fast path of cascade.ts), and JSON-safe reflection figures.
 */
import { chainZin, gammaFromZin, type SweepContext } from './cascade';
import type { Element } from './design';

/** |Γ|, VSWR and return loss of one reflection magnitude; `null` where a figure is unbounded (VSWR at |Γ| ≥ 1, return loss at Γ = 0). */
export interface ReflectionFigures {
  readonly gamma: number;
  readonly vswr: number | null;
  readonly returnLossDb: number | null;
}

/** CONTRACT §1: VSWR = (1 + |Γ|)/(1 − |Γ|), return loss = −20 log10 |Γ|. */
export function reflectionFigures(gamma: number): ReflectionFigures {
  return {
    gamma,
    vswr: gamma < 1 ? (1 + gamma) / (1 - gamma) : null,
    returnLossDb: gamma > 0 ? -20 * Math.log10(gamma) : null,
  };
}

/** VSWR of |Γ| (Infinity at |Γ| ≥ 1). */
export function vswrOf(gamma: number): number {
  return gamma < 1 ? (1 + gamma) / (1 - gamma) : Infinity;
}

/** Reusable buffers for evaluating many chains on one grid without allocating per call. */
export interface BandScratch {
  readonly ctx: SweepContext;
  readonly zin: Float64Array;
  readonly gamma: Float64Array;
}

export function bandScratch(ctx: SweepContext): BandScratch {
  const n = ctx.freqs.length;
  return { ctx, zin: new Float64Array(2 * n), gamma: new Float64Array(2 * n) };
}

/** |Γ| at every point of the scratch's grid for `elements` (load -> port), into `scratch.gamma` (interleaved). */
export function bandGamma(scratch: BandScratch, elements: readonly Element[]): Float64Array {
  chainZin(scratch.ctx, elements, scratch.zin);
  return gammaFromZin(scratch.zin, scratch.ctx.zs, scratch.gamma);
}

/** The largest |Γ| over the grid (NaN-safe: a non-finite point counts as total reflection). */
export function bandWorstGamma(scratch: BandScratch, elements: readonly Element[]): number {
  const g = bandGamma(scratch, elements);
  let m2 = 0;
  for (let i = 0; i < g.length; i += 2) {
    const v = g[i] * g[i] + g[i + 1] * g[i + 1];
    if (!(v <= m2)) m2 = Number.isFinite(v) ? v : 1;
  }
  return Math.sqrt(m2);
}
