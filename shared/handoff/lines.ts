/**
 * Line dimensions of the hand-off pack: every line section and stub of the chain as a microstrip on the
 * room's substrate (or the assumed FR-4, see substrate.ts): strip width for its Z0, and the physical
 * length that keeps its electrical length at the band centre. Quasi-static Hammerstad–Jensen model
 * (shared/rf/microstrip.ts), no dispersion.
 *
 * Electrical length at the centre fc: `{degrees, atHz}` gives degrees·fc/atHz; `{meters, velocityFactor}`
 * gives 360·meters·fc/(v·c). The microstrip length is that angle at fc on the strip's εeff, so a design
 * line given in metres of coax (v = 0.66) comes out shorter or longer on the board, as it must.
 */
import { elementDesignators, elementKindWord } from '../collab/describe';
import { bandCenterHz, isLine, type Design, type LineElement } from '../rf/design';
import { MicrostripError, microstripPhysicalLength, microstripSynthesize } from '../rf/microstrip';
import { formatEngineering } from '../rf/units';
import { csvDocument, csvText } from './csv';
import { substrateOf, type SubstrateChoice } from './substrate';

const SPEED_OF_LIGHT = 299_792_458;

export const LINE_MODEL = 'microstrip, quasi-static (Hammerstad and Jensen 1980), no dispersion';

export interface LineRow {
  ref: string;
  id: string;
  label: string | null;
  kind: LineElement['kind'];
  kindWord: string;
  z0: number;
  /** "90° at 2.44 GHz" or "12.3 mm at velocity factor 0.66" (as the design gives it). */
  designLength: string;
  centerHz: number;
  degreesAtCenter: number;
  epsilonEff: number | null;
  widthM: number | null;
  lengthM: number | null;
  lossDbPerM: number;
  note: string;
}

export interface LineTable {
  substrate: SubstrateChoice;
  rows: LineRow[];
}

/** Electrical length in degrees at `hz`. */
export function lineDegreesAt(e: LineElement, hz: number): number {
  const l = e.length;
  if ('degrees' in l) return (l.degrees * hz) / l.atHz;
  return (360 * l.meters * hz) / (l.velocityFactor * SPEED_OF_LIGHT);
}

function designLengthText(e: LineElement): string {
  const l = e.length;
  if ('degrees' in l) return `${String(Number(l.degrees.toPrecision(6)))}° at ${formatEngineering(l.atHz, 'Hz', { digits: 6 })}`;
  return `${formatEngineering(l.meters, 'm', { digits: 5 })} at velocity factor ${String(l.velocityFactor)}`;
}

function kindNote(kind: LineElement['kind']): string {
  if (kind === 'open-stub') return 'open end: the fringing-field end extension is not subtracted';
  if (kind === 'short-stub') return 'length to the short (via centre); via inductance not included';
  return '';
}

export function lineTable(design: Design): LineTable {
  const substrate = substrateOf(design);
  const refs = elementDesignators(design.elements as unknown as Record<string, unknown>[]);
  const centerHz = bandCenterHz(design.band);
  const rows = design.elements.filter(isLine).map((e): LineRow => {
    const degreesAtCenter = lineDegreesAt(e, centerHz);
    let epsilonEff: number | null = null;
    let widthM: number | null = null;
    let lengthM: number | null = null;
    let note = kindNote(e.kind);
    try {
      const strip = microstripSynthesize(e.z0, substrate.substrate);
      epsilonEff = strip.epsilonEff;
      widthM = strip.widthM;
      lengthM = microstripPhysicalLength(degreesAtCenter, centerHz, strip.epsilonEff);
    } catch (err) {
      if (!(err instanceof MicrostripError)) throw err;
      note = [err.message, note].filter(Boolean).join('; ');
    }
    return {
      ref: refs.get(e.id) ?? e.id,
      id: e.id,
      label: e.label?.trim() ? e.label : null,
      kind: e.kind,
      kindWord: elementKindWord(e.kind),
      z0: e.z0,
      designLength: designLengthText(e),
      centerHz,
      degreesAtCenter,
      epsilonEff,
      widthM,
      lengthM,
      lossDbPerM: e.lossDbPerM ?? 0,
      note,
    };
  });
  return { substrate, rows };
}

export const LINES_HEADER = [
  'ref',
  'id',
  'label',
  'kind',
  'Z0 (Ω)',
  'length in the design',
  'electrical length at centre (°)',
  'centre frequency (Hz)',
  'εeff',
  'width (mm)',
  'length (mm)',
  'width (m)',
  'length (m)',
  'loss (dB/m)',
  'substrate εr',
  'substrate height (mm)',
  'copper thickness (µm)',
  'substrate',
  'model',
  'note',
] as const;

const sig = (x: number | null, digits: number) => (x === null ? null : Number(x.toPrecision(digits)));

export function linesCsv(table: LineTable): string {
  const s = table.substrate.substrate;
  return csvDocument(
    LINES_HEADER,
    table.rows.map((r) => [
      csvText(r.ref),
      csvText(r.id),
      csvText(r.label ?? ''),
      r.kindWord,
      r.z0,
      r.designLength,
      sig(r.degreesAtCenter, 6),
      r.centerHz,
      sig(r.epsilonEff, 6),
      r.widthM === null ? null : sig(r.widthM * 1e3, 4),
      r.lengthM === null ? null : sig(r.lengthM * 1e3, 4),
      r.widthM,
      r.lengthM,
      r.lossDbPerM,
      s.epsilonR,
      sig(s.heightM * 1e3, 6),
      sig(s.copperM * 1e6, 6),
      table.substrate.description,
      LINE_MODEL,
      r.note,
    ]),
  );
}
