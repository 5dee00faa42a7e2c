/**
 * Refine: tune every unlocked element of the chain (refine-parameters.ts) to minimise the worst |Γ|
 * over the band (its sweep points and both edges). Minimax by continuation: Nelder–Mead with restarts
 * (optimize.ts) first on the p-norm (mean |Γ|^p)^(1/p) with p = 8, then 32, then on the true maximum;
 * every evaluation is also scored by its true maximum and the best point ever seen is kept, so the
 * result is never worse than the input (an input that cannot be improved comes back unchanged).
 *
 * Optional E-series snap: afterwards each free L or C in turn is fixed to the preferred value just below
 * or just above it, whichever is better once the remaining free elements are re-refined.
 *
 * Cancellation: `shouldStop()` or an aborted `signal` ends the run after the current iteration, with
 * the best design so far. `refineSteps` is the generator; `refineDesign` runs it synchronously (a
 * worker can still stop it through `shouldStop`, e.g. reading a SharedArrayBuffer flag), and
 * `refineDesignAsync` hands the thread back every few milliseconds so an AbortSignal can fire.
 */
import { bandFrequencies, sweepContext } from './cascade';
import { bandCenterHz, type Design, type Element } from './design';
import { nextPreferredDown, nextPreferredUp, type ESeries } from './eseries';
import { bandGamma, bandScratch, reflectionFigures, type BandScratch, type ReflectionFigures } from './match-band';
import { nelderMeadRestarts } from './optimize';
import { prngFrom } from './prng';
import { elementsWithParameters, refineParameters, type RefineParameter } from './refine-parameters';
import { isSnappable, preferredNearest } from './snap';

export interface RefineProgress {
  readonly phase: 'refine' | 'snap';
  readonly iteration: number;
  readonly evaluations: number;
  /** Best worst-in-band |Γ| so far. */
  readonly worstGamma: number;
}

export interface RefineOptions {
  readonly onProgress?: (p: RefineProgress) => void;
  readonly shouldStop?: () => boolean;
  readonly signal?: AbortSignal;
  /** Evaluation budget of the continuous refine (default 1500 + 600 per free parameter). */
  readonly maxEvaluations?: number;
  /** Seed of the random restarts (default 1). */
  readonly seed?: number;
  /** Snap free L and C values to this E-series, re-refining the rest. */
  readonly snap?: ESeries;
}

export interface RefineResult {
  readonly design: Design;
  readonly worstInBand: ReflectionFigures;
  readonly initialWorstGamma: number;
  readonly iterations: number;
  readonly evaluations: number;
  /** True when the returned design is better than the input. */
  readonly improved: boolean;
  /** True when the run was cancelled before it finished. */
  readonly stopped: boolean;
  /** Ids of the elements snapped to `snap`. */
  readonly snappedIds?: string[];
}

class Objective {
  bestMax = Infinity;
  bestElements: Element[] | null = null;
  evaluations = 0;
  constructor(
    private readonly scratch: BandScratch,
    private readonly base: readonly Element[],
    private readonly centerHz: number,
  ) {}

  /** p-norm of |Γ| (p = Infinity: the maximum), recording the best true maximum seen. */
  score(params: readonly RefineParameter[], x: ArrayLike<number>, p: number, base: readonly Element[] = this.base): number {
    const elements = elementsWithParameters(base, params, x, this.centerHz);
    const g = bandGamma(this.scratch, elements);
    const n = g.length >> 1;
    let max2 = 0;
    for (let i = 0; i < g.length; i += 2) {
      const v = g[i] * g[i] + g[i + 1] * g[i + 1];
      if (!(v <= max2)) max2 = Number.isFinite(v) ? v : 1;
    }
    const max = Math.sqrt(max2);
    this.evaluations++;
    if (max < this.bestMax) {
      this.bestMax = max;
      this.bestElements = elements;
    }
    if (p === Infinity || max === 0) return max;
    let s = 0;
    for (let i = 0; i < g.length; i += 2) {
      const v = Math.sqrt(g[i] * g[i] + g[i + 1] * g[i + 1]) / max;
      s += Math.pow(Number.isFinite(v) ? v : 1, p);
    }
    return max * Math.pow(s / n, 1 / p);
  }
}

function stopRequested(options: RefineOptions): boolean {
  return Boolean(options.signal?.aborted || options.shouldStop?.());
}

