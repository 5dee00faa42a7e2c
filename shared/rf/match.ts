/**
 * The match finder: every closed-form network that matches the load (or the load plus the chain's
 * first `keep` elements) perfectly at the band centre, each evaluated across the band, offered with
 * E-series-snapped alternatives, and ranked by the worst in-band |Γ|.
 *
 * Families: L-sections (lsection.ts), pi and tee networks at chosen loaded Qs (pitee.ts), single shunt
 * stubs (stubmatch.ts), quarter-wave, binomial and Chebyshev transformers (transformers.ts), directly for
 * a real load or after the line section that makes the load real.
 */
import { bandFrequencies, chainZin, portImpedance, sweepContext } from './cascade';
import { bandCenterHz, goalMaxGamma, type Complex, type Design, type Element } from './design';
import { IMPEDANCE_OPEN_OHMS } from './complex';
import type { ESeries } from './eseries';
import { bandScratch, bandWorstGamma, reflectionFigures, type BandScratch, type ReflectionFigures } from './match-band';
import { elementsNamed } from './match-ids';
import { elementDraftsDescribed, reactiveStepElement, type ElementDraft, type ReactiveStep } from './match-steps';
import { lSections } from './lsection';
import { piNetworks, piTeeMinimumQ, teeNetworks } from './pitee';
import { chainHasSnappable, chainSnapped } from './snap';
import { stubMatches, type StubKind } from './stubmatch';
import {
  binomialFractionalBandwidth,
  binomialSectionImpedances,
  chebyshevFractionalBandwidth,
  chebyshevSectionImpedances,
  quarterWaveFractionalBandwidth,
  quarterWaveImpedance,
  realizingLines,
} from './transformers';

export interface MatchOptions {
  /** How many leading chain elements (from the load) stay in place; the networks match what they present. Default 0. */
  readonly keep?: number;
  /** Loaded Qs for pi and tee networks. Default [2, 5, 10] (those above each form's minimum Q). */
  readonly qs?: readonly number[];
  /** Impedance of the line section of stub and transformer designs (default referenceOhms). */
  readonly lineZ0?: number;
  /** Impedance of the stubs (default referenceOhms). */
  readonly stubZ0?: number;
  readonly stubKinds?: readonly StubKind[];
  /** Section counts of binomial transformers (default [2, 3]). */
  readonly binomialSections?: readonly number[];
  /** Section counts of Chebyshev transformers; odd counts only match perfectly at the centre (default [3]). */
  readonly chebyshevSections?: readonly number[];
  /** Passband ripple |Γ|m of the Chebyshev transformers (default 0.05). */
  readonly chebyshevRipple?: number;
  /** E-series offered as snapped alternatives of lumped candidates (default ['E12', 'E24']). */
  readonly snapSeries?: readonly ESeries[];
}

export type MatchFamily = 'l-section' | 'single-element' | 'pi' | 'tee' | 'stub' | 'quarter-wave' | 'binomial' | 'chebyshev';

export interface MatchFigures {
  /** Worst over the band's sweep points and edges. */
  readonly worstInBand: ReflectionFigures;
  readonly gammaAtCenter: number;
  readonly meetsGoal: boolean;
}

export interface SnappedAlternative extends MatchFigures {
  readonly series: ESeries;
  readonly elements: Element[];
}

export interface MatchCandidate extends MatchFigures {
  /** Machine name of the network form, e.g. "l-shunt-series", "pi", "stub-open", "chebyshev-3". */
  readonly topology: string;
  readonly family: MatchFamily;
  /** Readable description, e.g. "L-section: shunt C, series L". */
  readonly title: string;
  /** The whole chain, load -> port (kept elements first), to replace the design's chain. */
  readonly elements: Element[];
  readonly snapped: SnappedAlternative[];
  /** Loaded Q of a pi or tee network. */
  readonly q?: number;
  /** Fractional bandwidth at the goal that the transformer theory predicts (the transformer alone). */
  readonly theoryFractionalBandwidth?: number | null;
  readonly note?: string;
}

