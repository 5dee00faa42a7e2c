/**
 * The report's type: Nunito Sans, shipped with the application in @fontsource/nunito-sans (WOFF, which
 * pdfkit embeds and subsets), never fetched. Each weight comes in subset files (latin, latin-ext,
 * vietnamese, cyrillic, ...); `unicode.json` of the same package says which code points each covers, so
 * a room name in Polish or Ukrainian still prints. The WOFF files are decoded once (woff.ts). Should the files be missing, the standard Helvetica
 * (WinAnsi) stands in.
 */
import { existsSync, readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { woffToSfnt } from './woff';

export type FontWeight = 'regular' | 'semibold' | 'bold';

export interface FontFace {
  /** the name registered with pdfkit */
  name: string;
  /** the face as TrueType bytes, or null for a standard PDF font */
  data: Buffer | null;
  /** covered code points, as sorted [lo, hi] ranges */
  ranges: [number, number][];
}

export interface FontSet {
  /** per weight, in order of preference */
  faces: Record<FontWeight, FontFace[]>;
  embedded: boolean;
}

const SUBSETS = ['latin', 'latin-ext', 'vietnamese', 'cyrillic', 'cyrillic-ext'] as const;
const WEIGHTS: Record<FontWeight, number> = { regular: 400, semibold: 600, bold: 700 };
const STANDARD: Record<FontWeight, string> = { regular: 'Helvetica', semibold: 'Helvetica-Bold', bold: 'Helvetica-Bold' };

/** WinAnsi: ASCII, Latin-1 and the punctuation the standard fonts carry. */
const WIN_ANSI: [number, number][] = [
  [0x20, 0x7e],
  [0xa0, 0xff],
  [0x152, 0x153],
  [0x2013, 0x2014],
  [0x2018, 0x201a],
  [0x201c, 0x201e],
  [0x2020, 0x2022],
  [0x2026, 0x2026],
  [0x20ac, 0x20ac],
  [0x2122, 0x2122],
];

/** "U+0000-00FF,U+0131" -> [[0, 255], [305, 305]] */
export function parseUnicodeRange(text: string): [number, number][] {
  const out: [number, number][] = [];
  for (const part of text.split(',')) {
    const m = /^\s*U\+([0-9A-Fa-f]+)(?:-([0-9A-Fa-f]+))?\s*$/.exec(part);
    if (!m) continue;
    const lo = parseInt(m[1], 16);
    out.push([lo, m[2] ? parseInt(m[2], 16) : lo]);
  }
  return out.sort((a, b) => a[0] - b[0]);
}

export function covers(face: FontFace, cp: number): boolean {
  const r = face.ranges;
  let lo = 0;
  let hi = r.length - 1;
  while (lo <= hi) {
    const mid = (lo + hi) >> 1;
    if (cp < r[mid][0]) hi = mid - 1;
    else if (cp > r[mid][1]) lo = mid + 1;
    else return true;
  }
  return false;
}

/** Helvetica (WinAnsi) for every weight: the stand-in when the Nunito Sans files are missing. */
export function standardFonts(): FontSet {
  const face = (w: FontWeight): FontFace[] => [{ name: STANDARD[w], data: null, ranges: WIN_ANSI }];
  return { faces: { regular: face('regular'), semibold: face('semibold'), bold: face('bold') }, embedded: false };
}

let cached: FontSet | null = null;

/** The faces to use (looked up once per process). */
export function reportFonts(): FontSet {
  if (cached) return cached;
  try {
    const require = createRequire(import.meta.url);
    const unicode = JSON.parse(readFileSync(require.resolve('@fontsource/nunito-sans/unicode.json'), 'utf8')) as Record<string, string>;
    const faces = {} as Record<FontWeight, FontFace[]>;
    for (const w of Object.keys(WEIGHTS) as FontWeight[]) {
      faces[w] = [];
      for (const subset of SUBSETS) {
        const range = unicode[subset];
        if (!range) continue;
        const file = require.resolve(`@fontsource/nunito-sans/files/nunito-sans-${subset}-${WEIGHTS[w]}-normal.woff`);
        if (!existsSync(file)) continue;
        faces[w].push({ name: `nunito-${w}-${subset}`, data: woffToSfnt(readFileSync(file)), ranges: parseUnicodeRange(range) });
      }
      if (faces[w].length === 0) throw new Error(`no Nunito Sans files for weight ${WEIGHTS[w]}`);
    }
    cached = { faces, embedded: true };
  } catch {
    cached = standardFonts();
  }
  return cached;
}
