/**
 * The hand-off report as plain data: title, room, date, the headline figures, the design summary, the
 * element table (with the BOM's preferred values, the microstrip dimensions and the stress figures), the
 * review notes and the cautions. Pure: the PDF renderer lays this out; the words and numbers are
 * decided here, once.
 */
import { elementDesignators, elementKindWord } from '../collab/describe';
import type { AnalysisResult } from '../rf/analyze';
import { bandCenterHz, isLine, isLumped, type Design, type Load } from '../rf/design';
import { formatEngineering } from '../rf/units';
import type { BomRow } from './bom';
import { HANDOFF_CAUTIONS } from './cautions';
import type { LineTable } from './lines';
import { kindPaint, type Paint } from './palette';

export interface ReportNote {
  author: string | null;
  /** Unix milliseconds */
  createdAt: number;
  body: string;
  elementId: string | null;
  frequencyHz: number | null;
  resolved: boolean;
  /** a reply to another note */
  reply: boolean;
}

export interface ReportInput {
  roomName: string;
  design: Design;
  result: AnalysisResult;
  bom: readonly BomRow[];
  lines: LineTable;
  notes: readonly ReportNote[];
  /** Unix milliseconds */
  generatedAt: number;
}

export interface ReportFigure {
  label: string;
  value: string;
  detail: string;
}

export interface ReportElementRow {
  index: number;
  ref: string;
  kind: string;
  kindWord: string;
  paint: Paint;
  value: string;
  /** nearest preferred value, or the microstrip width × length */
  build: string;
  tolerance: string;
  q: string;
  voltage: string;
  current: string;
}

export interface ReportNoteView {
  heading: string;
  body: string;
  reply: boolean;
}

export interface ReportModel {
  title: string;
  roomName: string;
  designName: string;
  dateText: string;
  goalText: string;
  goalMet: boolean | null;
  /** "2.442 GHz": where the impedance path and the stress figures are taken */
  centreText: string;
  figures: ReportFigure[];
  summary: { label: string; value: string }[];
  elements: ReportElementRow[];
  /** "at 100 mW drive, band centre" or null without a drive */
  stressNote: string | null;
  lineNote: string | null;
  notes: ReportNoteView[];
  cautions: readonly string[];
}

const DASH = '—';
const fmt = formatEngineering;

/** "2026-12-01 14:02 UTC" */
export function reportDate(ms: number): string {
  const d = new Date(ms);
  if (Number.isNaN(d.getTime())) return DASH;
  return `${d.toISOString().slice(0, 16).replace('T', ' ')} UTC`;
}

/** "48.9 + j2.1 Ω", "12 − j30 Ω" */
export function complexOhmsText(re: number, im: number): string {
  if (!Number.isFinite(re) || !Number.isFinite(im)) return 'open';
  const mag = (v: number) => String(Number(Math.abs(v).toPrecision(3)));
  const r = Math.abs(re) < 1e-9 * Math.max(1, Math.abs(im)) ? '0' : String(Number(re.toPrecision(3)));
  return `${r} ${im < 0 ? '−' : '+'} j${mag(im)} Ω`;
}

export function loadText(load: Load): string {
  switch (load.kind) {
    case 'impedance':
      return `${complexOhmsText(load.ohms[0], load.ohms[1])} at every frequency`;
    case 'rlc': {
      const parts = [`R ${fmt(load.r, 'Ω')}`];
      if (load.l !== undefined) parts.push(`L ${fmt(load.l, 'H')}`);
      if (load.c !== undefined) parts.push(`C ${fmt(load.c, 'F')}`);
      return `${load.topology} RLC: ${parts.join(', ')}`;
    }
    case 'measured':
      return `measured${load.fileName ? ` (${load.fileName})` : ''}, Touchstone one-port`;
    case 'table':
      return `table of ${load.points.length} impedance point${load.points.length === 1 ? '' : 's'}`;
  }
}