export interface MatchResult {
  readonly centerHz: number;
  /** What the networks see at the centre: the load, or the load plus the kept elements. */
  readonly loadOhms: Complex;
  /** The impedance a perfect match presents at the port, Zs*. */
  readonly targetOhms: Complex;
  readonly candidates: MatchCandidate[];
  /** Why there is no candidate (only when there is none). */
  readonly explanation?: string;
  /** Remarks on families that were skipped (an even Chebyshev count, a Q below the minimum ...). */
  readonly notes: string[];
}

/** A bad finder option (the command line reports it with exit status 2). */
export class MatchOptionError extends Error {
  readonly code = 'invalid-option';
  constructor(
    readonly option: string,
    readonly reason: string,
  ) {
    super(`${option}: ${reason}`);
    this.name = 'MatchOptionError';
  }
}

interface Draft {
  readonly topology: string;
  readonly family: MatchFamily;
  readonly title: string;
  readonly elements: readonly ElementDraft[];
  readonly q?: number;
  readonly theoryFractionalBandwidth?: number | null;
  readonly note?: string;
}

/** |Γ| under which the centre counts as matched (a candidate must reach it too). */
export const MATCHED_GAMMA = 1e-9;
/**
 * Limits of an ordinary load: beyond them the load lies (for any practical purpose) on the chart's edge,
 * the closed forms lose the digits a perfect match needs, and no real part would be precise enough:
 * a load Q |X|/R above 10^7, or a magnitude beyond 10^±8 times Z0 (a short or an open).
 */
const EDGE_LOAD_Q = 1e7;
const EDGE_RATIO = 1e8;

function optionCheck(design: Design, options: MatchOptions): void {
  const keep = options.keep ?? 0;
  if (!Number.isInteger(keep) || keep < 0 || keep > design.elements.length)
    throw new MatchOptionError('keep', `must be a whole number from 0 to ${design.elements.length} (the chain's length)`);
  for (const q of options.qs ?? []) if (!(q > 0) || !Number.isFinite(q)) throw new MatchOptionError('qs', 'each Q must be a positive number');
  for (const [name, v] of [['lineZ0', options.lineZ0], ['stubZ0', options.stubZ0]] as const)
    if (v !== undefined && !(v > 0 && Number.isFinite(v))) throw new MatchOptionError(name, 'must be a positive number of ohms');
  for (const [name, list] of [['binomialSections', options.binomialSections], ['chebyshevSections', options.chebyshevSections]] as const)
    for (const n of list ?? []) if (!Number.isInteger(n) || n < 1 || n > 12) throw new MatchOptionError(name, 'each count must be a whole number from 1 to 12');
  const ripple = options.chebyshevRipple;
  if (ripple !== undefined && !(ripple > 0 && ripple < 1)) throw new MatchOptionError('chebyshevRipple', 'must be a reflection magnitude between 0 and 1');
}

/** Why a load on the chart's edge (or an active one) has no lossless match; `null` for an ordinary load. */
export function edgeLoadExplanation(z: Complex, z0: number): string | null {
  const [r, x] = z;
  const mag = Math.hypot(r, x);
  if (r < 0) return 'The load has a negative resistance at the centre frequency (it is active): a passive matching network cannot match it.';
  if (mag <= z0 / EDGE_RATIO) return 'The load is a short circuit at the centre frequency: it absorbs no power, so no lossless network can match it.';
  if (mag >= z0 * EDGE_RATIO || mag >= IMPEDANCE_OPEN_OHMS * 0.999)
    return 'The load is an open circuit at the centre frequency: it absorbs no power, so no lossless network can match it.';
  if (r === 0)
    return `The load is a pure reactance (${x >= 0 ? '+' : '−'}j${Math.abs(x).toPrecision(4)} Ω) at the centre frequency: it absorbs no power, so no lossless network can match it; a resistor would only turn the reflected power into heat.`;
  if (Math.abs(x) / r > EDGE_LOAD_Q)
    return `The load is almost a pure reactance at the centre frequency (${r.toPrecision(3)} ${x >= 0 ? '+' : '−'} j${Math.abs(x).toPrecision(4)} Ω, Q ≈ ${(Math.abs(x) / r).toPrecision(2)}): a match would need parts of a precision no real part has, so none is offered.`;
  return null;
}

