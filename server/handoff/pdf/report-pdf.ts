/**
 * The hand-off report as a PDF (pdfkit): page 1 carries the title, room and date, the headline figures,
 * the Smith chart and the sweep plot drawn as vector paths, the design summary and the element table
 * with the stress figures and the cautions beside them; then the line dimensions and the review notes.
 * A4 portrait, Nunito Sans (fonts.ts), every page footed with the room and the page number.
 */
import PDFDocument from 'pdfkit';
import { REPORT_PALETTE, FAMILY_PAINT, type Paint } from '../../../shared/handoff/palette';
import type { Box } from '../../../shared/handoff/picture';
import type { ReportModel } from '../../../shared/handoff/report-model';
import type { SmithPicture } from '../../../shared/handoff/smith-picture';
import type { SweepPicture } from '../../../shared/handoff/sweep-picture';
import type { LineTable } from '../../../shared/handoff/lines';
import { drawSmith, drawSweep } from './draw-pictures';
import { PdfText, type TextStyle } from './rich-text';
import type { FontWeight } from './fonts';

export const PAGE = { width: 595.28, height: 841.89, margin: 40 } as const;
const CONTENT_W = PAGE.width - 2 * PAGE.margin;
const BOTTOM = PAGE.height - PAGE.margin - 16; // room for the footer
/** Where the two pictures sit on page 1 (also used by the tests to find the chart region). */
export const SMITH_BOX: Box = { x: PAGE.margin, y: 196, width: 252, height: 252 };
export const SWEEP_BOX: Box = { x: PAGE.margin + 263, y: 196, width: CONTENT_W - 263, height: 252 };

export interface ReportPictures {
  smith: SmithPicture;
  sweep: SweepPicture;
}

export interface ReportPdfInput {
  model: ReportModel;
  pictures: ReportPictures;
  lines: LineTable;
  /** document creation time (Unix ms), written into the PDF's info */
  createdAt: number;
}

const P = REPORT_PALETTE;
const style = (size: number, paint: Paint = P.ink, weight: FontWeight = 'regular'): TextStyle => ({ size, paint, weight });

interface Column {
  title: string;
  width: number;
  align?: 'left' | 'right';
}

class Layout {
  y: number = PAGE.margin;
  constructor(
    readonly doc: PDFKit.PDFDocument,
    readonly text: PdfText,
  ) {}

  /** Starts a new page when `height` does not fit below the cursor. */
  need(height: number): void {
    if (this.y + height <= BOTTOM) return;
    this.doc.addPage();
    this.y = PAGE.margin;
  }

  heading(title: string, sub?: string): void {
    this.need(40);
    this.y += 10;
    this.text.draw(title, PAGE.margin, this.y + 10, style(11, P.ink, 'bold'));
    if (sub) this.text.draw(sub, PAGE.margin + this.text.width(title, style(11, P.ink, 'bold')) + 8, this.y + 10, style(7.5, P.inkSoft));
    this.y += 16;
  }

  /** A paragraph, wrapped; returns its height. */
  paragraph(body: string, s: TextStyle, indent = 0, width = CONTENT_W - indent, leading = 1.35): void {
    const lh = s.size * leading;
    for (const line of this.text.wrap(body, s, width)) {
      this.need(lh);
      this.text.draw(line, PAGE.margin + indent, this.y + s.size, s);
      this.y += lh;
    }
  }

  table(columns: Column[], rows: string[][], opts: { swatches?: (Paint | null)[]; rowHeight?: number; boldColumn?: number; swatchColumn?: number } = {}): void {
    const rh = opts.rowHeight ?? 13;
    const header = () => {
      this.need(rh * 2);
      let x = PAGE.margin;
      this.doc.rect(PAGE.margin, this.y, CONTENT_W, rh).fillColor(P.paperDeep.colour, 1).fill();
      for (const c of columns) {
        const s = style(6.8, P.inkSoft, 'semibold');
        const t = this.text.fit(c.title, s, c.width - 6);
        if (c.align === 'right') this.text.draw(t, x + c.width - 3, this.y + rh - 4, s, 'right');
        else this.text.draw(t, x + 3, this.y + rh - 4, s);
        x += c.width;
      }
      this.y += rh;
    };
    header();
    rows.forEach((row, r) => {
      if (this.y + rh > BOTTOM) {
        this.doc.addPage();
        this.y = PAGE.margin;
        header();
      }
      if (r % 2 === 1) this.doc.rect(PAGE.margin, this.y, CONTENT_W, rh).fillColor(P.paper.colour, 1).fill();
      let x = PAGE.margin;
      row.forEach((cell, k) => {
        const c = columns[k];
        const s = style(7.4, P.ink, k === (opts.boldColumn ?? 1) ? 'semibold' : 'regular');
        let inset = 3;
        const sw = opts.swatches?.[r];
        if (k === (opts.swatchColumn ?? 2) && sw) {
          this.doc.rect(x + 3, this.y + rh / 2 - 2.5, 5, 5).fillColor(sw.colour, sw.opacity).fill();
          inset = 11;
        }
        const t = this.text.fit(cell, s, c.width - inset - 3);
        if (c.align === 'right') this.text.draw(t, x + c.width - 3, this.y + rh - 4, s, 'right');
        else this.text.draw(t, x + inset, this.y + rh - 4, s);
        x += c.width;
      });
      this.y += rh;
    });
    this.doc.moveTo(PAGE.margin, this.y).lineTo(PAGE.margin + CONTENT_W, this.y).lineWidth(0.5).strokeColor(P.rule.colour, P.rule.opacity).stroke();
    this.y += 4;
  }
}

