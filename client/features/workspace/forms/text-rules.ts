/** Checks a form's engineering-text fields inside a zod superRefine, one issue per bad field. */
import type { z } from 'zod';
import type { TunableUnit } from '../value/tunable';
import { formatValueText, parseValueText, type ParseRules } from '../value/value-text';

export function checkText<T extends Record<string, unknown>>(
  values: T,
  ctx: z.RefinementCtx,
  field: keyof T & string,
  unit: TunableUnit,
  rules: ParseRules = {},
  optional = false,
): number | undefined {
  const text = String(values[field] ?? '');
  if (optional && text.trim() === '') return undefined;
  const parsed = parseValueText(text, unit, rules);
  if (!parsed.ok) {
    ctx.addIssue({ code: 'custom', path: [field], message: parsed.message });
    return undefined;
  }
  return parsed.value;
}

/** The number in a field already checked by `checkText` (NaN if it was not). */
export function numberOf(text: string, unit: TunableUnit): number {
  const parsed = parseValueText(text, unit);
  return parsed.ok ? parsed.value : Number.NaN;
}

export function optionalNumberOf(text: string, unit: TunableUnit): number | undefined {
  return text.trim() === '' ? undefined : numberOf(text, unit);
}

/** A value as a form shows it (empty for none). */
export function textOf(value: number | undefined, unit: TunableUnit, digits = 6): string {
  return value === undefined ? '' : formatValueText(value, unit, digits);
}
