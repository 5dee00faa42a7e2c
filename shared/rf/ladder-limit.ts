/**
 * The N-element part of the limit gauge: the widest band a matching ladder of a given order can reach
 * for a load that behaves like a parallel RC, series RC, parallel RL or series RL, next to the
 * Bode–Fano bound that no finite network reaches.
 *
 * Method (Fano's equal-ripple solution for an RC load; Fano, J. Franklin Inst. 249, 1950, and
 * Matthaei, Young & Jones, Microwave Filters, Impedance-Matching Networks, and Coupling Structures,
 * §4.09 — cited from memory, and re-derived here): a low-pass prototype of order n (n reactances,
 * the load's own one first) with a Chebyshev response |Γ|² = (K² + ε²T_n²)/(1 + ε²T_n²) has its poles
 * on the ellipse sinh a = sinh(asinh(1/ε)/n) ... and its reflection zeros on the ellipse of
 * b = asinh(K/ε)/n. The load's reactance fixes the sum of their real parts (the first coefficient of
 * Γ at high frequency): sinh a − sinh b = 2 sin(π/2n)·δ, with the load decrement δ = 1/(ω_c R C);
 * the passband maximum is |Γ|max = cosh(nb)/cosh(na). For a goal |Γ|max the smallest decrement over
 * b ≥ 0 gives the widest band. As n → ∞ this tends to δ = ln(1/Γm)/π, the Bode–Fano limit.
 *
 * Band-pass: the low-pass-to-band-pass mapping turns the decrement into δ = 1/(w·Q_L), where w is the
 * fractional bandwidth and Q_L the load's Q at the centre (ω0RC for a parallel RC, 1/(ω0RC) for a
 * series RC, R/(ω0L) and ω0L/R for the RL forms), so w_n = 1/(δ_n·Q_L). A band-pass ladder of order n
 * uses the load's reactance plus 2n − 1 parts (one resonates the load, two per further resonator),
 * and one more where the impedance level must change (the ideal transformer of the prototype): so
 * N = 2n parts reach about the order-n figure. This is the narrow-band picture; refine can sometimes
 * beat it slightly with unsymmetric ladders, and it is an estimate, not a proof, for small N.
 */
import { bandCenterHz, goalMaxGamma, type Design } from './design';
import { loadQFit } from './limit';

export type LadderLoadModel = 'parallel-rc' | 'series-rc' | 'parallel-rl' | 'series-rl';

export interface PrototypeSolution {
  /** Order of the low-pass prototype (reactances, the load's included). */
  readonly order: number;
  /** Smallest load decrement 1/(ω_c R C) that reaches the goal. */
  readonly decrement: number;
  readonly a: number;
  readonly b: number;
}

/** Decrement needed by an order-n equal-ripple match for zeros parameter b and goal gammaMax. */
function decrementAt(n: number, gammaMax: number, b: number): number {
  const a = Math.acosh(Math.cosh(n * b) / gammaMax) / n;
  return (Math.sinh(a) - Math.sinh(b)) / (2 * Math.sin(Math.PI / (2 * n)));
}

/** The smallest decrement with which an order-n ladder keeps |Γ| ≤ gammaMax over the whole pass band. */
export function prototypeMinimumDecrement(n: number, gammaMax: number): PrototypeSolution {
  if (!Number.isInteger(n) || n < 1) throw new RangeError('order must be a whole number ≥ 1');
  if (!(gammaMax > 0 && gammaMax < 1)) throw new RangeError('gammaMax must lie between 0 and 1');
  // scan, then golden-section refine around the best scan point
  const bMax = (Math.acosh(1 / gammaMax) + 4) / n + 2;
  const steps = 400;
  let bi = 0;
  let best = Infinity;
  for (let i = 0; i <= steps; i++) {
    const v = decrementAt(n, gammaMax, (bMax * i) / steps);
    if (v < best) {
      best = v;
      bi = i;
    }
  }
  let lo = (bMax * Math.max(0, bi - 1)) / steps;
  let hi = (bMax * Math.min(steps, bi + 1)) / steps;
  const phi = (Math.sqrt(5) - 1) / 2;
  for (let k = 0; k < 100; k++) {
    const m1 = hi - phi * (hi - lo);
    const m2 = lo + phi * (hi - lo);
    if (decrementAt(n, gammaMax, m1) <= decrementAt(n, gammaMax, m2)) hi = m2;
    else lo = m1;
  }
  const b = (lo + hi) / 2;
  const delta = Math.min(best, decrementAt(n, gammaMax, b));
  return { order: n, decrement: delta, a: Math.acosh(Math.cosh(n * b) / gammaMax) / n, b };
}

/** The Bode–Fano decrement ln(1/Γm)/π (n → ∞). */
export function bodeFanoDecrement(gammaMax: number): number {
  return Math.log(1 / gammaMax) / Math.PI;
}