function stepsTitle(prefix: string, drafts: readonly ElementDraft[]): string {
  return `${prefix}: ${elementDraftsDescribed(drafts)}`;
}

function lumpedDrafts(steps: readonly ReactiveStep[], omega: number): ElementDraft[] {
  return steps.map((s) => reactiveStepElement(s, omega));
}

function lineDraft(z0: number, degrees: number, atHz: number): ElementDraft {
  return { kind: 'line', z0, length: { degrees, atHz } };
}

function lSectionDrafts(zl: Complex, zt: Complex, omega: number): Draft[] {
  return lSections(zl, zt).map((s) => {
    const elements = lumpedDrafts(s.steps, omega);
    if (elements.length === 1) {
      const place = s.steps[0].place;
      return { topology: `single-${place}`, family: 'single-element', title: stepsTitle('Single element', elements), elements, note: 'A degenerate L-section: one element suffices.' };
    }
    const topology = s.placement === 'shunt-at-load' ? 'l-shunt-series' : 'l-series-shunt';
    return { topology, family: 'l-section', title: stepsTitle('L-section', elements), elements };
  });
}

function defaultQs(minQ: number): number[] {
  const qs = [2, 5, 10].filter((q) => q > minQ * (1 + 1e-9));
  return qs.length ? qs : [Math.ceil(minQ * 1.5 * 10) / 10];
}

function piTeeDrafts(zl: Complex, zt: Complex, omega: number, options: MatchOptions, notes: string[]): Draft[] {
  const out: Draft[] = [];
  for (const form of ['pi', 'tee'] as const) {
    const minQ = piTeeMinimumQ(form, zl, zt);
    const qs = options.qs ?? defaultQs(minQ);
    for (const q of qs) {
      const sols = form === 'pi' ? piNetworks(zl, zt, q) : teeNetworks(zl, zt, q);
      if (!sols.length) {
        notes.push(`No ${form} network at Q = ${q}: the loaded Q must exceed ${minQ.toPrecision(3)} for this load.`);
        continue;
      }
      for (const s of sols) {
        if (s.steps.length < 3) continue; // a vanished middle element: the same network as an L-section
        const elements = lumpedDrafts(s.steps, omega);
        out.push({ topology: form, family: form, q, title: stepsTitle(`${form === 'pi' ? 'Pi' : 'Tee'} network, Q = ${q}`, elements), elements });
      }
    }
  }
  return out;
}

function stubDrafts(zl: Complex, zt: Complex, fc: number, lineZ0: number, stubZ0: number, kinds: readonly StubKind[]): Draft[] {
  return stubMatches(zl, zt, { lineZ0, stubZ0, kinds }).flatMap((s): Draft[] => {
    const elements: ElementDraft[] = [];
    if (s.lineDegrees > 1e-9) elements.push(lineDraft(lineZ0, s.lineDegrees, fc));
    const noStub = s.stubKind === 'open-stub' && s.stubDegrees <= 1e-9;
    if (!noStub) elements.push({ kind: s.stubKind, z0: stubZ0, length: { degrees: s.stubDegrees, atHz: fc } });
    if (!elements.length) return [];
    const stubName = s.stubKind === 'open-stub' ? 'open stub' : 'shorted stub';
    const title = noStub
      ? `Line ${s.lineDegrees.toFixed(1)}° alone`
      : `Single stub: ${s.lineDegrees > 1e-9 ? `line ${s.lineDegrees.toFixed(1)}°, ` : ''}${stubName} ${s.stubDegrees.toFixed(1)}°`;
    return [{ topology: noStub ? 'line' : `stub-${s.stubKind === 'open-stub' ? 'open' : 'short'}`, family: 'stub', title, elements }];
  });
}

