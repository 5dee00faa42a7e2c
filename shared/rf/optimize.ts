/**
 * A bounded Nelder–Mead simplex minimiser (Nelder & Mead, The Computer Journal 7, 1965; the usual
 * coefficients reflection 1, expansion 2, contraction ½, shrink ½ — common practice), written as a
 * generator that yields after every iteration so callers can report progress, cancel, or hand the
 * thread back to an event loop between steps. Bounds are kept by clamping every trial point into the
 * box. `nelderMeadRestarts` reruns it from the best point with a fresh, shrinking simplex, and now
 * and then from a seeded random perturbation, until restarts stop paying.
 */
import { prngUniform, type Prng } from './prng';

export interface Box {
  readonly lower: Float64Array;
  readonly upper: Float64Array;
}

export interface OptimizeProgress {
  readonly iteration: number;
  readonly evaluations: number;
  readonly best: number;
}

export interface NelderMeadOptions {
  /** Initial simplex edge per coordinate. */
  readonly step: Float64Array;
  readonly box: Box;
  /** Stop when the simplex's values span less than this (absolute). Default 1e-12. */
  readonly fTolerance?: number;
  /** Stop when every coordinate of the simplex spans less than this times its step. Default 1e-9. */
  readonly xTolerance?: number;
  readonly maxEvaluations?: number;
}

export interface OptimizeResult {
  readonly x: Float64Array;
  readonly f: number;
  readonly evaluations: number;
  readonly iterations: number;
}

function clampInto(x: Float64Array, box: Box): Float64Array {
  for (let i = 0; i < x.length; i++) x[i] = Math.min(box.upper[i], Math.max(box.lower[i], x[i]));
  return x;
}

/** Minimise `f` from `x0`; yields progress after each iteration and returns the best point. */
export function* nelderMeadSteps(f: (x: Float64Array) => number, x0: Float64Array, options: NelderMeadOptions): Generator<OptimizeProgress, OptimizeResult> {
  const n = x0.length;
  const { box, step } = options;
  const fTol = options.fTolerance ?? 1e-12;
  const xTol = options.xTolerance ?? 1e-9;
  const maxEval = options.maxEvaluations ?? 200 * (n + 1);
  let evaluations = 0;
  const evalAt = (x: Float64Array) => {
    evaluations++;
    const v = f(x);
    return Number.isFinite(v) ? v : Infinity;
  };
  const pts: Float64Array[] = [];
  const vals: number[] = [];
  const start = clampInto(Float64Array.from(x0), box);
  pts.push(start);
  vals.push(evalAt(start));
  for (let i = 0; i < n; i++) {
    const p = Float64Array.from(start);
    // step away from the nearer bound so the simplex is not flattened by clamping
    const up = box.upper[i] - p[i] >= p[i] - box.lower[i];
    p[i] += up ? step[i] : -step[i];
    clampInto(p, box);
    if (p[i] === start[i]) p[i] = up ? box.lower[i] : box.upper[i];
    pts.push(p);
    vals.push(evalAt(p));
  }
  if (n === 0) return { x: start, f: vals[0], evaluations, iterations: 0 };
  const order = Array.from({ length: n + 1 }, (_, i) => i);
  const centroid = new Float64Array(n);
  const trial = (from: Float64Array, towards: Float64Array, t: number) => {
    const x = new Float64Array(n);
    for (let i = 0; i < n; i++) x[i] = from[i] + t * (towards[i] - from[i]);
    return clampInto(x, box);
  };
  let iterations = 0;
  while (evaluations < maxEval) {
    order.sort((a, b) => vals[a] - vals[b]);
    const best = order[0];
    const worst = order[n];
    const second = order[n - 1];
    let spread = true;
    for (let i = 0; i < n && spread; i++) {
      let lo = Infinity, hi = -Infinity;
      for (const p of pts) {
        lo = Math.min(lo, p[i]);
        hi = Math.max(hi, p[i]);
      }
      if (hi - lo > xTol * step[i]) spread = false;
    }
    if (vals[worst] - vals[best] <= fTol || spread) break;
    centroid.fill(0);
    for (const k of order) if (k !== worst) for (let i = 0; i < n; i++) centroid[i] += pts[k][i] / n;
    const xr = trial(pts[worst], centroid, 2);
    const fr = evalAt(xr);
    if (fr < vals[best]) {
      const xe = trial(pts[worst], centroid, 3);
      const fe = evalAt(xe);
      if (fe < fr) {
        pts[worst] = xe;
        vals[worst] = fe;
      } else {
        pts[worst] = xr;
        vals[worst] = fr;
      }
    } else if (fr < vals[second]) {
      pts[worst] = xr;
      vals[worst] = fr;
    } else {
      const outside = fr < vals[worst];
      const xc = outside ? trial(pts[worst], centroid, 1.5) : trial(pts[worst], centroid, 0.5);
      const fc = evalAt(xc);
      if (fc < Math.min(fr, vals[worst])) {
        pts[worst] = xc;
        vals[worst] = fc;
      } else {
        for (const k of order) {
          if (k === best) continue;
          pts[k] = trial(pts[best], pts[k], 0.5);
          vals[k] = evalAt(pts[k]);
        }
      }
    }
    iterations++;
    yield { iteration: iterations, evaluations, best: Math.min(...vals) };
  }
  let b = 0;
  for (let k = 1; k <= n; k++) if (vals[k] < vals[b]) b = k;
  return { x: pts[b], f: vals[b], evaluations, iterations };
}

export interface RestartOptions extends NelderMeadOptions {
  /** Total evaluation budget over all restarts. Default 4000·(n + 1)^0.5 . */
  readonly budget?: number;
  readonly restarts?: number;
  readonly prng?: Prng;
}

/**
 * Nelder–Mead with restarts: each round starts a fresh simplex at the best point found (edge halved
 * each round), every third round from a random point within one step of it. Yields after every
 * iteration with the best value so far.
 */
export function* nelderMeadRestarts(f: (x: Float64Array) => number, x0: Float64Array, options: RestartOptions): Generator<OptimizeProgress, OptimizeResult> {
  const n = x0.length;
  const budget = options.budget ?? Math.round(4000 * Math.sqrt(n + 1));
  const restarts = options.restarts ?? 12;
  let bestX = clampInto(Float64Array.from(x0), options.box);
  let bestF = f(bestX);
  let evaluations = 1;
  let iterations = 0;
  let scale = 1;
  for (let round = 0; round <= restarts && evaluations < budget; round++) {
    let start = bestX;
    if (round > 0 && round % 3 === 0 && options.prng) {
      start = Float64Array.from(bestX);
      for (let i = 0; i < n; i++) start[i] += (2 * prngUniform(options.prng) - 1) * options.step[i];
      clampInto(start, options.box);
    }
    const step = options.step.map((s) => s * scale);
    const run = nelderMeadSteps(f, start, { ...options, step, maxEvaluations: Math.min(options.maxEvaluations ?? Infinity, budget - evaluations) });
    let r = run.next();
    while (!r.done) {
      iterations++;
      yield { iteration: iterations, evaluations: evaluations + r.value.evaluations, best: Math.min(bestF, r.value.best) };
      r = run.next();
    }
    evaluations += r.value.evaluations;
    const gain = bestF - r.value.f;
    if (r.value.f < bestF) {
      bestF = r.value.f;
      bestX = r.value.x;
    }
    scale = gain > 1e-9 * Math.max(1e-12, Math.abs(bestF)) ? Math.max(scale * 0.7, 0.05) : scale * 0.5;
    if (scale < 1e-4) break;
  }
  return { x: bestX, f: bestF, evaluations, iterations };
}