function* continuousRefine(obj: Objective, base: readonly Element[], params: readonly RefineParameter[], budget: number, seed: number, phase: RefineProgress['phase'], counter: { iterations: number }, options: RefineOptions): Generator<RefineProgress, boolean> {
  if (!params.length) return false;
  const box = { lower: Float64Array.from(params, (p) => p.lower), upper: Float64Array.from(params, (p) => p.upper) };
  let x: Float64Array = Float64Array.from(params, (p, k) => {
    const e = base[p.elementIndex];
    void k;
    if (p.kind === 'log-value' && 'value' in e) return Math.log(e.value);
    if (p.kind === 'log-ratio' && e.kind === 'transformer') return Math.log(e.ratio);
    return p.start;
  });
  const step = Float64Array.from(params, (p) => p.step);
  const prng = prngFrom(seed);
  const stages: [number, number][] = [
    [8, 0.3],
    [32, 0.3],
    [Infinity, 0.4],
  ];
  for (const [p, share] of stages) {
    const run = nelderMeadRestarts((v) => obj.score(params, v, p, base), x, { box, step, budget: Math.max(50, Math.round(budget * share)), prng, fTolerance: 1e-13 });
    let r = run.next();
    while (!r.done) {
      counter.iterations++;
      yield { phase, iteration: counter.iterations, evaluations: obj.evaluations, worstGamma: obj.bestMax };
      if (stopRequested(options)) return true;
      r = run.next();
    }
    x = r.value.x;
  }
  return false;
}

/** The refine run as a generator of progress reports; its return value is the result. */
export function* refineSteps(design: Design, options: RefineOptions = {}): Generator<RefineProgress, RefineResult> {
  const centerHz = bandCenterHz(design.band);
  const scratch = bandScratch(sweepContext(design, bandFrequencies(design)));
  const input = design.elements;
  const obj = new Objective(scratch, input, centerHz);
  const initial = obj.score([], [], Infinity);
  const initialElements = obj.bestElements ?? input.slice();
  const params = refineParameters(input, centerHz, design.referenceOhms);
  const budget = options.maxEvaluations ?? 1500 + 600 * params.length;
  const counter = { iterations: 0 };
  let stopped = yield* continuousRefine(obj, input, params, budget, options.seed ?? 1, 'refine', counter, options);

  let snappedIds: string[] | undefined;
  if (options.snap && !stopped) {
    const series = options.snap;
    snappedIds = [];
    let current = obj.bestElements ?? input.slice();
    const fixed = new Set<number>();
    const free = (i: number) => !input[i].locked && !fixed.has(i);
    const order = current.map((e, i) => i).filter((i) => free(i) && isSnappable(current[i]));
    for (const i of order) {
      const e = current[i] as Extract<Element, { value: number }>;
      const near = preferredNearest(e.value, series);
      const choices = Math.abs(near / e.value - 1) < 1e-9 ? [near] : [nextPreferredDown(e.value, series), nextPreferredUp(e.value, series)];
      fixed.add(i);
      const rest = refineParameters(current, centerHz, design.referenceOhms, free);
      let bestChoice: Element[] | null = null;
      let bestChoiceMax = Infinity;
      for (const v of choices) {
        const trialBase = current.slice();
        trialBase[i] = { ...e, value: v };
        const sub = new Objective(scratch, trialBase, centerHz);
        sub.score([], [], Infinity);
        stopped = yield* continuousRefine(sub, trialBase, rest, Math.round(budget / 4), (options.seed ?? 1) + i + 1, 'snap', counter, options);
        obj.evaluations += sub.evaluations;
        if (sub.bestMax < bestChoiceMax) {
          bestChoiceMax = sub.bestMax;
          bestChoice = sub.bestElements;
        }
        if (stopped) break;
      }
      if (bestChoice) current = bestChoice;
      snappedIds.push(e.id);
      if (stopped) break;
    }
    // The snapped chain replaces the continuous optimum; it is only refused when it is worse than the input.
    const snappedMax = obj.score([], [], Infinity, current);
    if (snappedMax <= initial) {
      obj.bestElements = current;
      obj.bestMax = snappedMax;
    } else {
      obj.bestElements = initialElements;
      obj.bestMax = initial;
      snappedIds = [];
    }
  }

  const improved = obj.bestMax < initial;
  const elements = improved && obj.bestElements ? obj.bestElements : input.slice();
  const worst = improved ? obj.bestMax : initial;
  return {
    design: { ...design, elements },
    worstInBand: reflectionFigures(worst),
    initialWorstGamma: initial,
    iterations: counter.iterations,
    evaluations: obj.evaluations,
    improved,
    stopped,
    ...(snappedIds ? { snappedIds } : {}),
  };
}

/** Run refine to the end (or until stopped) on this thread, reporting progress through `onProgress`. */
export function refineDesign(design: Design, options: RefineOptions = {}): RefineResult {
  const run = refineSteps(design, options);
  let r = run.next();
  while (!r.done) {
    options.onProgress?.(r.value);
    r = run.next();
  }
  return r.value;
}

/**
 * Run refine handing the thread back every `sliceMs` milliseconds (default 12), so that an AbortSignal
 * fired by a message or a timer is seen. Progress is reported at most once per slice.
 */
export async function refineDesignAsync(design: Design, options: RefineOptions & { readonly sliceMs?: number } = {}): Promise<RefineResult> {
  const sliceMs = options.sliceMs ?? 12;
  const run = refineSteps(design, options);
  let sliceStart = Date.now();
  let r = run.next();
  while (!r.done) {
    if (Date.now() - sliceStart >= sliceMs) {
      options.onProgress?.(r.value);
      await new Promise<void>((resolve) => setTimeout(resolve, 0));
      sliceStart = Date.now();
    }
    r = run.next();
  }
  return r.value;
}
