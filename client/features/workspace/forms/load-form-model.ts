/**
 * The load form: a fixed impedance, an RLC model (series or parallel), or a measured Touchstone
 * .s1p. Fields are engineering text; the schema checks them and turns the form into a contract
 * load.
 */
import { z } from 'zod';
import type { Load, Sweep } from '../../../../shared/rf/design';
import { parseTouchstone } from '../../../../shared/rf/touchstone';
import { frequencyRangeText } from '../figures/figure-text';
import { checkText, numberOf, optionalNumberOf, textOf } from './text-rules';

export const LOAD_FORM_KINDS = ['impedance', 'rlc', 'measured'] as const;

export const loadFormSchema = z
  .object({
    kind: z.enum(LOAD_FORM_KINDS),
    re: z.string(),
    im: z.string(),
    topology: z.enum(['series', 'parallel']),
    r: z.string(),
    l: z.string(),
    c: z.string(),
    touchstone: z.string().max(5_000_000, 'the Touchstone text is over 5 MB'),
    fileName: z.string(),
  })
  .superRefine((v, ctx) => {
    if (v.kind === 'impedance') {
      checkText(v, ctx, 're', 'Ω', { nonNegative: true });
      checkText(v, ctx, 'im', 'Ω');
    } else if (v.kind === 'rlc') {
      checkText(v, ctx, 'r', 'Ω', v.topology === 'parallel' ? { positive: true } : { nonNegative: true });
      checkText(v, ctx, 'l', 'H', { positive: true }, true);
      checkText(v, ctx, 'c', 'F', { positive: true }, true);
    } else {
      if (v.touchstone.trim() === '') {
        ctx.addIssue({ code: 'custom', path: ['touchstone'], message: 'paste the text of a .s1p file, or open one' });
        return;
      }
      try {
        parseTouchstone(v.touchstone, { ports: 1 });
      } catch (e) {
        ctx.addIssue({ code: 'custom', path: ['touchstone'], message: e instanceof Error ? e.message : 'does not parse as a .s1p file' });
      }
    }
  })
  .transform((v): Load => {
    if (v.kind === 'impedance') return { kind: 'impedance', ohms: [numberOf(v.re, 'Ω'), numberOf(v.im, 'Ω')] };
    if (v.kind === 'rlc') {
      const l = optionalNumberOf(v.l, 'H');
      const c = optionalNumberOf(v.c, 'F');
      return { kind: 'rlc', topology: v.topology, r: numberOf(v.r, 'Ω'), ...(l !== undefined ? { l } : {}), ...(c !== undefined ? { c } : {}) };
    }
    return { kind: 'measured', touchstone: v.touchstone, ...(v.fileName ? { fileName: v.fileName } : {}) };
  });

export type LoadFormValues = z.input<typeof loadFormSchema>;

export function loadFormValues(load: Load): LoadFormValues {
  const blank: LoadFormValues = { kind: 'impedance', re: '50', im: '0', topology: 'series', r: '', l: '', c: '', touchstone: '', fileName: '' };
  switch (load.kind) {
    case 'impedance':
      return { ...blank, re: textOf(load.ohms[0], 'Ω'), im: textOf(load.ohms[1], 'Ω') };
    case 'rlc':
      return { ...blank, kind: 'rlc', topology: load.topology, r: textOf(load.r, 'Ω'), l: textOf(load.l, 'H'), c: textOf(load.c, 'F') };
    case 'measured':
      return { ...blank, kind: 'measured', touchstone: load.touchstone, fileName: load.fileName ?? '' };
    case 'table':
      // A table load is edited by replacing it; the form starts from an impedance.
      return blank;
  }
}

export type SweepFit = { ok: true; sweep: Sweep | null; note: string | null } | { ok: false; message: string };

/**
 * A measured load covers a frequency range; the sweep must lie inside it. When it reaches outside
 * but the band is inside, the sweep is narrowed to the measurement (and the note says so); when the
 * band itself is outside, the load cannot be used with this band.
 */
export function sweepForMeasured(touchstone: string, sweep: Sweep, band: { startHz: number; stopHz: number }): SweepFit {
  let f: Float64Array;
  try {
    f = parseTouchstone(touchstone, { ports: 1 }).frequenciesHz;
  } catch (e) {
    return { ok: false, message: e instanceof Error ? e.message : 'does not parse' };
  }
  const lo = f[0];
  const hi = f[f.length - 1];
  const range = frequencyRangeText(lo, hi);
  if (band.startHz < lo || band.stopHz > hi)
    return { ok: false, message: `the measurement covers ${range}, which does not include the whole band; change the band first` };
  if (sweep.startHz >= lo && sweep.stopHz <= hi) return { ok: true, sweep: null, note: null };
  const narrowed: Sweep = { ...sweep, startHz: Math.max(sweep.startHz, lo), stopHz: Math.min(sweep.stopHz, hi) };
  return { ok: true, sweep: narrowed, note: `The sweep was narrowed to ${range}, the range the measurement covers.` };
}
