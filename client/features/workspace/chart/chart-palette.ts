import { KIND_COLOURS, kindFamily, type KindFamily } from '../../../../shared/handoff/palette';

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
 * Path segment colours by element kind (series parts teal, shunt parts coral, lines and stubs slate):
 * one table, shared with the hand-off report's pictures.
 */
export function elementKindColour(kind: string): string {
  return KIND_COLOURS[kind] ?? CHART_PALETTE.inkSoft;
}

/** Which family a kind belongs to, for the legend and the aria text. */
export const elementKindFamily: (kind: string) => KindFamily = kindFamily;
