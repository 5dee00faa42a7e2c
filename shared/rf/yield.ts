/**
 * The yield run: a Monte Carlo over each element's part tolerance (CONTRACT §2: uniform within ±t, or
 * normal with t = 3σ), seeded so the same seed gives the same numbers. For every trial the chain is
 * evaluated over the band (its sweep points and both edges) for the worst |Γ|, and over the sweep for
 * the band-trace envelope (min and max |Γ| per frequency).
 *
 * What a tolerance varies: an L, C or R its value; a line or stub its length; a transformer its
 * ratio (a relative tolerance scales it, an absolute one adds to it in the value's own unit: henries,
 * farads, ohms, degrees or metres as the length is written, or the bare ratio). A measured two-port
 * carries its own data and is not varied. A drawn value is kept positive.
 *
 * Sensitivity: for each part with a tolerance, a separate seeded run varies that part alone; the part
 * whose lone variation fails most often (then: whose 95th-percentile worst |Γ| is highest) hurts most.
 */
import { bandFrequencies, sweepContext } from './cascade';
import { goalMaxGamma, type Design, type Element } from './design';
import { sweepFrequencies } from './frequency';
import { bandGamma, bandScratch, bandWorstGamma, vswrOf, type BandScratch } from './match-band';
import { prngFrom, prngNormal, prngSigned, prngSplit, type Prng } from './prng';

export interface YieldOptions {
  /** Default 1000. */
  readonly trials?: number;
  /** Default 1. */
  readonly seed?: number;
  /** Histogram bins of the worst in-band VSWR (default 20). */
  readonly bins?: number;
  /** Trials of each part's lone-variation run (default min(trials, 500); 0 skips sensitivity). */
  readonly sensitivityTrials?: number;
  /** Compute the sweep envelope (default true). */
  readonly envelope?: boolean;
  readonly onProgress?: (p: YieldProgress) => void;
  readonly shouldStop?: () => boolean;
  readonly signal?: AbortSignal;
}

export interface Percentiles {
  readonly p50: number;
  readonly p95: number;
  readonly max: number;
}

export interface PartSensitivity {
  readonly id: string;
  /** Pass fraction when only this part varies. */
  readonly passFraction: number;
  /** 95th percentile of the worst in-band |Γ| when only this part varies. */
  readonly worstGammaP95: number;
}

export interface YieldResult {
  readonly trials: number;
  readonly seed: number;
  readonly passFraction: number;
  /** Worst in-band VSWR over trials (Infinity where |Γ| reaches 1). */
  readonly worstVswr: Percentiles;
  readonly worstGamma: Percentiles;
  readonly histogram: { readonly vswrEdges: number[]; readonly counts: number[]; readonly beyond: number };
  /** Sorted, most harmful first. */
  readonly sensitivity: PartSensitivity[];
  readonly envelope: { readonly frequenciesHz: Float64Array; readonly minGamma: Float64Array; readonly maxGamma: Float64Array } | null;
  readonly nominal: { readonly worstGamma: number; readonly passes: boolean };
  /** Ids of the parts that carried a tolerance. */
  readonly variedIds: string[];
  readonly stopped: boolean;
}

/** A bad yield option. */
export class YieldOptionError extends Error {
  readonly code = 'invalid-option';
  constructor(
    readonly option: string,
    readonly reason: string,
  ) {
    super(`${option}: ${reason}`);
    this.name = 'YieldOptionError';
  }
}

/** Whether an element's tolerance can vary it. */
export function isVaried(e: Element): boolean {
  return e.tolerance !== undefined && e.kind !== 'two-port';
}

function perturbed(x: number, e: Element, prng: Prng): number {
  const t = e.tolerance!;
  const u = t.distribution === 'normal' ? prngNormal(prng) / 3 : prngSigned(prng);
  const v = t.relative !== undefined ? x * (1 + t.relative * u) : x + (t.absolute ?? 0) * u;
  return v > 0 ? v : x * 1e-9;
}

