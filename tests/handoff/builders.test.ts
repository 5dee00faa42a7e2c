// The pure builders of shared/handoff and the PDF text helpers: CSV quoting, slugs, ticks, the Smith
// chart and sweep plot models, the report model, the WOFF decoder and the glyph fallback.
import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import PDFDocument from 'pdfkit';
import { describe, expect, it } from 'vitest';
import { bomRows, toleranceText } from '../../shared/handoff/bom';
import { HANDOFF_CAUTIONS } from '../../shared/handoff/cautions';
import { csvDocument, csvField, csvText } from '../../shared/handoff/csv';
import { handoffDownloadName } from '../../shared/handoff/files';
import { lineDegreesAt, lineTable } from '../../shared/handoff/lines';
import { decimatePolyline, niceTicks } from '../../shared/handoff/picture';
import { complexOhmsText, rangeText, reportModel } from '../../shared/handoff/report-model';
import { asciiText, roomSlug } from '../../shared/handoff/slug';
import { gammaAtFrequency, smithPicture } from '../../shared/handoff/smith-picture';
import { sweepPicture } from '../../shared/handoff/sweep-picture';
import { whipE12Design } from '../../shared/demo/designs';
import { analyze } from '../../shared/rf/analyze';
import { bandCenterHz, parseDesign, type LineElement } from '../../shared/rf/design';
import { impedancePath } from '../../shared/rf/impedance-path';
import { standardFonts } from '../../server/handoff/pdf/fonts';
import { PdfText } from '../../server/handoff/pdf/rich-text';
import { woffToSfnt, WoffError } from '../../server/handoff/pdf/woff';
import { chainDesign } from './helpers';