function header(l: Layout, m: ReportModel): void {
  const { doc, text } = l;
  text.draw(m.title.toUpperCase(), PAGE.margin, PAGE.margin + 8, style(7.5, P.inkSoft, 'semibold'));
  text.draw(m.dateText, PAGE.margin + CONTENT_W, PAGE.margin + 8, style(7.5, P.inkSoft), 'right');
  const nameStyle = style(19, P.ink, 'bold');
  text.draw(text.fit(m.roomName, nameStyle, CONTENT_W), PAGE.margin, PAGE.margin + 32, nameStyle);
  const status = m.goalMet === null ? 'not analysed' : m.goalMet ? 'goal met across the band' : 'goal not met across the band';
  const sub = `Design “${m.designName}” · goal ${m.goalText} · `;
  const subStyle = style(9, P.inkSoft);
  const w = text.draw(text.fit(sub, subStyle, CONTENT_W - 160), PAGE.margin, PAGE.margin + 48, subStyle);
  text.draw(status, PAGE.margin + w, PAGE.margin + 48, style(9, m.goalMet ? P.goal : { colour: '#a9412b', opacity: 1 }, 'semibold'));
  doc.moveTo(PAGE.margin, PAGE.margin + 58).lineTo(PAGE.margin + CONTENT_W, PAGE.margin + 58).lineWidth(1.6).strokeColor(P.trace.colour, 1).stroke();
  l.y = PAGE.margin + 66;
}

function figureTiles(l: Layout, m: ReportModel): void {
  const { doc, text } = l;
  const n = m.figures.length;
  const gap = 7;
  const w = (CONTENT_W - gap * (n - 1)) / n;
  const h = 62;
  m.figures.forEach((f, k) => {
    const x = PAGE.margin + k * (w + gap);
    doc.roundedRect(x, l.y, w, h, 5).fillColor(P.paper.colour, 1).fill();
    text.draw(f.label.toUpperCase(), x + 7, l.y + 12, style(6, P.inkSoft, 'semibold'));
    const vs = style(10.5, P.ink, 'bold');
    const vLines = text.wrap(f.value, vs, w - 14).slice(0, 2);
    vLines.forEach((line, i) => text.draw(line, x + 7, l.y + 26 + i * 12, vs));
    const ds = style(6.2, P.inkSoft);
    text
      .wrap(f.detail, ds, w - 14)
      .slice(0, 4 - vLines.length + 1)
      .forEach((line, i) => text.draw(line, x + 7, l.y + 26 + vLines.length * 12 + i * 7.6, ds));
  });
  l.y += h + 10;
}

function legend(l: Layout, x: number, y: number, items: { paint: Paint; label: string; kind: 'line' | 'thick' | 'dash' | 'box' }[]): void {
  const { doc, text } = l;
  let pen = x;
  for (const it of items) {
    doc.save();
    if (it.kind === 'box') doc.rect(pen, y - 5, 10, 6).fillColor(it.paint.colour, it.paint.opacity).fill();
    else {
      doc.moveTo(pen, y - 2).lineTo(pen + 12, y - 2);
      if (it.kind === 'dash') doc.dash(3, { space: 2 });
      doc.lineWidth(it.kind === 'thick' ? 3 : 1.6).strokeColor(it.paint.colour, it.paint.opacity).stroke();
      doc.undash();
    }
    doc.restore();
    pen += 15;
    pen += text.draw(it.label, pen, y, style(6.3, P.inkSoft)) + 9;
  }
}