/** Load Q at the centre for each model. */
export function ladderLoadQ(model: LadderLoadModel, r: number, reactive: number, centerHz: number): number {
  const w = 2 * Math.PI * centerHz;
  switch (model) {
    case 'parallel-rc':
      return w * r * reactive;
    case 'series-rc':
      return 1 / (w * r * reactive);
    case 'parallel-rl':
      return r / (w * reactive);
    case 'series-rl':
      return (w * reactive) / r;
  }
}

export interface LadderLimitRow {
  readonly order: number;
  /** Parts of a band-pass ladder of this order, including one for an impedance-level change. */
  readonly parts: number;
  readonly maxFractional: number;
  /** maxFractional over the Bode–Fano bound (always below 1). */
  readonly ofBodeFano: number;
}

export interface LadderLimit {
  readonly loadQ: number;
  readonly gammaMax: number;
  readonly bodeFanoFractional: number;
  readonly rows: LadderLimitRow[];
}

/** Widest fractional bandwidth per ladder order 1..maxOrder for a load of Q `loadQ` and goal `gammaMax`. */
export function ladderLimit(loadQ: number, gammaMax: number, maxOrder = 6): LadderLimit {
  if (!(loadQ > 0) || !Number.isFinite(loadQ)) throw new RangeError('loadQ must be a positive number');
  const bodeFanoFractional = 1 / (bodeFanoDecrement(gammaMax) * loadQ);
  const rows: LadderLimitRow[] = [];
  for (let n = 1; n <= maxOrder; n++) {
    const w = 1 / (prototypeMinimumDecrement(n, gammaMax).decrement * loadQ);
    rows.push({ order: n, parts: 2 * n, maxFractional: w, ofBodeFano: w / bodeFanoFractional });
  }
  return { loadQ, gammaMax, bodeFanoFractional, rows };
}

/**
 * The same gauge from the analysis's Bode–Fano figure (`limit.maxFractional`, CONTRACT §3): since
 * maxFractional = π/(Q_L ln(1/Γm)), the load Q follows without refitting the load.
 */
export function ladderLimitFromBodeFano(bodeFanoFractional: number, gammaMax: number, maxOrder = 6): LadderLimit {
  const loadQ = 1 / (bodeFanoDecrement(gammaMax) * bodeFanoFractional);
  return ladderLimit(loadQ, gammaMax, maxOrder);
}

/** The ladder order whose figure a chain of `parts` matching parts can expect (N = 2n; at least 1). */
export function ladderOrderForParts(parts: number): number {
  return Math.max(1, Math.floor(parts / 2));
}

/** Smallest |Γ|max an order-n equal-ripple ladder reaches at load decrement `decrement` (the inverse problem). */
export function prototypeMinimumGamma(n: number, decrement: number): number {
  if (!Number.isInteger(n) || n < 1) throw new RangeError('order must be a whole number ≥ 1');
  if (!(decrement > 0)) throw new RangeError('decrement must be positive');
  const s = 2 * Math.sin(Math.PI / (2 * n)) * decrement;
  const gammaAt = (b: number) => Math.cosh(n * b) / Math.cosh(n * Math.asinh(Math.sinh(b) + s));
  const bMax = 10 / n + 2;
  const steps = 400;
  let bi = 0;
  let best = Infinity;
  for (let i = 0; i <= steps; i++) {
    const v = gammaAt((bMax * i) / steps);
    if (v < best) {
      best = v;
      bi = i;
    }
  }
  let lo = (bMax * Math.max(0, bi - 1)) / steps;
  let hi = (bMax * Math.min(steps, bi + 1)) / steps;
  const phi = (Math.sqrt(5) - 1) / 2;
  for (let k = 0; k < 100; k++) {
    const m1 = hi - phi * (hi - lo);
    const m2 = lo + phi * (hi - lo);
    if (gammaAt(m1) <= gammaAt(m2)) hi = m2;
    else lo = m1;
  }
  return Math.min(best, gammaAt((lo + hi) / 2));
}

/** Best worst-in-band |Γ| an order-n band-pass ladder can reach for load Q `loadQ` over fractional bandwidth `fractional`. */
export function ladderBestGamma(loadQ: number, fractional: number, n: number): number {
  return prototypeMinimumGamma(n, 1 / (fractional * loadQ));
}

/**
 * The gauge for a design: the analysis core's load model fitted at the band centre (limit.ts
 * `loadQFit`) and the goal's |Γ|max; `null` where no RC/RL model applies.
 */
export function ladderLimitForDesign(design: Design, maxOrder = 6): (LadderLimit & { readonly model: LadderLoadModel }) | null {
  const fit = loadQFit(design, bandCenterHz(design.band));
  if (!fit || !(fit.q > 0) || !Number.isFinite(fit.q)) return null;
  return { model: fit.model, ...ladderLimit(fit.q, goalMaxGamma(design.goal), maxOrder) };
}