describe('CSV (RFC 4180)', () => {
  it('csvField quotes a field holding a comma, a quote, CR or LF and doubles inner quotes (RFC 4180 §2.6–2.7)', () => {
    expect(csvField('plain')).toBe('plain');
    expect(csvField('a,b')).toBe('"a,b"');
    expect(csvField('say "hi"')).toBe('"say ""hi"""');
    expect(csvField('two\nlines')).toBe('"two\nlines"');
    expect(csvField('cr\r')).toBe('"cr\r"');
    expect(csvField(1.5e-12)).toBe('1.5e-12');
    expect(csvField(null)).toBe('');
    expect(csvField(Number.NaN)).toBe('');
  });

  it('csvText guards free text that a spreadsheet would run as a formula (common practice)', () => {
    for (const lead of ['=', '+', '-', '@', '\t']) expect(csvField(csvText(`${lead}1+1`))).toMatch(/^"?'/);
    expect(csvField(csvText('C1'))).toBe('C1');
    expect(csvField(-3)).toBe('-3'); // numbers are left alone
  });

  it('csvDocument ends every record with CRLF (RFC 4180 §2.1) and refuses a row of the wrong width', () => {
    expect(csvDocument(['a', 'b'], [[1, 'x']])).toBe('a,b\r\n1,x\r\n');
    expect(() => csvDocument(['a', 'b'], [[1]])).toThrow(/row 0 has 1 fields, the header 2/);
  });
});

describe('names', () => {
  it('roomSlug folds accents and symbols into lower-case hyphenated ASCII, never empty, at most 60 characters', () => {
    expect(roomSlug('2.4 GHz sensor module antenna')).toBe('2-4-ghz-sensor-module-antenna');
    expect(roomSlug('Łódź — Ωmega bench')).toBe('lodz-ohmmega-bench');
    expect(roomSlug('  ***  ')).toBe('room');
    expect(roomSlug('中文')).toBe('room');
    expect(roomSlug('x'.repeat(100)).length).toBe(60);
    expect(roomSlug(`${'a'.repeat(59)} b`)).toBe('a'.repeat(59));
  });

  it('handoffDownloadName prefixes the slug; the design file keeps its .matchloom.json ending', () => {
    expect(handoffDownloadName('whip', 'bom.csv')).toBe('whip-bom.csv');
    expect(handoffDownloadName('whip', 'design.matchloom.json')).toBe('whip.matchloom.json');
    expect(handoffDownloadName('whip', 'handoff.zip')).toBe('whip-handoff.zip');
  });

  it('asciiText keeps Touchstone comments ASCII', () => {
    expect(asciiText('50 Ω, Γ ≤ 0.33, Łódź\nline 2')).toBe('50 ohm, Gamma <= 0.33, Lodz line 2');
    expect(asciiText('中')).toBe('?');
  });
});

describe('picture helpers', () => {
  it('niceTicks steps by 1, 2 or 5 × 10^k (common practice)', () => {
    expect(niceTicks(2, 2.9, 4)).toEqual([2, 2.2, 2.4, 2.6, 2.8]);
    expect(niceTicks(0, 30, 6)).toEqual([0, 5, 10, 15, 20, 25, 30]);
    expect(niceTicks(400, 470, 4)).toEqual([400, 420, 440, 460]);
    expect(niceTicks(3, 3, 4)).toEqual([3]);
  });

  it('decimatePolyline keeps the first and last point and at most `max` points', () => {
    const pts = Array.from({ length: 2000 }, (_, i) => [i, i * i]).flat();
    const d = decimatePolyline(pts, 100);
    expect(d.length).toBe(200);
    expect(d.slice(0, 2)).toEqual([0, 0]);
    expect(d.slice(-2)).toEqual([1999, 1999 * 1999]);
    expect(decimatePolyline([1, 2, 3, 4], 100)).toEqual([1, 2, 3, 4]);
  });
});

describe('smithPicture', () => {
  const design = parseDesign(chainDesign());
  const result = analyze(design);
  const path = impedancePath(design);
  const box = { x: 10, y: 20, width: 200, height: 200 };
  const pic = smithPicture(box, design, result, path, 16);
  const { cx, cy, radius } = pic.frame;

  it('puts Γ = 0 at the box centre and the rim 16 pt inside it', () => {
    expect([cx, cy, radius]).toEqual([110, 120, 84]);
    expect(pic.circles[0]).toMatchObject({ role: 'rim', x: 110, y: 120, r: 84 });
  });

  it('draws constant-r circles centred at r/(1+r) with radius 1/(1+r) and x circles at (1, 1/x) (Pozar, Microwave Engineering 4th ed., Section 2.4, from memory)', () => {
    const r1 = pic.circles.find((c) => c.role === 'r' && c.value === 1);
    expect(r1?.x).toBeCloseTo(cx + radius / 2, 12);
    expect(r1?.r).toBeCloseTo(radius / 2, 12);
    const x2 = pic.circles.find((c) => c.role === 'x' && c.value === 2);
    expect(x2?.x).toBeCloseTo(cx + radius, 12);
    expect(x2?.y).toBeCloseTo(cy - radius / 2, 12); // +Im Γ up: centre above the axis
  });

  it('draws the goal circle at |Γ|max = (s − 1)/(s + 1) (common practice)', () => {
    expect(pic.goal?.r).toBeCloseTo(radius / 3, 12);
  });

  it('tints each path segment by its kind, from the load marker to the port marker at the band-centre Γ', () => {
    expect(pic.path.map((s) => s.family)).toEqual(['series', 'shunt', 'line', 'line', 'line', 'series']);
    expect(pic.path[0].paint.colour).toBe('#1d8a84');
    expect(pic.path[1].paint.colour).toBe('#a9412b');
    expect(pic.path[2].paint.colour).toBe('#5b6b80');
    const load = pic.markers.find((m) => m.role === 'load');
    expect(load?.x).toBeCloseTo(cx + path.load[0] * radius, 9);
    expect(load?.y).toBeCloseTo(cy - path.load[1] * radius, 9);
    const port = pic.markers.find((m) => m.role === 'port');
    // The path ends on the band trace where it crosses the centre frequency (same engine, Zs = Z0).
    const zc = result.stagesAtCenter[result.stagesAtCenter.length - 1].z;
    const gc = [(zc[0] ** 2 - 2500 + zc[1] ** 2) / ((zc[0] + 50) ** 2 + zc[1] ** 2), (100 * zc[1]) / ((zc[0] + 50) ** 2 + zc[1] ** 2)];
    expect(port?.x).toBeCloseTo(cx + gc[0] * radius, 6);
    expect(port?.y).toBeCloseTo(cy - gc[1] * radius, 6);
  });

  it('splits the band trace at the band edges (thick inside, thin outside) and marks both edges on it', () => {
    const t = pic.trace;
    expect(t).not.toBeNull();
    expect(t?.outside.length).toBe(2);
    const start = pic.markers.find((m) => m.role === 'band-start');
    const stop = pic.markers.find((m) => m.role === 'band-stop');
    expect(t?.inBand.slice(0, 2)).toEqual([start?.x, start?.y]);
    expect(t?.inBand.slice(-2)).toEqual([stop?.x, stop?.y]);
    expect(t?.outside[0].slice(-2)).toEqual([start?.x, start?.y]);
  });

  it('gammaAtFrequency interpolates linearly and refuses a frequency outside the sweep', () => {
    const f = Float64Array.of(1, 2);
    const g = Float64Array.of(0, 0, 1, -1);
    expect(gammaAtFrequency(f, g, 1.25)).toEqual([0.25, -0.25]);
    expect(gammaAtFrequency(f, g, 3)).toBeNull();
  });
});

describe('sweepPicture', () => {
  const design = parseDesign(chainDesign());
  const result = analyze(design);
  const box = { x: 0, y: 0, width: 300, height: 200 };
  const pic = sweepPicture(box, design, result);

  it('draws the goal line at −20·log10((s − 1)/(s + 1)) dB: 9.54 dB for VSWR 2 (common practice)', () => {
    expect(pic.goal?.db).toBeCloseTo(9.542, 3);
    const [lo, hi] = pic.yRange;
    expect(pic.goal?.y).toBeCloseTo(pic.plot.y + pic.plot.height * (1 - (9.542425094393248 - lo) / (hi - lo)), 9);
  });

  it('shades the band between its edges on the frequency axis', () => {
    const xAt = (hz: number) => pic.plot.x + ((hz - 2e9) / 0.9e9) * pic.plot.width;
    expect(pic.band?.x0).toBeCloseTo(xAt(2.4e9), 9);
    expect(pic.band?.x1).toBeCloseTo(xAt(2.4835e9), 9);
    expect(pic.unit.label).toBe('GHz');
    expect(pic.xTicks.map((t) => t.text)).toEqual(['2', '2.2', '2.4', '2.6', '2.8']);
  });

  it('keeps every sweep point of a short sweep and the sharp dips of a long one (min/max per column)', () => {
    expect(pic.trace.length).toBe(2 * result.frequenciesHz.length);
    const long = parseDesign({ ...whipE12Design(), sweep: { startHz: 400e6, stopHz: 470e6, points: 20001, spacing: 'linear' } });
    const lr = analyze(long);
    const lp = sweepPicture(box, long, lr);
    expect(lp.trace.length).toBeLessThanOrEqual(2 * 2 * Math.round(2 * lp.plot.width)); // ≤ 2 points per column, 2 columns per pt
    // The best return loss of the sweep is still drawn (the highest point: the smallest y).
    let best = Infinity;
    for (let i = 1; i < lp.trace.length; i += 2) best = Math.min(best, lp.trace[i]);
    let worstGamma = Infinity;
    for (const m of lr.gammaMagnitude) worstGamma = Math.min(worstGamma, m);
    const top = lp.yRange[1];
    const rl = Math.min(top, -20 * Math.log10(worstGamma));
    expect(best).toBeCloseTo(lp.plot.y + lp.plot.height * (1 - rl / top), 9);
  });
});

describe('report model', () => {
  it('carries the cautions of PRODUCT.md', () => {
    const design = parseDesign(whipE12Design());
    const result = analyze(design);
    const m = reportModel({ roomName: 'Whip', design, result, bom: bomRows(design, result.stressAtCenter), lines: lineTable(design), notes: [], generatedAt: Date.UTC(2026, 11, 1, 9, 5) });
    expect(m.cautions).toBe(HANDOFF_CAUTIONS);
    expect(m.cautions.join(' ')).toMatch(/RF exposure limits apply to transmitters and antennas and depend on power, frequency and distance/);
    expect(m.cautions.join(' ')).toMatch(/check part voltage and current ratings with margin/);
    expect(m.cautions.join(' ')).toMatch(/Emissions and spectrum use are regulated/);
    expect(m.cautions.join(' ')).toMatch(/verify with measurement, and defer to local regulations and licensed practice/);
    expect(m.dateText).toBe('2026-12-01 09:05 UTC');
    expect(m.figures.map((f) => f.label)).toEqual(['Bandwidth', 'Fractional bandwidth', 'Worst in band', 'Match at centre', 'Limit gauge']);
    expect(m.goalMet).toBe(true);
    expect(m.elements.map((e) => e.build)).toEqual(['18 pF (E24)', '12 pF (E24)']);
    expect(m.stressNote).toMatch(/25 mW available drive/);
  });

  it('formats impedances and ranges with engineering prefixes', () => {
    expect(complexOhmsText(48.93, -2.104)).toBe('48.9 − j2.1 Ω');
    expect(complexOhmsText(12, 30)).toBe('12 + j30 Ω');
    expect(rangeText(2.386e9, 2.497e9, 'Hz', 4)).toBe('2.386–2.497 GHz');
    expect(rangeText(980e6, 1.02e9, 'Hz', 3)).toBe('980 MHz – 1.02 GHz');
  });

  it('toleranceText reads a relative, an absolute and a normal tolerance', () => {
    expect(toleranceText({ relative: 0.05 }, 'F')).toBe('±5 %');
    expect(toleranceText({ absolute: 1e-13 }, 'F')).toBe('±100 fF');
    expect(toleranceText({ relative: 0.02, distribution: 'normal' }, 'H')).toBe('±2 % (normal, 3σ)');
    expect(toleranceText(undefined, 'H')).toBe('');
  });

  it('lineDegreesAt scales degrees with frequency and turns metres into degrees through v·c (βl = 2πf·l/(v·c))', () => {
    const line = (length: LineElement['length']): LineElement => ({ id: 't', kind: 'line', z0: 50, length });
    expect(lineDegreesAt(line({ degrees: 90, atHz: 1e9 }), 2e9)).toBe(180);
    // A quarter wave of free space at 1 GHz is 74.948 mm (c/4f).
    expect(lineDegreesAt(line({ meters: 299_792_458 / 4e9, velocityFactor: 1 }), 1e9)).toBeCloseTo(90, 12);
    expect(lineDegreesAt(line({ meters: 0.66 * (299_792_458 / 4e9), velocityFactor: 0.66 }), 1e9)).toBeCloseTo(90, 12);
    expect(bandCenterHz({ startHz: 1, stopHz: 3 })).toBe(2);
  });
});

describe('PDF text helpers', () => {
  it('woffToSfnt gives a TrueType font whose head table carries the magic number 0x5F0F3CF5 (OpenType spec, head table)', () => {
    const require = createRequire(import.meta.url);
    const woff = readFileSync(require.resolve('@fontsource/nunito-sans/files/nunito-sans-latin-400-normal.woff'));
    const ttf = woffToSfnt(woff);
    expect([0x00010000, 0x4f54544f]).toContain(ttf.readUInt32BE(0));
    const n = ttf.readUInt16BE(4);
    let head = -1;
    for (let i = 0; i < n; i++) if (ttf.toString('latin1', 12 + 16 * i, 16 + 16 * i) === 'head') head = ttf.readUInt32BE(12 + 16 * i + 8);
    expect(head).toBeGreaterThan(0);
    expect(ttf.readUInt32BE(head + 12)).toBe(0x5f0f3cf5);
    expect(() => woffToSfnt(Buffer.from('not a font at all, clearly not one'))).toThrow(WoffError);
  });

  it('PdfText draws Ω and Γ as stroked glyphs, takes Ł from the latin-ext face and spells θ out', () => {
    const text = new PdfText(new PDFDocument({ autoFirstPage: true }));
    const runs = text.runs('50 Ω Γ Łθ中');
    const kinds = runs.map((r) => ('glyph' in r ? 'glyph' : `${r.face.name}:${r.text}`));
    expect(text.embedded).toBe(true);
    expect(kinds).toEqual(['nunito-regular-latin:50 ', 'glyph', 'nunito-regular-latin: ', 'glyph', 'nunito-regular-latin: ', 'nunito-regular-latin-ext:Ł', 'nunito-regular-latin:theta?']);
    expect(text.width('ΩΩ', { size: 10 })).toBeCloseTo(14.8, 9);
    expect(text.wrap('one two three four', { size: 10 }, text.width('one two three', { size: 10 }) - 0.01)).toEqual(['one two', 'three four']);
    expect(text.wrap('abcdefghij', { size: 10 }, text.width('abcde', { size: 10 }) + 0.01)).toEqual(['abcde', 'fghij']);
    expect(text.runs('a\u0000b\tc').map((r) => ('text' in r ? r.text : 'glyph'))).toEqual(['ab c']);
  });

  it('PdfText falls back to Helvetica (WinAnsi) without the Nunito files, still drawing Ω as a glyph', () => {
    const text = new PdfText(new PDFDocument({ autoFirstPage: true }), standardFonts());
    expect(text.embedded).toBe(false);
    const runs = text.runs('50 Ω, café');
    expect(runs.map((r) => ('glyph' in r ? 'glyph' : `${r.face.name}:${r.text}`))).toEqual(['Helvetica:50 ', 'glyph', 'Helvetica:, café']);
  });

  it('wraps and fits a very long unbroken word without quadratic cost', () => {
    const text = new PdfText(new PDFDocument({ autoFirstPage: true }));
    const word = 'x'.repeat(6000);
    const lines = text.wrap(word, { size: 8 }, 300);
    expect(lines.join('')).toBe(word);
    expect(lines.length).toBeGreaterThan(15);
    for (const l of lines.slice(0, -1)) expect(text.width(l, { size: 8 })).toBeLessThanOrEqual(300);
    const fitted = text.fit(word, { size: 8 }, 100);
    expect(fitted.endsWith('…')).toBe(true);
    expect(text.width(fitted, { size: 8 })).toBeLessThanOrEqual(100);
  });
});

describe('report model of other element kinds', () => {
  it('shows a transformer by its ratio and a measured two-port as measured; the BOM and lines skip them', () => {
    const s2p = '# GHz S RI R 50\n2 0 0 1 0 1 0 0 0\n3 0 0 1 0 1 0 0 0\n';
    const design = parseDesign(
      chainDesign({
        elements: [
          { id: 'n1', kind: 'two-port', touchstone: s2p, flipped: true },
          { id: 't1', kind: 'transformer', ratio: 1.5 },
          { id: 'c1', kind: 'series-c', value: 2e-12 },
        ],
      }),
    );
    const result = analyze(design);
    const bom = bomRows(design, result.stressAtCenter);
    expect(bom.map((b) => b.id)).toEqual(['c1']);
    const m = reportModel({ roomName: 'R', design, result, bom, lines: lineTable(design), notes: [], generatedAt: 0 });
    expect(m.elements.map((e) => [e.ref, e.value])).toEqual([
      ['N1', 'measured, flipped'],
      ['T1', '1 : 1.5'],
      ['C1', '2 pF'],
    ]);
    expect(m.lineNote).toBeNull();
  });
});