/** One drawn instance of a toleranced element. */
export function elementDrawn(e: Element, prng: Prng): Element {
  if (!isVaried(e)) return e;
  if ('value' in e) return { ...e, value: perturbed(e.value, e, prng) };
  if (e.kind === 'transformer') return { ...e, ratio: perturbed(e.ratio, e, prng) };
  if (e.kind === 'line' || e.kind === 'open-stub' || e.kind === 'short-stub') {
    const length =
      'degrees' in e.length
        ? { degrees: perturbed(e.length.degrees, e, prng), atHz: e.length.atHz }
        : { meters: perturbed(e.length.meters, e, prng), velocityFactor: e.length.velocityFactor };
    return { ...e, length };
  }
  return e;
}

/** Percentile by linear interpolation between order statistics (common practice, "type 7"). */
export function percentileSorted(sorted: ArrayLike<number>, p: number): number {
  const n = sorted.length;
  if (!n) return Number.NaN;
  const h = (n - 1) * p;
  const lo = Math.floor(h);
  const hi = Math.min(n - 1, lo + 1);
  const a = sorted[lo];
  const b = sorted[hi];
  if (a === b) return a;
  return a + (h - lo) * (b - a);
}

function percentiles(values: Float64Array): Percentiles {
  const s = Float64Array.from(values).sort();
  return { p50: percentileSorted(s, 0.5), p95: percentileSorted(s, 0.95), max: s.length ? s[s.length - 1] : Number.NaN };
}

function histogramOf(vswr: Float64Array, bins: number): YieldResult['histogram'] {
  const finite = Array.from(vswr).filter(Number.isFinite);
  const beyond = vswr.length - finite.length;
  if (!finite.length) return { vswrEdges: [], counts: [], beyond };
  const lo = Math.min(...finite);
  const hi = Math.max(...finite);
  const width = hi > lo ? (hi - lo) / bins : 0;
  const nb = width > 0 ? bins : 1;
  const counts = new Array<number>(nb).fill(0);
  for (const v of finite) counts[width > 0 ? Math.min(nb - 1, Math.floor((v - lo) / width)) : 0]++;
  const vswrEdges = Array.from({ length: nb + 1 }, (_, i) => (width > 0 ? lo + i * width : i === 0 ? lo : hi));
  return { vswrEdges, counts, beyond };
}

function checkOptions(o: YieldOptions): void {
  const whole = (name: string, v: number | undefined, min: number, max: number) => {
    if (v !== undefined && !(Number.isInteger(v) && v >= min && v <= max)) throw new YieldOptionError(name, `must be a whole number from ${min} to ${max}`);
  };
  whole('trials', o.trials, 1, 10_000_000);
  whole('bins', o.bins, 1, 1000);
  whole('sensitivityTrials', o.sensitivityTrials, 0, 10_000_000);
  if (o.seed !== undefined && !Number.isFinite(o.seed)) throw new YieldOptionError('seed', 'must be a finite number');
}

export interface YieldProgress {
  readonly trialsDone: number;
  readonly passFraction: number;
}

/**
 * The yield run as a generator: yields progress every 250 trials (checking `shouldStop` and `signal`
 * there), returns the result. `yieldRun` runs it synchronously, `yieldRunAsync` hands the thread back
 * between slices so an AbortSignal can fire.
 */