function pictures(l: Layout, m: ReportModel, pics: ReportPictures): void {
  const { text } = l;
  const top = SMITH_BOX.y - 8;
  text.draw('Smith chart', SMITH_BOX.x, top, style(8.5, P.ink, 'bold'));
  text.draw(`impedance path at ${m.centreText}, band trace`, SMITH_BOX.x + 52, top, style(6.8, P.inkSoft));
  text.draw('Sweep', SWEEP_BOX.x, top, style(8.5, P.ink, 'bold'));
  text.draw('return loss against frequency', SWEEP_BOX.x + 30, top, style(6.8, P.inkSoft));
  drawSmith(l.doc, text, pics.smith);
  drawSweep(l.doc, text, pics.sweep);
  const ly = SMITH_BOX.y + SMITH_BOX.height + 12;
  legend(l, SMITH_BOX.x + 2, ly, [
    { paint: FAMILY_PAINT.series, label: 'series', kind: 'line' },
    { paint: FAMILY_PAINT.shunt, label: 'shunt', kind: 'line' },
    { paint: FAMILY_PAINT.line, label: 'line', kind: 'line' },
    { paint: P.trace, label: 'band trace', kind: 'thick' },
    { paint: P.goal, label: 'goal', kind: 'dash' },
  ]);
  legend(l, SWEEP_BOX.x + 2, ly, [
    { paint: P.band, label: 'band', kind: 'box' },
    { paint: P.trace, label: 'return loss', kind: 'line' },
    { paint: P.goal, label: 'goal', kind: 'dash' },
  ]);
  l.y = ly + 10;
}

/** The design summary in two columns of label and value. */
function summary(l: Layout, m: ReportModel): void {
  l.heading('Design');
  const gap = 16;
  const colW = (CONTENT_W - gap) / 2;
  const labelW = 52;
  const lh = 10.2;
  const vs = style(7.6, P.ink);
  const ls = style(7.6, P.inkSoft, 'semibold');
  const half = Math.ceil(m.summary.length / 2);
  const columns = [m.summary.slice(0, half), m.summary.slice(half)];
  const wrapped = columns.map((col) => col.map((s) => ({ ...s, lines: l.text.wrap(s.value, vs, colW - labelW) })));
  const height = Math.max(...wrapped.map((col) => col.reduce((a, s) => a + s.lines.length * lh, 0)));
  l.need(height);
  wrapped.forEach((col, c) => {
    const x = PAGE.margin + c * (colW + gap);
    let y = l.y;
    for (const s of col) {
      l.text.draw(s.label, x, y + 8, ls);
      s.lines.forEach((line, i) => l.text.draw(line, x + labelW, y + 8 + i * lh, vs));
      y += s.lines.length * lh;
    }
  });
  l.y += height;
}

function elementTable(l: Layout, m: ReportModel): void {
  l.heading('Elements', 'load → port');
  if (m.elements.length === 0) {
    l.paragraph('The chain has no elements: the load connects straight to the port.', style(8, P.inkSoft));
    return;
  }
  const cols: Column[] = [
    { title: '#', width: 16 },
    { title: 'Ref', width: 46 },
    { title: 'Kind', width: 64 },
    { title: 'Value', width: 62 },
    { title: 'Build (E-series / microstrip)', width: 100 },
    { title: 'Tolerance', width: 82 },
    { title: 'Q', width: 30, align: 'right' },
    { title: 'Peak V', width: 55, align: 'right' },
    { title: 'Peak I', width: CONTENT_W - 455, align: 'right' },
  ];
  l.table(
    cols,
    m.elements.map((e) => [String(e.index), e.ref, e.kindWord, e.value, e.build, e.tolerance, e.q, e.voltage, e.current]),
    { swatches: m.elements.map((e) => e.paint) },
  );
  if (m.stressNote) l.paragraph(m.stressNote, style(7, P.inkSoft));
  if (m.lineNote) l.paragraph(m.lineNote, style(7, P.inkSoft));
}

