/**
 * The differences between two designs in words an RF engineer reads at a glance: each changed field
 * with its old and new value in engineering units ("18 pF" → "15 pF"), each added or removed element
 * as a one-line summary, and moves as "position 1 → 2". Pure.
 */
import type { DesignDiff, FieldChange } from '../../../../shared/api/design-diff';
import type { Design, Element } from '../../../../shared/rf/design';
import { formatEngineering, type Unit } from '../../../../shared/rf/units';

export type DiffKind = 'field' | 'added' | 'removed' | 'changed' | 'moved';

export interface DiffRow {
  key: string;
  kind: DiffKind;
  /** What the row is about: "Band start", "C1 (series C): value". */
  subject: string;
  /** The value in design a, or "—" where it has none. */
  before: string;
  after: string;
}

const KIND_NAMES: Record<string, string> = {
  'series-l': 'series L',
  'series-c': 'series C',
  'series-r': 'series R',
  'shunt-l': 'shunt L',
  'shunt-c': 'shunt C',
  'shunt-r': 'shunt R',
  line: 'line section',
  'open-stub': 'open stub',
  'short-stub': 'shorted stub',
  transformer: 'transformer',
  'two-port': 'measured two-port',
};

export const kindName = (kind: string): string => KIND_NAMES[kind] ?? kind;

const LOAD_KIND_NAMES: Record<string, string> = {
  impedance: 'fixed impedance',
  rlc: 'RLC model',
  measured: 'measured (Touchstone)',
  table: 'impedance table',
};

/** The unit of a lumped element's value: H for an inductor, F for a capacitor, Ω for a resistor. */
export function lumpedUnit(kind: string): Unit | null {
  if (kind.endsWith('-l')) return 'H';
  if (kind.endsWith('-c')) return 'F';
  if (kind.endsWith('-r')) return 'Ω';
  return null;
}

const TOP_LEVEL_NAMES: Record<string, string> = {
  name: 'Design name',
  referenceOhms: 'Reference impedance',
  'band.startHz': 'Band start',
  'band.stopHz': 'Band stop',
  'band.centerHz': 'Band centre',
  'sweep.startHz': 'Sweep start',
  'sweep.stopHz': 'Sweep stop',
  'sweep.points': 'Sweep points',
  'sweep.spacing': 'Sweep spacing',
  'goal.maxVswr': 'Goal: VSWR at most',
  'goal.minReturnLossDb': 'Goal: return loss at least',
  'port.impedance': 'Port impedance',
  'drive.powerW': 'Drive power',
  'substrate.epsilonR': 'Substrate εr',
  'substrate.heightM': 'Substrate height',
  'substrate.copperM': 'Copper thickness',
  'load.kind': 'Load model',
  'load.topology': 'Load RLC topology',
  'load.r': 'Load R',
  'load.l': 'Load L',
  'load.c': 'Load C',
  'load.ohms': 'Load impedance',
  'load.touchstone': 'Load measurement',
  'load.points': 'Load table',
  'load.fileName': 'Load measurement file',
  'load.uploadId': 'Load measurement upload',
};

const FIELD_NAMES: Record<string, string> = {
  value: 'value',
  q: 'Q',
  label: 'label',
  kind: 'kind',
  z0: 'Z0',
  lossDbPerM: 'loss',
  'length.degrees': 'electrical length',
  'length.atHz': 'length reference frequency',
  'length.meters': 'physical length',
  'length.velocityFactor': 'velocity factor',
  ratio: 'turns ratio',
  touchstone: 'Touchstone data',
  flipped: 'flipped',
  locked: 'locked',
  'tolerance.relative': 'tolerance',
  'tolerance.absolute': 'tolerance',
  'tolerance.distribution': 'tolerance distribution',
};

/** A dimensionless number (Q, a ratio, VSWR, εr) to four figures, never with a prefix: 0.66, 400, 1.414. */
export function plainNumber(value: number, digits = 4): string {
  if (!Number.isFinite(value)) return '—';
  return String(Number(value.toPrecision(digits)));
}

const isComplex = (v: unknown): v is [number, number] => Array.isArray(v) && v.length === 2 && v.every((x) => typeof x === 'number');