export function goalText(design: Design): string {
  const g = design.goal;
  return 'maxVswr' in g ? `VSWR ≤ ${String(g.maxVswr)}` : `return loss ≥ ${String(g.minReturnLossDb)} dB`;
}

/** "2.386–2.497 GHz" when both ends share the prefix, else "980 MHz – 1.02 GHz". */
export function rangeText(lo: number, hi: number, unit: 'Hz', digits: number): string {
  const a = fmt(lo, unit, { digits });
  const b = fmt(hi, unit, { digits });
  const [an, au] = a.split(' ');
  const [bn, bu] = b.split(' ');
  return au && au === bu ? `${an}–${bn} ${bu}` : `${a} – ${b}`;
}

const num = (v: number, digits = 3) => (Number.isFinite(v) ? String(Number(v.toPrecision(digits))) : DASH);

function figures(design: Design, result: AnalysisResult): ReportFigure[] {
  const bw = result.bandwidth;
  const w = result.worstInBand;
  const g = result.centerGamma;
  const centre = bandCenterHz(design.band);
  const zin = result.stagesAtCenter[result.stagesAtCenter.length - 1]?.z ?? [Number.NaN, Number.NaN];
  const vswrC = g < 1 ? (1 + g) / (1 - g) : Infinity;
  const rlC = g > 0 ? -20 * Math.log10(g) : Infinity;
  const lim = result.limit;
  return [
    {
      label: 'Bandwidth',
      value: bw ? rangeText(bw.lowHz, bw.highHz, 'Hz', 4) : 'goal missed at centre',
      detail: bw ? `meets ${goalText(design)} (contiguous, around the centre)` : `${goalText(design)} not met at ${fmt(centre, 'Hz', { digits: 4 })}`,
    },
    {
      label: 'Fractional bandwidth',
      value: bw ? `${num(bw.fractional * 100)} %` : DASH,
      detail: `band ${fmt(design.band.startHz, 'Hz', { digits: 4 })} – ${fmt(design.band.stopHz, 'Hz', { digits: 4 })}`,
    },
    {
      label: 'Worst in band',
      value: Number.isFinite(w.vswr) ? `VSWR ${num(w.vswr)}` : 'total reflection',
      detail: `return loss ${Number.isFinite(w.returnLossDb) ? `${w.returnLossDb.toFixed(1)} dB` : DASH}`,
    },
    {
      label: 'Match at centre',
      value: `VSWR ${Number.isFinite(vswrC) ? num(vswrC) : '∞'}`,
      detail: `|Γ| ${num(g, 2)}, RL ${Number.isFinite(rlC) ? `${Math.min(rlC, 300).toFixed(1)} dB` : DASH}, Zin ${complexOhmsText(zin[0], zin[1])} at ${fmt(centre, 'Hz', { digits: 4 })}`,
    },
    {
      label: 'Limit gauge',
      value: lim && bw ? `${num(lim.ratio, 2)} of the bound` : DASH,
      detail: lim
        ? `Bode–Fano bound ${num(lim.maxFractional * 100)} % (${lim.model.replace('-', ' ').replace('rc', 'RC').replace('rl', 'RL')} load)${bw ? '' : '; no bandwidth to compare'}`
        : 'no Bode–Fano bound for this load',
    },
  ];
}

