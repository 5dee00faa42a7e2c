/**
 * Values as the user types and reads them: engineering notation with units ("3.3n", "2.2 pF",
 * "4k7", "45°"), parsed into SI numbers and formatted back. Parsing never throws: it gives the
 * value or one sentence saying what is wrong, to show beside the field.
 */
import { formatEngineering, parseEngineering, UnitError, type Unit } from '../../../../shared/rf/units';
import type { TunableUnit } from './tunable';

export type ParsedValue = { ok: true; value: number } | { ok: false; message: string };

export interface ParseRules {
  /** reject zero and negatives (part values, frequencies) */
  positive?: boolean;
  /** reject negatives only */
  nonNegative?: boolean;
  /** inclusive bounds, with the sentence used when crossed */
  min?: number;
  max?: number;
}

const UNIT_WORDS: Record<string, string> = {
  H: 'henries',
  F: 'farads',
  Ω: 'ohms',
  Hz: 'hertz',
  m: 'metres',
  W: 'watts',
  dB: 'decibels',
  '°': 'degrees',
  '': 'a number',
};

function describeUnit(unit: TunableUnit): string {
  return UNIT_WORDS[unit] ?? unit;
}

const DEGREES = /^([+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?)\s*(?:°|deg|degrees?)?$/i;

function parseDegrees(text: string): ParsedValue {
  const m = DEGREES.exec(text.trim());
  if (!m) return { ok: false, message: text.trim() === '' ? 'enter a length in degrees' : `"${text.trim()}" is not a number of degrees` };
  return { ok: true, value: Number(m[1]) };
}

/** Parses `text` as a value in `unit`, applying `rules`. */
export function parseValueText(text: string, unit: TunableUnit, rules: ParseRules = {}): ParsedValue {
  let parsed: ParsedValue;
  if (unit === '°') parsed = parseDegrees(text);
  else {
    try {
      parsed = { ok: true, value: parseEngineering(text, unit as Unit) };
    } catch (e) {
      parsed = { ok: false, message: e instanceof UnitError ? e.message : 'not a value' };
    }
  }
  if (!parsed.ok) return parsed;
  const v = parsed.value;
  const what = describeUnit(unit);
  if (!Number.isFinite(v)) return { ok: false, message: 'must be a finite number' };
  if (rules.positive && !(v > 0)) return { ok: false, message: `must be more than 0 ${unit === '' ? '' : what}`.trim() };
  if (rules.nonNegative && v < 0) return { ok: false, message: 'must not be negative' };
  if (rules.min !== undefined && v < rules.min) return { ok: false, message: `must be at least ${formatValueText(rules.min, unit)}` };
  if (rules.max !== undefined && v > rules.max) return { ok: false, message: `must be at most ${formatValueText(rules.max, unit)}` };
  return parsed;
}

/** Trailing zeros dropped: 45.50 -> "45.5". */
function plain(value: number, digits: number): string {
  const s = Number(value.toPrecision(digits)).toString();
  return s.includes('e') ? value.toPrecision(digits) : s;
}

/**
 * Formats a value for an input or a label. Four significant figures by default, so that values
 * tuned in steps (which are kept to four figures) show exactly what the document holds.
 */
export function formatValueText(value: number, unit: TunableUnit, digits = 4): string {
  if (!Number.isFinite(value)) return '—';
  if (unit === '°') return `${plain(value, Math.max(digits, 3))}°`;
  if (unit === '') return plain(value, digits);
  return formatEngineering(value, unit, { digits });
}