function transformerDrafts(zl: Complex, zt: Complex, fc: number, gammaMax: number, lineZ0: number, options: MatchOptions, notes: string[]): Draft[] {
  const rt = zt[0];
  if (Math.abs(zt[1]) > 1e-12 * rt) {
    notes.push('Transformers were skipped: they need a real port impedance.');
    return [];
  }
  const realizations: { prefix: ElementDraft[]; r: number; how: string }[] = [];
  if (Math.abs(zl[1]) <= 1e-12 * Math.hypot(zl[0], zl[1])) realizations.push({ prefix: [], r: zl[0], how: '' });
  else
    for (const l of realizingLines(zl, lineZ0))
      realizations.push({ prefix: [lineDraft(lineZ0, l.degrees, fc)], r: l.resistance, how: `line ${l.degrees.toFixed(1)}° to R = ${l.resistance.toPrecision(4)} Ω, then ` });
  const out: Draft[] = [];
  const ripple = options.chebyshevRipple ?? 0.05;
  for (const { prefix, r, how } of realizations) {
    if (Math.abs(r / rt - 1) < 1e-12) continue;
    const after = prefix.length ? '-after-line' : '';
    const sections = (fromSource: readonly number[]) => [...prefix, ...[...fromSource].reverse().map((z) => lineDraft(z, 90, fc))];
    const z1 = quarterWaveImpedance(rt, r);
    out.push({
      topology: `quarter-wave${after}`,
      family: 'quarter-wave',
      title: `Quarter-wave transformer: ${how}${z1.toPrecision(4)} Ω λ/4`,
      elements: sections([z1]),
      theoryFractionalBandwidth: finiteOrNull(quarterWaveFractionalBandwidth(rt, r, gammaMax)),
    });
    for (const n of options.binomialSections ?? [2, 3]) {
      if (n === 1) continue; // the quarter-wave section above
      const zs = binomialSectionImpedances(rt, r, n);
      out.push({
        topology: `binomial-${n}${after}`,
        family: 'binomial',
        title: `Binomial transformer, ${n} sections: ${how}${zs.map((z) => z.toPrecision(4)).join(', ')} Ω (port side first)`,
        elements: sections(zs),
        theoryFractionalBandwidth: finiteOrNull(binomialFractionalBandwidth(rt, r, n, gammaMax)),
      });
    }
    for (const n of options.chebyshevSections ?? [3]) {
      if (n % 2 === 0) {
        notes.push(`A Chebyshev transformer of ${n} sections has a ripple peak, not a perfect match, at the centre; use an odd count.`);
        continue;
      }
      const zs = chebyshevSectionImpedances(rt, r, n, ripple);
      if (!zs) {
        notes.push(`No Chebyshev transformer at ripple ${ripple}: ${r.toPrecision(4)} Ω is already within that ripple of ${rt} Ω.`);
        continue;
      }
      out.push({
        topology: `chebyshev-${n}${after}`,
        family: 'chebyshev',
        title: `Chebyshev transformer, ${n} sections, ripple ${ripple}: ${how}${zs.map((z) => z.toPrecision(4)).join(', ')} Ω (port side first)`,
        elements: sections(zs),
        theoryFractionalBandwidth: gammaMax >= ripple ? finiteOrNull(chebyshevFractionalBandwidth(rt, r, n, ripple, gammaMax)) : null,
      });
    }
  }
  return out;
}

function finiteOrNull(v: number | null): number | null {
  return v !== null && Number.isFinite(v) ? v : null;
}

function signature(elements: readonly ElementDraft[]): string {
  return elements
    .map((e) => {
      if ('value' in e) return `${e.kind}:${e.value.toPrecision(9)}`;
      if ('z0' in e) return `${e.kind}:${e.z0.toPrecision(9)}:${'degrees' in e.length ? e.length.degrees.toPrecision(9) : e.length.meters}`;
      return e.kind;
    })
    .join('|');
}

function figuresOf(band: BandScratch, center: BandScratch, elements: readonly Element[], gammaMax: number): MatchFigures {
  const worst = bandWorstGamma(band, elements);
  return { worstInBand: reflectionFigures(worst), gammaAtCenter: bandWorstGamma(center, elements), meetsGoal: worst <= gammaMax };
}