/** "18 + j8 Ω", "12 − j41 Ω". */
export function complexOhms([re, im]: [number, number]): string {
  const sign = im < 0 ? '−' : '+';
  return `${plainNumber(re)} ${sign} j${plainNumber(Math.abs(im))} Ω`;
}

function touchstoneSummary(text: string): string {
  const lines = text.split(/\r?\n/).filter((l) => l.trim() && !l.trim().startsWith('!')).length;
  return `Touchstone data (${lines} line${lines === 1 ? '' : 's'})`;
}

/** One value in words, given where it sits (`path`) and, for an element's fields, the element's kind. */
export function formatDiffValue(path: string, value: unknown, elementKind?: string): string {
  if (value === undefined || value === null) return '—';
  if (typeof value === 'boolean') return value ? 'yes' : 'no';
  if (typeof value === 'string') {
    if (path === 'touchstone' || path === 'load.touchstone') return touchstoneSummary(value);
    if (path === 'kind') return kindName(value);
    if (path === 'load.kind') return LOAD_KIND_NAMES[value] ?? value;
    // Words from a fixed list read as words, not as quoted text.
    if (path === 'load.topology' || path === 'sweep.spacing' || path === 'tolerance.distribution') return value;
    return `“${value}”`;
  }
  if (isComplex(value)) return complexOhms(value);
  if (typeof value === 'object' && !Array.isArray(value)) return objectText(path, value as Record<string, unknown>, elementKind);
  if (Array.isArray(value)) return `${value.length} point${value.length === 1 ? '' : 's'}`;
  if (typeof value !== 'number') return JSON.stringify(value);
  const digits = { digits: 4 };
  if (path === 'value' && elementKind) {
    const unit = lumpedUnit(elementKind);
    return unit ? formatEngineering(value, unit, digits) : plainNumber(value);
  }
  if (path === 'tolerance.relative') return `±${plainNumber(value * 100)} %`;
  if (path === 'tolerance.absolute') {
    const unit = elementKind ? lumpedUnit(elementKind) : null;
    return `±${unit ? formatEngineering(value, unit, digits) : plainNumber(value)}`;
  }
  if (path.endsWith('Hz')) return formatEngineering(value, 'Hz', { digits: 6 });
  if (path === 'z0' || path === 'referenceOhms' || path === 'load.r') return formatEngineering(value, 'Ω', digits);
  if (path === 'load.l') return formatEngineering(value, 'H', digits);
  if (path === 'load.c') return formatEngineering(value, 'F', digits);
  if (path === 'length.degrees') return `${plainNumber(value)}°`;
  if (path === 'length.meters' || path.endsWith('M')) return formatEngineering(value, 'm', digits);
  if (path === 'lossDbPerM') return `${plainNumber(value)} dB/m`;
  if (path === 'goal.minReturnLossDb') return formatEngineering(value, 'dB', digits);
  if (path === 'drive.powerW') return formatEngineering(value, 'W', digits);
  if (path === 'ratio') return `1 : ${plainNumber(value)}`;
  return plainNumber(value);
}

/** A whole object that one side has and the other lacks (a tolerance, a length, a drive), field by field. */
function objectText(path: string, value: Record<string, unknown>, elementKind?: string): string {
  const at = (key: string) => (path ? `${path}.${key}` : key);
  if (path === 'tolerance') {
    const amount =
      typeof value.relative === 'number' ? formatDiffValue('tolerance.relative', value.relative) : formatDiffValue('tolerance.absolute', value.absolute, elementKind);
    return value.distribution === 'normal' ? `${amount} (normal, 3σ)` : amount;
  }
  if (path === 'length') {
    if (typeof value.degrees === 'number') return `${formatDiffValue('length.degrees', value.degrees)} at ${formatDiffValue('length.atHz', value.atHz)}`;
    return `${formatDiffValue('length.meters', value.meters)}, velocity factor ${formatDiffValue('length.velocityFactor', value.velocityFactor)}`;
  }
  return Object.entries(value)
    .map(([key, v]) => `${TOP_LEVEL_NAMES[at(key)] ?? FIELD_NAMES[at(key)] ?? key} ${formatDiffValue(at(key), v, elementKind)}`)
    .join(', ');
}

