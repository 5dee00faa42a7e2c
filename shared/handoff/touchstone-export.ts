/**
 * The pack's Touchstone files, written with the engine's `writeTouchstone` (RI, full double precision,
 * so a parser gets the analysis back exactly):
 * - `network.s2p`: the chain alone (load excluded), both ports on `referenceOhms`, port 1 the port
 *   (source) side, port 2 the load side (CONTRACT §1).
 * - `matched-input.s1p`: the reflection at the port over the sweep. With a real port impedance Rs
 *   (the default is referenceOhms) it is Γ itself, written on R = Rs. A complex port impedance has no
 *   Touchstone form (R is real), so the file then holds Zin on R = referenceOhms, and says so.
 * Comments are ASCII (room names folded), as Touchstone readers expect.
 */
import type { AnalysisResult } from '../rf/analyze';
import type { Design } from '../rf/design';
import { writeTouchstone } from '../rf/touchstone';
import { asciiText } from './slug';

type FreqUnit = 'Hz' | 'kHz' | 'MHz' | 'GHz';

export function touchstoneUnitFor(maxHz: number): FreqUnit {
  if (maxHz >= 1e9) return 'GHz';
  if (maxHz >= 1e6) return 'MHz';
  if (maxHz >= 1e3) return 'kHz';
  return 'Hz';
}

export interface TouchstoneHeader {
  roomName: string;
  /** ISO 8601 time of the export. */
  exportedAt: string;
}

function commonComments(design: Design, h: TouchstoneHeader, file: string): string[] {
  return [
    `Matchloom hand-off pack: ${file}`,
    `Room: ${asciiText(h.roomName)}`,
    `Design: ${asciiText(design.name)}`,
    `Exported: ${h.exportedAt}`,
    `Sweep: ${design.sweep.points} points, ${design.sweep.spacing ?? 'linear'} spacing`,
  ];
}

function unitOf(result: AnalysisResult): FreqUnit {
  const f = result.frequenciesHz;
  return touchstoneUnitFor(f.length ? f[f.length - 1] : 0);
}

/** `network.s2p`: the chain's S-parameters. */
export function networkTouchstone(design: Design, result: AnalysisResult, h: TouchstoneHeader): string {
  const n = result.frequenciesHz.length;
  const s = new Float64Array(8 * n);
  const { s11, s12, s21, s22 } = result.s;
  for (let i = 0; i < n; i++) {
    const o = 8 * i;
    s[o] = s11[2 * i];
    s[o + 1] = s11[2 * i + 1];
    s[o + 2] = s12[2 * i];
    s[o + 3] = s12[2 * i + 1];
    s[o + 4] = s21[2 * i];
    s[o + 5] = s21[2 * i + 1];
    s[o + 6] = s22[2 * i];
    s[o + 7] = s22[2 * i + 1];
  }
  const z0 = design.referenceOhms;
  const comments = [
    ...commonComments(design, h, 'network.s2p'),
    `S-parameters of the matching chain alone (load excluded), both ports referenced to ${String(z0)} ohms`,
    'Port convention: port 1 = port (source) side, port 2 = load side',
    `Chain, load -> port: ${design.elements.map((e) => `${asciiText(e.label?.trim() || e.id)} (${e.kind})`).join(', ') || 'no elements (a through)'}`,
  ];
  return writeTouchstone({ ports: 2, frequenciesHz: result.frequenciesHz, s, referenceOhms: z0 }, { format: 'RI', unit: unitOf(result), comments });
}

/** `matched-input.s1p`: the input reflection at the port. */
export function matchedInputTouchstone(design: Design, result: AnalysisResult, h: TouchstoneHeader): string {
  const port = design.port?.impedance ?? [design.referenceOhms, 0];
  const n = result.frequenciesHz.length;
  const head = commonComments(design, h, 'matched-input.s1p');
  if (port[1] === 0) {
    const comments = [
      ...head,
      `Input reflection at the port (the chain with its load), referenced to the port impedance ${String(port[0])} ohms`,
    ];
    return writeTouchstone(
      { ports: 1, frequenciesHz: result.frequenciesHz, s: result.gamma, referenceOhms: port[0] },
      { format: 'RI', unit: unitOf(result), comments },
    );
  }
  // Complex port: S11 of Zin on the real reference instead.
  const z0 = design.referenceOhms;
  const s = new Float64Array(2 * n);
  for (let i = 0; i < n; i++) {
    const zr = result.zin[2 * i];
    const zi = result.zin[2 * i + 1];
    const nr = zr - z0;
    const dr = zr + z0;
    const d = dr * dr + zi * zi;
    s[2 * i] = (nr * dr + zi * zi) / d;
    s[2 * i + 1] = (zi * dr - nr * zi) / d;
  }
  const comments = [
    ...head,
    `Input impedance seen from the port (the chain with its load) as S11 on ${String(z0)} ohms.`,
    `The port impedance ${String(port[0])}${port[1] < 0 ? '-' : '+'}j${String(Math.abs(port[1]))} ohms is complex; the room's Gamma uses it (power waves),`,
    'which a Touchstone file (real reference) cannot hold: re-reference in your tool to compare.',
  ];
  return writeTouchstone({ ports: 1, frequenciesHz: result.frequenciesHz, s, referenceOhms: z0 }, { format: 'RI', unit: unitOf(result), comments });
}
