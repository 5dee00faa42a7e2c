/**
 * The bill of materials of the hand-off pack: one row per lumped part (series/shunt L, C, R) of the
 * chain, load end first, with its exact value, the nearest value of a preferred-number series, its
 * tolerance and Q, and the peak voltage and current it sees at the room's drive power (from
 * `analyze().stressAtCenter`; empty without a drive). `bomCsv` writes it as RFC 4180 CSV.
 */
import { elementDesignators, elementKindWord } from '../collab/describe';
import { isLumped, type Design, type LumpedElement, type Tolerance } from '../rf/design';
import { nearestPreferred, type ESeries } from '../rf/eseries';
import type { ElementStress } from '../rf/stress';
import { formatEngineering, type Unit } from '../rf/units';
import { csvDocument, csvText } from './csv';

/** The series the pack may round to (the `?series=` query). */
export const BOM_SERIES = ['E12', 'E24', 'E48', 'E96'] as const;
export type BomSeries = (typeof BOM_SERIES)[number];

/** Which series each kind of part is rounded to. */
export interface BomSeriesChoice {
  inductor: ESeries;
  capacitor: ESeries;
  resistor: ESeries;
}

/** E24 for inductors and capacitors, E96 for resistors (1 % parts; common practice). */
export const DEFAULT_BOM_SERIES: Readonly<BomSeriesChoice> = Object.freeze({ inductor: 'E24', capacitor: 'E24', resistor: 'E96' });

/** One series for every part (what `?series=E12` asks for). */
export function bomSeriesFor(series: BomSeries | undefined): BomSeriesChoice {
  return series ? { inductor: series, capacitor: series, resistor: series } : { ...DEFAULT_BOM_SERIES };
}

export interface BomRow {
  /** Reference designator: the label, else the letter and count from the load end (C1, L2). */
  ref: string;
  id: string;
  label: string | null;
  kind: LumpedElement['kind'];
  /** "series C", "shunt L", ... */
  kindWord: string;
  unit: 'H' | 'F' | 'Ω';
  value: number;
  series: ESeries;
  nearest: number;
  /** nearest / value − 1 */
  nearestOffset: number;
  tolerance: Tolerance | null;
  toleranceText: string;
  q: number | null;
  /** At the drive power and the band centre; null without a drive. */
  driveW: number | null;
  voltagePeak: number | null;
  currentPeak: number | null;
}

export function partUnit(kind: LumpedElement['kind']): 'H' | 'F' | 'Ω' {
  return kind.endsWith('-l') ? 'H' : kind.endsWith('-c') ? 'F' : 'Ω';
}

function seriesForUnit(unit: 'H' | 'F' | 'Ω', choice: BomSeriesChoice): ESeries {
  return unit === 'H' ? choice.inductor : unit === 'F' ? choice.capacitor : choice.resistor;
}

/** "±5 %", "±100 fF", "±5 % (normal, 3σ)"; "" without a tolerance. */
export function toleranceText(t: Tolerance | undefined | null, unit: Unit): string {
  if (!t) return '';
  const spread =
    t.relative !== undefined
      ? `±${String(Number((t.relative * 100).toPrecision(4)))} %`
      : `±${formatEngineering(t.absolute ?? 0, unit)}`;
  return t.distribution === 'normal' ? `${spread} (normal, 3σ)` : spread;
}

export function bomRows(design: Design, stress: readonly ElementStress[] | null, choice: BomSeriesChoice = DEFAULT_BOM_SERIES): BomRow[] {
  const refs = elementDesignators(design.elements as unknown as Record<string, unknown>[]);
  const byId = new Map((stress ?? []).map((s) => [s.id, s]));
  const driveW = stress && design.drive ? design.drive.powerW : null;
  return design.elements.filter(isLumped).map((e) => {
    const unit = partUnit(e.kind);
    const series = seriesForUnit(unit, choice);
    const nearest = nearestPreferred(e.value, series);
    const st = byId.get(e.id);
    return {
      ref: refs.get(e.id) ?? e.id,
      id: e.id,
      label: e.label?.trim() ? e.label : null,
      kind: e.kind,
      kindWord: elementKindWord(e.kind),
      unit,
      value: e.value,
      series,
      nearest,
      nearestOffset: nearest / e.value - 1,
      tolerance: e.tolerance ?? null,
      toleranceText: toleranceText(e.tolerance, unit),
      q: e.q ?? null,
      driveW,
      voltagePeak: st && driveW !== null ? st.voltagePeak : null,
      currentPeak: st && driveW !== null ? st.currentPeak : null,
    };
  });
}

export const BOM_HEADER = [
  'ref',
  'id',
  'label',
  'kind',
  'unit',
  'exact value',
  'exact value (SI: H, F or Ω)',
  'E-series',
  'nearest E-series value',
  'nearest E-series value (SI: H, F or Ω)',
  'nearest vs exact (%)',
  'tolerance',
  'Q (empty = ideal)',
  'drive power (W)',
  'peak voltage at drive (V)',
  'peak current at drive (A)',
] as const;

const sig = (x: number, digits: number) => Number(x.toPrecision(digits));

export function bomCsv(rows: readonly BomRow[]): string {
  return csvDocument(
    BOM_HEADER,
    rows.map((r) => [
      csvText(r.ref),
      csvText(r.id),
      csvText(r.label ?? ''),
      r.kindWord,
      r.unit,
      formatEngineering(r.value, r.unit, { digits: 4 }),
      r.value,
      r.series,
      formatEngineering(r.nearest, r.unit, { digits: 3 }),
      r.nearest,
      sig(r.nearestOffset * 100, 3),
      r.toleranceText,
      r.q,
      r.driveW,
      r.voltagePeak === null ? null : sig(r.voltagePeak, 6),
      r.currentPeak === null ? null : sig(r.currentPeak, 6),
    ]),
  );
}
