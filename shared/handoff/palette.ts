/**
 * The report's colours: Matchloom's own chart palette (the same values as the workspace's chart,
 * client/features/workspace/chart/chart-palette.ts), as a hex colour and an opacity, which is what a
 * PDF (and any other vector target) takes. Paper background, ink-navy grid, the impedance path tinted
 * by element kind (series teal, shunt coral, lines slate), the amber band trace.
 */

export interface Paint {
  colour: string;
  opacity: number;
}

const solid = (colour: string): Paint => ({ colour, opacity: 1 });
const tint = (colour: string, opacity: number): Paint => ({ colour, opacity });

export const REPORT_PALETTE = {
  paper: solid('#f6f1e7'),
  paperDeep: solid('#ece4d4'),
  ink: solid('#1e2b47'),
  inkSoft: solid('#45526e'),
  inkFaint: solid('#6c7791'),
  gridMajor: tint('#1e2b47', 0.34),
  gridMinor: tint('#1e2b47', 0.14),
  gridLabel: tint('#1e2b47', 0.72),
  goal: solid('#136560'),
  trace: solid('#d9962b'),
  traceOutOfBand: tint('#d9962b', 0.6),
  traceDeep: solid('#8a5a0e'),
  band: tint('#d9962b', 0.14),
  white: solid('#ffffff'),
  rule: tint('#1e2b47', 0.2),
} as const;

/** Path colours by element kind; the workspace chart uses the same table. */
export const KIND_COLOURS: Readonly<Record<string, string>> = {
  'series-l': '#1d8a84',
  'series-c': '#136560',
  'series-r': '#4fb3a9',
  'shunt-l': '#e06a4f',
  'shunt-c': '#a9412b',
  'shunt-r': '#ee9a84',
  line: '#5b6b80',
  'open-stub': '#7d8ca1',
  'short-stub': '#3f4c5e',
  transformer: '#54437f',
  'two-port': '#45526e',
};

/** Series parts teal, shunt parts coral, lines and stubs slate (as on the workspace chart). */
export function kindPaint(kind: string): Paint {
  return solid(KIND_COLOURS[kind] ?? REPORT_PALETTE.inkSoft.colour);
}

export type KindFamily = 'series' | 'shunt' | 'line' | 'other';

export function kindFamily(kind: string): KindFamily {
  if (kind.startsWith('series-')) return 'series';
  if (kind.startsWith('shunt-')) return 'shunt';
  if (kind === 'line' || kind === 'open-stub' || kind === 'short-stub') return 'line';
  return 'other';
}

/** The legend of the impedance path: one sample colour per family. */
export const FAMILY_PAINT: Record<Exclude<KindFamily, 'other'>, Paint> = {
  series: solid(KIND_COLOURS['series-l']),
  shunt: solid(KIND_COLOURS['shunt-l']),
  line: solid(KIND_COLOURS.line),
};