export function* yieldSteps(design: Design, options: YieldOptions = {}): Generator<YieldProgress, YieldResult> {
  checkOptions(options);
  const trials = options.trials ?? 1000;
  const seed = options.seed ?? 1;
  const gammaMax = goalMaxGamma(design.goal);
  const band = bandScratch(sweepContext(design, bandFrequencies(design)));
  const sweepFreqs = sweepFrequencies(design.sweep);
  const sweep: BandScratch | null = options.envelope === false ? null : bandScratch(sweepContext(design, sweepFreqs));
  const elements = design.elements;
  const variedIds = elements.filter(isVaried).map((e) => e.id);
  const stop = () => Boolean(options.signal?.aborted || options.shouldStop?.());

  const nominalWorst = bandWorstGamma(band, elements);
  const prng = prngFrom(seed);
  const worst = new Float64Array(trials);
  const npt = sweepFreqs.length;
  const envMin = new Float64Array(npt).fill(Infinity);
  const envMax = new Float64Array(npt).fill(0);
  // With the sweep evaluated anyway, the band's worst is taken from its sweep points inside the band
  // plus a two-point evaluation of the band edges (the same set as bandFrequencies).
  const { startHz, stopHz } = design.band;
  const edges = sweep ? bandScratch(sweepContext(design, stopHz > startHz ? Float64Array.of(startHz, stopHz) : Float64Array.of(startHz))) : null;
  let first = 0;
  while (first < npt && !(sweepFreqs[first] > startHz)) first++;
  let last = npt - 1;
  while (last >= 0 && !(sweepFreqs[last] < stopHz)) last--;
  let done = 0;
  let passes = 0;
  let stopped = false;
  const drawn = elements.slice();
  for (; done < trials; done++) {
    if (done % 250 === 0 && done > 0) {
      yield { trialsDone: done, passFraction: passes / done };
      if (stop()) {
        stopped = true;
        break;
      }
    }
    for (let k = 0; k < elements.length; k++) drawn[k] = elementDrawn(elements[k], prng);
    let w: number;
    if (sweep && edges) {
      const g = bandGamma(sweep, drawn);
      let w2 = 0;
      for (let i = 0; i < npt; i++) {
        const m2 = g[2 * i] * g[2 * i] + g[2 * i + 1] * g[2 * i + 1];
        const m = Math.sqrt(m2);
        if (m < envMin[i]) envMin[i] = m;
        if (m > envMax[i]) envMax[i] = m;
        if (i >= first && i <= last && !(m2 <= w2)) w2 = Number.isFinite(m2) ? m2 : 1;
      }
      w = Math.max(Math.sqrt(w2), bandWorstGamma(edges, drawn));
    } else w = bandWorstGamma(band, drawn);
    worst[done] = w;
    if (w <= gammaMax) passes++;
  }
  const ran = worst.subarray(0, done);
  const vswr = ran.map(vswrOf);

  const sensitivity: PartSensitivity[] = [];
  const sTrials = options.sensitivityTrials ?? Math.min(trials, 500);
  if (sTrials > 0 && !stopped)
    elements.forEach((e, k) => {
      if (!isVaried(e)) return;
      const p = prngSplit(seed, k);
      const alone = elements.slice();
      const ws = new Float64Array(sTrials);
      let pass = 0;
      for (let t = 0; t < sTrials; t++) {
        alone[k] = elementDrawn(e, p);
        ws[t] = bandWorstGamma(band, alone);
        if (ws[t] <= gammaMax) pass++;
      }
      ws.sort();
      sensitivity.push({ id: e.id, passFraction: pass / sTrials, worstGammaP95: percentileSorted(ws, 0.95) });
    });
  sensitivity.sort((a, b) => a.passFraction - b.passFraction || b.worstGammaP95 - a.worstGammaP95);

  return {
    trials: done,
    seed,
    passFraction: done ? passes / done : 0,
    worstVswr: percentiles(vswr),
    worstGamma: percentiles(ran),
    histogram: histogramOf(vswr, options.bins ?? 20),
    sensitivity,
    envelope: sweep && done ? { frequenciesHz: sweepFreqs, minGamma: envMin, maxGamma: envMax } : null,
    nominal: { worstGamma: nominalWorst, passes: nominalWorst <= gammaMax },
    variedIds,
    stopped,
  };
}

/** Run the yield Monte Carlo to the end (or until stopped) on this thread, reporting through `onProgress`. */
export function yieldRun(design: Design, options: YieldOptions = {}): YieldResult {
  const run = yieldSteps(design, options);
  let r = run.next();
  while (!r.done) {
    options.onProgress?.(r.value);
    r = run.next();
  }
  return r.value;
}

/** The same, yielding to the event loop every `sliceMs` (default 12) so that an AbortSignal is seen. */
export async function yieldRunAsync(design: Design, options: YieldOptions & { readonly sliceMs?: number } = {}): Promise<YieldResult> {
  const sliceMs = options.sliceMs ?? 12;
  const run = yieldSteps(design, options);
  let sliceStart = Date.now();
  let r = run.next();
  while (!r.done) {
    options.onProgress?.(r.value);
    if (Date.now() - sliceStart >= sliceMs) {
      await new Promise<void>((resolve) => setTimeout(resolve, 0));
      sliceStart = Date.now();
    }
    r = run.next();
  }
  return r.value;
}
