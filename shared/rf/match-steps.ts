/**
 * Reactive steps: the closed-form matching recipes (L-sections, pi, tee) first produce a list of
 * reactances and susceptances at the centre frequency, in chain order (load -> port). This module
 * merges and prunes them and turns them into chain elements (series/shunt L or C) at a frequency.
 */
import type { Element } from './design';

/** A series reactance `x` (Ω) or a shunt susceptance `b` (S), at the design frequency. */
export type ReactiveStep = { readonly place: 'series'; readonly x: number } | { readonly place: 'shunt'; readonly b: number };

/** An element before it gets its id (the finder names elements once the chain is complete). */
type DistributiveOmit<T, K extends PropertyKey> = T extends unknown ? Omit<T, K> : never;
export type ElementDraft = DistributiveOmit<Element, 'id'>;

/**
 * Adjacent steps of the same placement add (two series reactances in a row are one reactance, two
 * shunt susceptances one susceptance); a step whose magnitude is below `epsilon` times its scale
 * (`zScale` ohms, `1/zScale` siemens) vanishes, which is how a degenerate L-section becomes one element.
 */
export function reactiveStepsMerged(steps: readonly ReactiveStep[], zScale: number, epsilon = 1e-10): ReactiveStep[] {
  const out: ReactiveStep[] = [];
  for (const s of steps) {
    const last = out[out.length - 1];
    if (last && last.place === 'series' && s.place === 'series') out[out.length - 1] = { place: 'series', x: last.x + s.x };
    else if (last && last.place === 'shunt' && s.place === 'shunt') out[out.length - 1] = { place: 'shunt', b: last.b + s.b };
    else out.push(s);
  }
  return out.filter((s) => (s.place === 'series' ? Math.abs(s.x) > epsilon * zScale : Math.abs(s.b) * zScale > epsilon));
}

/**
 * The element realising a step at angular frequency `omega`: X > 0 is a series L = X/ω, X < 0 a series
 * C = −1/(ωX); B > 0 is a shunt C = B/ω, B < 0 a shunt L = −1/(ωB) (common practice).
 */
export type ReactiveDraft = Extract<ElementDraft, { kind: 'series-l' | 'series-c' | 'shunt-l' | 'shunt-c' }>;

export function reactiveStepElement(step: ReactiveStep, omega: number): ReactiveDraft {
  if (step.place === 'series')
    return step.x > 0 ? { kind: 'series-l', value: step.x / omega } : { kind: 'series-c', value: -1 / (omega * step.x) };
  return step.b > 0 ? { kind: 'shunt-c', value: step.b / omega } : { kind: 'shunt-l', value: -1 / (omega * step.b) };
}

/** The reactance (series) or susceptance (shunt) of a lumped L or C at `omega`; `null` for other kinds. */
export function reactiveStepOf(e: ElementDraft, omega: number): ReactiveStep | null {
  switch (e.kind) {
    case 'series-l':
      return { place: 'series', x: omega * e.value };
    case 'series-c':
      return { place: 'series', x: -1 / (omega * e.value) };
    case 'shunt-c':
      return { place: 'shunt', b: omega * e.value };
    case 'shunt-l':
      return { place: 'shunt', b: -1 / (omega * e.value) };
    default:
      return null;
  }
}

/** A short, readable description of a chain of drafts, load -> port: "shunt C, series L". */
export function elementDraftsDescribed(elements: readonly ElementDraft[]): string {
  return elements
    .map((e) => {
      switch (e.kind) {
        case 'series-l':
          return 'series L';
        case 'series-c':
          return 'series C';
        case 'shunt-l':
          return 'shunt L';
        case 'shunt-c':
          return 'shunt C';
        case 'series-r':
          return 'series R';
        case 'shunt-r':
          return 'shunt R';
        case 'line':
          return 'line';
        case 'open-stub':
          return 'open stub';
        case 'short-stub':
          return 'shorted stub';
        case 'transformer':
          return 'transformer';
        default:
          return 'two-port';
      }
    })
    .join(', ');
}