export function reportModel(input: ReportInput): ReportModel {
  const { design, result } = input;
  const refs = elementDesignators(design.elements as unknown as Record<string, unknown>[]);
  const bomById = new Map(input.bom.map((b) => [b.id, b]));
  const lineById = new Map(input.lines.rows.map((r) => [r.id, r]));
  const stressById = new Map((result.stressAtCenter ?? []).map((s) => [s.id, s]));

  const elements: ReportElementRow[] = design.elements.map((e, i) => {
    const st = stressById.get(e.id);
    const row: ReportElementRow = {
      index: i + 1,
      ref: refs.get(e.id) ?? e.id,
      kind: e.kind,
      kindWord: elementKindWord(e.kind),
      paint: kindPaint(e.kind),
      value: DASH,
      build: DASH,
      tolerance: '',
      q: '',
      voltage: st ? fmt(st.voltagePeak, 'V') : '',
      current: st ? fmt(st.currentPeak, 'A') : '',
    };
    if (isLumped(e)) {
      const b = bomById.get(e.id);
      row.value = fmt(e.value, b?.unit ?? '', { digits: 4 });
      if (b) row.build = `${fmt(b.nearest, b.unit)} (${b.series})`;
      row.tolerance = b?.toleranceText ?? '';
      row.q = e.kind.endsWith('-r') ? '' : e.q !== undefined ? num(e.q) : 'ideal';
    } else if (isLine(e)) {
      const l = lineById.get(e.id);
      row.value = `${num(e.z0)} Ω, ${l ? `${num(l.degreesAtCenter, 4)}°` : DASH}`;
      row.build = l && l.widthM !== null && l.lengthM !== null ? `w ${num(l.widthM * 1e3)} × l ${num(l.lengthM * 1e3)} mm` : 'no microstrip width';
    } else if (e.kind === 'transformer') {
      row.value = `1 : ${num(e.ratio, 4)}`;
    } else {
      row.value = e.flipped ? 'measured, flipped' : 'measured';
    }
    return row;
  });

  const centre = bandCenterHz(design.band);
  const summary = [
    { label: 'Load', value: loadText(design.load) },
    { label: 'Band', value: `${fmt(design.band.startHz, 'Hz', { digits: 5 })} – ${fmt(design.band.stopHz, 'Hz', { digits: 5 })}, centre ${fmt(centre, 'Hz', { digits: 6 })}` },
    { label: 'Goal', value: goalText(design) },
    {
      label: 'Reference',
      value: `${fmt(design.referenceOhms, 'Ω')}${design.port ? `, port ${complexOhmsText(design.port.impedance[0], design.port.impedance[1])}` : ''}`,
    },
    { label: 'Sweep', value: `${fmt(design.sweep.startHz, 'Hz', { digits: 4 })} – ${fmt(design.sweep.stopHz, 'Hz', { digits: 4 })}, ${design.sweep.points} points (${design.sweep.spacing ?? 'linear'})` },
    { label: 'Drive', value: design.drive ? `${fmt(design.drive.powerW, 'W')} available from the port` : 'none set (no stress figures)' },
    { label: 'Substrate', value: input.lines.substrate.description },
  ];

  const goalMet = result.worstInBand.gammaMagnitude <= result.maxGamma;
  const notes: ReportNoteView[] = input.notes.map((n) => {
    const parts = [n.reply ? 'Reply' : 'Note'];
    if (n.elementId) parts[0] += ` on ${refs.get(n.elementId) ?? n.elementId}`;
    if (n.frequencyHz !== null && Number.isFinite(n.frequencyHz)) parts.push(`at ${fmt(n.frequencyHz, 'Hz', { digits: 4 })}`);
    parts.push(n.author ?? 'former member');
    parts.push(reportDate(n.createdAt));
    if (n.resolved) parts.push('resolved');
    return { heading: parts.join(' · '), body: n.body, reply: n.reply };
  });

  return {
    title: 'Matchloom hand-off report',
    roomName: input.roomName,
    designName: design.name,
    dateText: reportDate(input.generatedAt),
    goalText: goalText(design),
    centreText: fmt(centre, 'Hz', { digits: 4 }),
    goalMet: result.frequenciesHz.length ? goalMet : null,
    figures: figures(design, result),
    summary,
    elements,
    stressNote: design.drive ? `Peak voltage and current at ${fmt(design.drive.powerW, 'W')} available drive, at the band centre ${fmt(centre, 'Hz', { digits: 4 })}.` : null,
    lineNote: input.lines.rows.length ? `Lines as microstrip on ${input.lines.substrate.description}.` : null,
    notes,
    cautions: HANDOFF_CAUTIONS,
  };
}