/** The impedance seen at the centre frequency looking into the first `keep` elements and the load. */
export function matchLoadAtCenter(design: Design, keep = 0): Complex {
  const fc = bandCenterHz(design.band);
  const ctx = sweepContext(design, Float64Array.of(fc));
  const z = chainZin(ctx, design.elements.slice(0, keep));
  return [z[0], z[1]];
}

/** Find every closed-form matching network for the design, ranked by worst in-band |Γ|. */
export function findMatches(design: Design, options: MatchOptions = {}): MatchResult {
  optionCheck(design, options);
  const keep = options.keep ?? 0;
  const kept = design.elements.slice(0, keep);
  const fc = bandCenterHz(design.band);
  const omega = 2 * Math.PI * fc;
  const z0 = design.referenceOhms;
  const zs = portImpedance(design);
  const zt: Complex = [zs[0], -zs[1]];
  const zl = matchLoadAtCenter(design, keep);
  const base = { centerHz: fc, loadOhms: zl, targetOhms: zt };
  const notes: string[] = [];

  const g0 = Math.hypot(zl[0] - zt[0], zl[1] - zt[1]) / Math.hypot(zl[0] + zs[0], zl[1] + zs[1]);
  if (g0 < MATCHED_GAMMA)
    return { ...base, candidates: [], notes, explanation: 'Already matched: the load presents the port’s conjugate impedance at the centre frequency, so no network is needed.' };
  const edge = edgeLoadExplanation(zl, z0);
  if (edge) return { ...base, candidates: [], notes, explanation: edge };

  const lineZ0 = options.lineZ0 ?? z0;
  const stubZ0 = options.stubZ0 ?? z0;
  const gammaMax = goalMaxGamma(design.goal);
  const drafts: Draft[] = [
    ...lSectionDrafts(zl, zt, omega),
    ...piTeeDrafts(zl, zt, omega, options, notes),
    ...stubDrafts(zl, zt, fc, lineZ0, stubZ0, options.stubKinds ?? ['open-stub', 'short-stub']),
    ...transformerDrafts(zl, zt, fc, gammaMax, lineZ0, options, notes),
  ];

  const band = bandScratch(sweepContext(design, bandFrequencies(design)));
  const center = bandScratch(sweepContext(design, Float64Array.of(fc)));
  const seen = new Set<string>();
  const candidates: MatchCandidate[] = [];
  for (const d of drafts) {
    const sig = signature(d.elements);
    if (seen.has(sig)) continue;
    seen.add(sig);
    const elements = elementsNamed(kept, d.elements);
    const figures = figuresOf(band, center, elements, gammaMax);
    // Safety net: a candidate that is not a perfect match at the centre is never offered.
    if (!(figures.gammaAtCenter < MATCHED_GAMMA)) {
      notes.push(`${d.title} was dropped: it misses the centre (|Γ| = ${figures.gammaAtCenter.toPrecision(3)}).`);
      continue;
    }
    const snapped: SnappedAlternative[] = [];
    const added = elements.slice(keep);
    if (chainHasSnappable(added))
      for (const series of options.snapSeries ?? (['E12', 'E24'] as const)) {
        const s = chainSnapped(elements, series, (i) => i < keep);
        snapped.push({ series, elements: s, ...figuresOf(band, center, s, gammaMax) });
      }
    candidates.push({
      topology: d.topology,
      family: d.family,
      title: d.title,
      elements,
      ...figures,
      snapped,
      ...(d.q !== undefined ? { q: d.q } : {}),
      ...(d.theoryFractionalBandwidth !== undefined ? { theoryFractionalBandwidth: d.theoryFractionalBandwidth } : {}),
      ...(d.note ? { note: d.note } : {}),
    });
  }
  candidates.sort((a, b) => a.worstInBand.gamma - b.worstInBand.gamma || a.elements.length - b.elements.length);
  const result: MatchResult = { ...base, candidates, notes };
  return candidates.length
    ? result
    : { ...result, explanation: 'No closed-form network reached a perfect match at the centre frequency (see the notes): the load is too close to the chart’s edge for the values to be computed precisely.' };
}
