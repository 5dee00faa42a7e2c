/**
 * The band form (band, sweep, goal) and the port form (reference and port impedance, drive power,
 * board): engineering text in, contract fields out.
 */
import { z } from 'zod';
import type { Design } from '../../../../shared/rf/design';
import { checkText, numberOf, optionalNumberOf, textOf } from './text-rules';

export const bandFormSchema = z
  .object({
    bandStart: z.string(),
    bandStop: z.string(),
    center: z.string(),
    sweepStart: z.string(),
    sweepStop: z.string(),
    points: z.string(),
    spacing: z.enum(['linear', 'log']),
    goalKind: z.enum(['vswr', 'return-loss']),
    goalValue: z.string(),
  })
  .superRefine((v, ctx) => {
    const a = checkText(v, ctx, 'bandStart', 'Hz', { positive: true });
    const b = checkText(v, ctx, 'bandStop', 'Hz', { positive: true });
    const c = checkText(v, ctx, 'center', 'Hz', { positive: true }, true);
    const s0 = checkText(v, ctx, 'sweepStart', 'Hz', { positive: true });
    const s1 = checkText(v, ctx, 'sweepStop', 'Hz', { positive: true });
    const n = checkText(v, ctx, 'points', '', { min: 2, max: 100_001 });
    if (n !== undefined && !Number.isInteger(n)) ctx.addIssue({ code: 'custom', path: ['points'], message: 'must be a whole number of points' });
    if (v.goalKind === 'vswr') {
      const g = checkText(v, ctx, 'goalValue', '');
      if (g !== undefined && !(g > 1)) ctx.addIssue({ code: 'custom', path: ['goalValue'], message: 'a VSWR goal must be more than 1 (e.g. 2)' });
    } else checkText(v, ctx, 'goalValue', 'dB', { positive: true });
    if (a !== undefined && b !== undefined && b < a) ctx.addIssue({ code: 'custom', path: ['bandStop'], message: 'must not be below the band start' });
    if (c !== undefined && a !== undefined && b !== undefined && (c < a || c > b))
      ctx.addIssue({ code: 'custom', path: ['center'], message: 'must lie inside the band' });
    if (s0 !== undefined && s1 !== undefined && !(s1 > s0)) ctx.addIssue({ code: 'custom', path: ['sweepStop'], message: 'must be above the sweep start' });
  })
  .transform((v): Pick<Design, 'band' | 'sweep' | 'goal'> => {
    const center = optionalNumberOf(v.center, 'Hz');
    return {
      band: { startHz: numberOf(v.bandStart, 'Hz'), stopHz: numberOf(v.bandStop, 'Hz'), ...(center !== undefined ? { centerHz: center } : {}) },
      sweep: {
        startHz: numberOf(v.sweepStart, 'Hz'),
        stopHz: numberOf(v.sweepStop, 'Hz'),
        points: Math.round(numberOf(v.points, '')),
        spacing: v.spacing,
      },
      goal: v.goalKind === 'vswr' ? { maxVswr: numberOf(v.goalValue, '') } : { minReturnLossDb: numberOf(v.goalValue, 'dB') },
    };
  });

export type BandFormValues = z.input<typeof bandFormSchema>;

export function bandFormValues(d: Pick<Design, 'band' | 'sweep' | 'goal'>): BandFormValues {
  return {
    bandStart: textOf(d.band.startHz, 'Hz'),
    bandStop: textOf(d.band.stopHz, 'Hz'),
    center: textOf(d.band.centerHz, 'Hz'),
    sweepStart: textOf(d.sweep.startHz, 'Hz'),
    sweepStop: textOf(d.sweep.stopHz, 'Hz'),
    points: String(d.sweep.points),
    spacing: d.sweep.spacing ?? 'linear',
    goalKind: 'maxVswr' in d.goal ? 'vswr' : 'return-loss',
    goalValue: 'maxVswr' in d.goal ? textOf(d.goal.maxVswr, '') : textOf(d.goal.minReturnLossDb, 'dB').replace(/ ?dB$/, ''),
  };
}

export const portFormSchema = z
  .object({
    reference: z.string(),
    portRe: z.string(),
    portIm: z.string(),
    power: z.string(),
    epsilonR: z.string(),
    height: z.string(),
  })
  .superRefine((v, ctx) => {
    checkText(v, ctx, 'reference', 'Ω', { positive: true });
    const re = checkText(v, ctx, 'portRe', 'Ω', { positive: true }, true);
    const im = checkText(v, ctx, 'portIm', 'Ω', {}, true);
    if (re === undefined && im !== undefined && v.portRe.trim() === '')
      ctx.addIssue({ code: 'custom', path: ['portRe'], message: 'give the real part too (or leave both empty for the reference)' });
    checkText(v, ctx, 'power', 'W', { nonNegative: true }, true);
    const er = checkText(v, ctx, 'epsilonR', '', { min: 1 }, true);
    const h = checkText(v, ctx, 'height', 'm', { positive: true }, true);
    if ((er === undefined) !== (h === undefined) && (v.epsilonR.trim() === '') !== (v.height.trim() === ''))
      ctx.addIssue({ code: 'custom', path: [v.epsilonR.trim() === '' ? 'epsilonR' : 'height'], message: 'give both the permittivity and the height, or neither' });
  })
  .transform((v): Pick<Design, 'referenceOhms' | 'port' | 'drive' | 'substrate'> => {
    const re = optionalNumberOf(v.portRe, 'Ω');
    const power = optionalNumberOf(v.power, 'W');
    const er = optionalNumberOf(v.epsilonR, '');
    const h = optionalNumberOf(v.height, 'm');
    return {
      referenceOhms: numberOf(v.reference, 'Ω'),
      port: re !== undefined ? { impedance: [re, optionalNumberOf(v.portIm, 'Ω') ?? 0] } : undefined,
      drive: power !== undefined ? { powerW: power } : undefined,
      substrate: er !== undefined && h !== undefined ? { epsilonR: er, heightM: h } : undefined,
    };
  });

export type PortFormValues = z.input<typeof portFormSchema>;

export function portFormValues(d: Pick<Design, 'referenceOhms' | 'port' | 'drive' | 'substrate'>): PortFormValues {
  return {
    reference: textOf(d.referenceOhms, 'Ω'),
    portRe: d.port ? textOf(d.port.impedance[0], 'Ω') : '',
    portIm: d.port ? textOf(d.port.impedance[1], 'Ω') : '',
    power: textOf(d.drive?.powerW, 'W'),
    epsilonR: d.substrate ? textOf(d.substrate.epsilonR, '') : '',
    height: d.substrate ? textOf(d.substrate.heightM, 'm') : '',
  };
}
