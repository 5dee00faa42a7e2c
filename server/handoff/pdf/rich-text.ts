/**
 * Text on a pdfkit page through the report's faces (fonts.ts): a string is split into runs by the
 * face that covers each character; symbols no face carries are drawn as stroked glyphs (glyphs.ts) or
 * spelled out, so nothing prints as an empty box. Also measures and word-wraps, for table cells and
 * paragraphs. All positions are in points, y down, `y` being the baseline.
 */
import { covers, reportFonts, type FontFace, type FontSet, type FontWeight } from './fonts';
import { transliterate, VECTOR_GLYPHS, type VectorGlyph } from './glyphs';
import type { Paint } from '../../../shared/handoff/palette';

export interface TextStyle {
  weight?: FontWeight;
  size: number;
  paint: Paint;
}

type Run = { face: FontFace; text: string } | { glyph: VectorGlyph };

const STROKE_EM: Record<FontWeight, number> = { regular: 0.068, semibold: 0.085, bold: 0.1 };
/**
 * No printing character of the faces is narrower than this (in em; Nunito Sans' narrowest, the
 * apostrophe and "i", are about 0.2 em): so more than maxWidth/(MIN_ADVANCE_EM·size) characters
 * never fit, and long text is never measured whole.
 */
const MIN_ADVANCE_EM = 0.12;

const capacity = (maxWidth: number, size: number) => Math.max(1, Math.floor(maxWidth / (MIN_ADVANCE_EM * size)));

export class PdfText {
  private readonly fonts: FontSet;
  private readonly registered = new Set<string>();

  constructor(private readonly doc: PDFKit.PDFDocument, fonts: FontSet = reportFonts()) {
    this.fonts = fonts;
  }

  get embedded(): boolean {
    return this.fonts.embedded;
  }

  private use(face: FontFace, size: number): void {
    if (face.data && !this.registered.has(face.name)) {
      this.doc.registerFont(face.name, face.data);
      this.registered.add(face.name);
    }
    this.doc.font(face.name).fontSize(size);
  }

  /** The text split into face runs and stroked glyphs. */
  runs(text: string, weight: FontWeight = 'regular'): Run[] {
    const faces = this.fonts.faces[weight];
    const out: Run[] = [];
    const push = (face: FontFace, ch: string) => {
      const last = out[out.length - 1];
      if (last && 'face' in last && last.face === face) last.text += ch;
      else out.push({ face, text: ch });
    };
    const place = (ch: string, depth: number) => {
      const cp = ch.codePointAt(0) ?? 0x3f;
      if (ch === '\t') return push(faces[0], ' ');
      if (cp < 0x20 || (cp >= 0x7f && cp < 0xa0)) return; // control characters print nothing
      const face = faces.find((f) => covers(f, cp));
      if (face) return push(face, ch);
      const glyph = VECTOR_GLYPHS.get(cp);
      if (glyph) return out.push({ glyph });
      const spelled = depth === 0 ? transliterate(ch) : '';
      if (spelled) for (const c of spelled) place(c, depth + 1);
      else if (cp >= 0x20 && !/\p{M}/u.test(ch)) push(faces[0], '?');
    };
    for (const ch of text) place(ch, 0);
    return out;
  }

  width(text: string, style: Pick<TextStyle, 'size' | 'weight'>): number {
    let w = 0;
    for (const r of this.runs(text, style.weight)) {
      if ('glyph' in r) w += r.glyph.advance * style.size;
      else {
        this.use(r.face, style.size);
        w += this.doc.widthOfString(r.text);
      }
    }
    return w;
  }

  /** Draws one line with its baseline at y; returns the width drawn. */
  draw(text: string, x: number, y: number, style: TextStyle, align: 'left' | 'center' | 'right' = 'left'): number {
    const width = this.width(text, style);
    let pen = align === 'left' ? x : align === 'right' ? x - width : x - width / 2;
    const weight = style.weight ?? 'regular';
    for (const r of this.runs(text, weight)) {
      if ('glyph' in r) {
        this.drawGlyph(r.glyph, pen, y, style.size, weight, style.paint);
        pen += r.glyph.advance * style.size;
      } else {
        this.use(r.face, style.size);
        this.doc.fillColor(style.paint.colour, style.paint.opacity).text(r.text, pen, y, { lineBreak: false, baseline: 'alphabetic' });
        pen += this.doc.widthOfString(r.text);
      }
    }
    return width;
  }

  private drawGlyph(g: VectorGlyph, x: number, y: number, size: number, weight: FontWeight, paint: Paint): void {
    const doc = this.doc;
    doc.save();
    doc.lineWidth(STROKE_EM[weight] * size).lineCap('round').lineJoin('round').strokeColor(paint.colour, paint.opacity);
    for (const stroke of g.strokes) {
      stroke.forEach(([u, v], k) => {
        const px = x + u * size;
        const py = y - v * size;
        if (k === 0) doc.moveTo(px, py);
        else doc.lineTo(px, py);
      });
      doc.stroke();
    }
    doc.restore();
  }

  /** Word-wraps `text` to `maxWidth` (paragraphs split at newlines; an over-long word is cut). */
  wrap(text: string, style: Pick<TextStyle, 'size' | 'weight'>, maxWidth: number): string[] {
    const cap = capacity(maxWidth, style.size);
    const fits = (t: string) => t.length <= cap && this.width(t, style) <= maxWidth;
    const lines: string[] = [];
    for (const para of text.replace(/\r\n?/g, '\n').split('\n')) {
      const words = para.split(/[ \t]+/).filter(Boolean);
      let line = '';
      for (let word of words) {
        const candidate = line ? `${line} ${word}` : word;
        if (fits(candidate)) {
          line = candidate;
          continue;
        }
        if (line) lines.push(line);
        // A single word wider than the line: cut it where it fits (binary search over at most `cap` characters).
        while (word.length > 1 && !fits(word)) {
          const cut = this.longestFit(word, style, maxWidth, '');
          lines.push(word.slice(0, cut));
          word = word.slice(cut);
        }
        line = word;
      }
      lines.push(line);
    }
    return lines;
  }

  /** The longest prefix length (at least 1) of `text` that, followed by `suffix`, fits `maxWidth`. */
  private longestFit(text: string, style: Pick<TextStyle, 'size' | 'weight'>, maxWidth: number, suffix: string): number {
    let lo = 1;
    let hi = Math.min(text.length, capacity(maxWidth, style.size));
    while (lo < hi) {
      const mid = (lo + hi + 1) >> 1;
      if (this.width(text.slice(0, mid) + suffix, style) <= maxWidth) lo = mid;
      else hi = mid - 1;
    }
    return lo;
  }

  /** Shortens `text` with an ellipsis to fit `maxWidth`. */
  fit(text: string, style: Pick<TextStyle, 'size' | 'weight'>, maxWidth: number): string {
    if (text.length <= capacity(maxWidth, style.size) && this.width(text, style) <= maxWidth) return text;
    return `${text.slice(0, this.longestFit(text, style, maxWidth, '…')).trimEnd()}…`;
  }
}
