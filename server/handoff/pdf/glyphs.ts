/**
 * Stroked stand-ins for the few symbols the report needs that Nunito Sans does not carry (Γ, Ω, ε,
 * σ, ≤, ≥, →, ∞): polylines in em units, x to the right from the pen, y up from the baseline, with an
 * advance width. Drawn with the text colour at a stroke weight matching the face. Anything else the
 * faces lack is spelled out (`transliterate`).
 */

export interface VectorGlyph {
  advance: number;
  strokes: [number, number][][];
}

function arc(cx: number, cy: number, r: number, fromDeg: number, toDeg: number, steps = 20): [number, number][] {
  const out: [number, number][] = [];
  for (let k = 0; k <= steps; k++) {
    const a = ((fromDeg + ((toDeg - fromDeg) * k) / steps) * Math.PI) / 180;
    out.push([cx + r * Math.cos(a), cy + r * Math.sin(a)]);
  }
  return out;
}

function lemniscate(): [number, number][] {
  const out: [number, number][] = [];
  for (let k = 0; k <= 48; k++) {
    const t = (2 * Math.PI * k) / 48;
    const d = 1 + Math.sin(t) ** 2;
    out.push([0.4 + (0.32 * Math.cos(t)) / d, 0.3 + (0.32 * Math.sin(t) * Math.cos(t)) / d]);
  }
  return out;
}

const OMEGA: VectorGlyph = {
  advance: 0.74,
  strokes: [[[0.06, 0], [0.26, 0], [0.21, 0.165], ...arc(0.37, 0.4, 0.29, 235, -55), [0.53, 0.165], [0.48, 0], [0.68, 0]]],
};

export const VECTOR_GLYPHS: ReadonlyMap<number, VectorGlyph> = new Map<number, VectorGlyph>([
  [0x0393, { advance: 0.56, strokes: [[[0.1, 0], [0.1, 0.7], [0.5, 0.7]]] }], // Γ
  [0x03a9, OMEGA], // Ω
  [0x2126, OMEGA], // Ω (ohm sign)
  [0x03b5, { advance: 0.46, strokes: [arc(0.26, 0.365, 0.12, 40, 270, 16), arc(0.27, 0.135, 0.135, 90, 320, 16)] }], // ε
  [0x03c3, { advance: 0.56, strokes: [arc(0.26, 0.2, 0.2, 90, 450, 28), [[0.26, 0.4], [0.53, 0.4]]] }], // σ
  [0x2264, { advance: 0.58, strokes: [[[0.48, 0.6], [0.1, 0.42], [0.48, 0.24]], [[0.1, 0.1], [0.48, 0.1]]] }], // ≤
  [0x2265, { advance: 0.58, strokes: [[[0.1, 0.6], [0.48, 0.42], [0.1, 0.24]], [[0.1, 0.1], [0.48, 0.1]]] }], // ≥
  [0x2192, { advance: 0.8, strokes: [[[0.08, 0.3], [0.7, 0.3]], [[0.52, 0.44], [0.7, 0.3], [0.52, 0.16]]] }], // →
  [0x221e, { advance: 0.8, strokes: [lemniscate()] }], // ∞
]);

const NAMES: Record<string, string> = {
  α: 'alpha', β: 'beta', γ: 'gamma', δ: 'delta', Δ: 'Delta', ζ: 'zeta', η: 'eta', θ: 'theta', Θ: 'Theta',
  κ: 'kappa', λ: 'lambda', Λ: 'Lambda', μ: 'µ', ν: 'nu', ξ: 'xi', π: 'pi', Π: 'Pi', ρ: 'rho', Σ: 'Sigma',
  τ: 'tau', φ: 'phi', Φ: 'Phi', χ: 'chi', ψ: 'psi', Ψ: 'Psi', ω: 'omega', '√': 'sqrt', '≈': '~', '≠': '!=',
  '∠': 'angle ', '…': '...', '\t': ' ',
};

/** A spelling the faces can print, for a character they lack ("" when none comes to mind). */
export function transliterate(ch: string): string {
  if (NAMES[ch] !== undefined) return NAMES[ch];
  const folded = ch.normalize('NFKD').replace(/[\u0300-\u036f]/g, '');
  return folded !== ch ? folded : '';
}