function cautions(l: Layout, m: ReportModel): void {
  const s = style(7.6, P.ink);
  const width = CONTENT_W - 30;
  const wrapped = m.cautions.map((c) => l.text.wrap(c, s, width));
  const h = 24 + wrapped.reduce((a, w) => a + w.length * 10.2 + 2, 0);
  l.need(h + 10);
  l.y += 8;
  const { doc } = l;
  doc.roundedRect(PAGE.margin, l.y, CONTENT_W, h, 5).fillColor(P.paper.colour, 1).fill();
  doc.rect(PAGE.margin, l.y, 3, h).fillColor(P.trace.colour, 1).fill();
  l.text.draw('Cautions', PAGE.margin + 12, l.y + 14, style(8.5, P.ink, 'bold'));
  let y = l.y + 26;
  for (const lines of wrapped) {
    doc.circle(PAGE.margin + 16, y - 2.6, 1.3).fillColor(P.traceDeep.colour, 1).fill();
    for (const line of lines) {
      l.text.draw(line, PAGE.margin + 22, y, s);
      y += 10.2;
    }
    y += 2;
  }
  l.y += h + 4;
}

function lineTable(l: Layout, lines: LineTable): void {
  if (lines.rows.length === 0) return;
  l.heading('Line dimensions', `microstrip on ${lines.substrate.description}`);
  const n3 = (v: number | null, k = 1) => (v === null ? '—' : String(Number((v * k).toPrecision(4))));
  l.table(
    [
      { title: 'Ref', width: 50 },
      { title: 'Kind', width: 62 },
      { title: 'Z0 (Ω)', width: 40, align: 'right' },
      { title: 'Length at centre (°)', width: 70, align: 'right' },
      { title: 'εeff', width: 38, align: 'right' },
      { title: 'Width (mm)', width: 50, align: 'right' },
      { title: 'Length (mm)', width: 52, align: 'right' },
      { title: 'Note', width: CONTENT_W - 362 },
    ],
    lines.rows.map((r) => [r.ref, r.kindWord, n3(r.z0), n3(r.degreesAtCenter), n3(r.epsilonEff), n3(r.widthM, 1e3), n3(r.lengthM, 1e3), r.note]),
    { boldColumn: 0 },
  );
  const notes = lines.rows.filter((r) => r.note).map((r) => `${r.ref}: ${r.note}.`);
  for (const n of notes) l.paragraph(n, style(6.8, P.inkSoft));
}

function notes(l: Layout, m: ReportModel): void {
  l.heading('Review notes', m.notes.length ? `${m.notes.length}` : undefined);
  if (m.notes.length === 0) {
    l.paragraph('No review notes in this room.', style(8, P.inkSoft));
    return;
  }
  for (const n of m.notes) {
    const indent = n.reply ? 16 : 0;
    l.need(26);
    l.paragraph(n.heading, style(7, P.inkSoft, 'semibold'), indent);
    l.paragraph(n.body, style(8.2, P.ink), indent);
    l.y += 4;
  }
}

function footers(doc: PDFKit.PDFDocument, text: PdfText, m: ReportModel): void {
  const range = doc.bufferedPageRange();
  for (let i = range.start; i < range.start + range.count; i++) {
    doc.switchToPage(i);
    const y = PAGE.height - PAGE.margin + 6;
    doc.moveTo(PAGE.margin, y - 10).lineTo(PAGE.margin + CONTENT_W, y - 10).lineWidth(0.4).strokeColor(P.rule.colour, P.rule.opacity).stroke();
    const s = style(6.5, P.inkFaint);
    text.draw(text.fit(`Matchloom hand-off pack · ${m.roomName}`, s, CONTENT_W - 80), PAGE.margin, y, s);
    text.draw(`page ${i - range.start + 1} of ${range.count}`, PAGE.margin + CONTENT_W, y, s, 'right');
  }
}

/** The report as PDF bytes. */
export function renderReportPdf(input: ReportPdfInput): Promise<Buffer> {
  const { model } = input;
  const doc = new PDFDocument({
    size: 'A4',
    margin: 0,
    bufferPages: true,
    autoFirstPage: true,
    info: {
      Title: `${model.title}: ${model.roomName}`,
      Subject: 'Matching network hand-off report',
      Creator: 'Matchloom',
      Producer: 'Matchloom (pdfkit)',
      CreationDate: new Date(input.createdAt),
    },
  });
  const chunks: Buffer[] = [];
  const done = new Promise<Buffer>((resolve, reject) => {
    doc.on('data', (c: Buffer) => chunks.push(c));
    doc.on('end', () => resolve(Buffer.concat(chunks)));
    doc.on('error', reject);
  });
  const text = new PdfText(doc);
  const l = new Layout(doc, text);
  header(l, model);
  figureTiles(l, model);
  pictures(l, model, input.pictures);
  summary(l, model);
  elementTable(l, model);
  cautions(l, model);
  lineTable(l, input.lines);
  notes(l, model);
  footers(doc, text, model);
  doc.end();
  return done;
}
