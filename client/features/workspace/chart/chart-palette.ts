/**
 * The chart's colours: Matchloom's own palette (client/styles/app.css), repeated here because Konva
 * draws on a canvas and cannot read CSS custom properties cheaply.
 */
export const CHART_PALETTE = {
  paper: '#f6f1e7',
  paperDeep: '#ece4d4',
  ink: '#1e2b47',
  inkSoft: '#45526e',
  inkFaint: '#6c7791',
  gridMajor: 'rgba(30, 43, 71, 0.34)',
  gridMinor: 'rgba(30, 43, 71, 0.14)',
  gridLabel: 'rgba(30, 43, 71, 0.72)',
  admittanceMajor: 'rgba(122, 102, 168, 0.42)',
  admittanceMinor: 'rgba(122, 102, 168, 0.18)',
  admittanceLabel: '#54437f',
  q: 'rgba(69, 82, 110, 0.55)',
  goal: '#136560',
  trace: '#d9962b',
  traceOutOfBand: 'rgba(217, 150, 43, 0.45)',
  traceDeep: '#8a5a0e',
  envelope: 'rgba(217, 150, 43, 0.16)',
  compare: '#5b6b80',
  preview: '#7a66a8',
  selection: 'rgba(217, 150, 43, 0.35)',
} as const;

/**
 * Path segment colours by element kind: series parts in teal tones, shunt parts in coral tones,
 * line sections (and stubs, which are line sections too) in slate tones.
 */
const KIND_COLOURS: Record<string, string> = {
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

export function elementKindColour(kind: string): string {
  return KIND_COLOURS[kind] ?? CHART_PALETTE.inkSoft;
}

/** Which family a kind belongs to, for the legend and the aria text. */
export function elementKindFamily(kind: string): 'series' | 'shunt' | 'line' | 'other' {
  if (kind.startsWith('series-')) return 'series';
  if (kind.startsWith('shunt-')) return 'shunt';
  if (kind === 'line' || kind === 'open-stub' || kind === 'short-stub') return 'line';
  return 'other';
}