/** A one-line description of an element: "series C 18 pF", "open stub Z0 50 Ω, 45° at 2.44 GHz". */
export function elementSummary(element: Element | { kind: string; [k: string]: unknown }): string {
  const e = element as Record<string, unknown> & { kind: string };
  const name = kindName(e.kind);
  const unit = lumpedUnit(e.kind);
  if (unit && typeof e.value === 'number') {
    const q = typeof e.q === 'number' ? `, Q ${plainNumber(e.q)}` : '';
    return `${name} ${formatEngineering(e.value, unit, { digits: 4 })}${q}`;
  }
  if ((e.kind === 'line' || e.kind.endsWith('-stub')) && typeof e.z0 === 'number') {
    const length = e.length as { degrees?: number; atHz?: number; meters?: number } | undefined;
    const len =
      length?.degrees !== undefined && length.atHz !== undefined
        ? `${plainNumber(length.degrees)}° at ${formatEngineering(length.atHz, 'Hz', { digits: 4 })}`
        : length?.meters !== undefined
          ? formatEngineering(length.meters, 'm', { digits: 4 })
          : '';
    return `${name} Z0 ${formatEngineering(e.z0, 'Ω', { digits: 4 })}${len ? `, ${len}` : ''}`;
  }
  if (e.kind === 'transformer' && typeof e.ratio === 'number') return `${name} 1 : ${plainNumber(e.ratio)}`;
  return name;
}

/** "C1 (series C)" when labelled, else the id: "c-series (series C)". */
export function elementName(element: { id: string; kind: string; label?: unknown }): string {
  const label = typeof element.label === 'string' && element.label.trim() ? element.label.trim() : element.id;
  return `${label} (${kindName(element.kind)})`;
}

function fieldSubject(change: FieldChange): string {
  return TOP_LEVEL_NAMES[change.path] ?? change.path;
}

/** All rows, in reading order: the design's own fields, then removed, added, changed and moved elements. */
export function diffRows(diff: DesignDiff, a: Design, b: Design): DiffRow[] {
  const rows: DiffRow[] = [];
  for (const change of diff.fields)
    rows.push({
      key: `field:${change.path}`,
      kind: 'field',
      subject: fieldSubject(change),
      before: formatDiffValue(change.path, change.old),
      after: formatDiffValue(change.path, change.new),
    });
  for (const placed of diff.removed)
    rows.push({
      key: `removed:${placed.id}`,
      kind: 'removed',
      subject: `${elementName(placed.element)} removed`,
      before: `${elementSummary(placed.element)} (position ${placed.index + 1})`,
      after: '—',
    });
  for (const placed of diff.added)
    rows.push({
      key: `added:${placed.id}`,
      kind: 'added',
      subject: `${elementName(placed.element)} added`,
      before: '—',
      after: `${elementSummary(placed.element)} (position ${placed.index + 1})`,
    });
  const byIdA = new Map(a.elements.map((e) => [e.id, e]));
  const byIdB = new Map(b.elements.map((e) => [e.id, e]));
  for (const element of diff.changed) {
    const before = byIdA.get(element.id);
    const after = byIdB.get(element.id) ?? before;
    const name = after ? elementName(after) : element.id;
    for (const change of element.changes)
      rows.push({
        key: `changed:${element.id}:${change.path}`,
        kind: 'changed',
        subject: `${name}: ${FIELD_NAMES[change.path] ?? change.path}`,
        before: formatDiffValue(change.path, change.old, before?.kind ?? element.kind),
        after: formatDiffValue(change.path, change.new, element.kind),
      });
  }
  for (const move of diff.moved) {
    const element = byIdB.get(move.id);
    rows.push({
      key: `moved:${move.id}`,
      kind: 'moved',
      subject: `${element ? elementName(element) : move.id} moved`,
      before: `position ${move.fromIndex + 1}`,
      after: `position ${move.toIndex + 1}`,
    });
  }
  return rows;
}
