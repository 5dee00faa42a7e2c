/**
 * Draws the report's pictures (shared/handoff/smith-picture.ts, sweep-picture.ts) as PDF vector paths.
 */
import type { Paint } from '../../../shared/handoff/palette';
import { REPORT_PALETTE } from '../../../shared/handoff/palette';
import type { SmithPicture } from '../../../shared/handoff/smith-picture';
import type { SweepPicture } from '../../../shared/handoff/sweep-picture';
import type { PdfText } from './rich-text';

type Doc = PDFKit.PDFDocument;

function polyline(doc: Doc, pts: readonly number[]): boolean {
  if (pts.length < 4) return false;
  doc.moveTo(pts[0], pts[1]);
  for (let i = 2; i < pts.length; i += 2) doc.lineTo(pts[i], pts[i + 1]);
  return true;
}

function stroke(doc: Doc, paint: Paint, width: number): void {
  doc.lineWidth(width).strokeColor(paint.colour, paint.opacity).stroke();
}

function panel(doc: Doc, box: { x: number; y: number; width: number; height: number }): void {
  doc.save();
  doc.roundedRect(box.x, box.y, box.width, box.height, 6).fillColor(REPORT_PALETTE.paper.colour, 1).fill();
  doc.roundedRect(box.x + 0.25, box.y + 0.25, box.width - 0.5, box.height - 0.5, 6);
  stroke(doc, REPORT_PALETTE.rule, 0.5);
  doc.restore();
}

export function drawSmith(doc: Doc, text: PdfText, pic: SmithPicture): void {
  const { cx, cy, radius } = pic.frame;
  panel(doc, pic.box);

  // Grid, clipped to the rim.
  doc.save();
  doc.circle(cx, cy, radius).clip();
  for (const c of pic.circles) {
    if (c.role === 'rim') continue;
    doc.circle(c.x, c.y, c.r);
    stroke(doc, c.paint, c.width);
  }
  doc.moveTo(pic.axis[0], pic.axis[1]).lineTo(pic.axis[2], pic.axis[3]);
  stroke(doc, REPORT_PALETTE.gridMajor, 0.6);
  if (pic.goal) {
    doc.circle(pic.goal.x, pic.goal.y, pic.goal.r).dash(3, { space: 2 });
    stroke(doc, pic.goal.paint, 0.9);
    doc.undash();
  }
  doc.restore();

  const rim = pic.circles.find((c) => c.role === 'rim');
  if (rim) {
    doc.save();
    doc.circle(rim.x, rim.y, rim.r);
    stroke(doc, rim.paint, rim.width);
    doc.restore();
  }
  for (const l of pic.labels) text.draw(l.text, l.x, l.y + 5, { size: 5.5, paint: l.paint }, l.align);

  // Band trace under the path: thin outside the band, thick amber inside.
  doc.save();
  doc.lineCap('round').lineJoin('round');
  if (pic.trace) {
    for (const piece of pic.trace.outside) if (polyline(doc, piece)) stroke(doc, pic.trace.outsidePaint, 1.3);
    if (polyline(doc, pic.trace.inBand)) stroke(doc, pic.trace.paint, 3.2);
  }
  for (const seg of pic.path) if (polyline(doc, seg.points)) stroke(doc, seg.paint, 1.6);
  const order = (r: string) => (r === 'port' ? 2 : r === 'load' ? 1 : 0);
  for (const m of [...pic.markers].sort((a, b) => order(a.role) - order(b.role))) {
    if (m.role === 'load') {
      doc.rect(m.x - 2.6, m.y - 2.6, 5.2, 5.2).fillColor(m.paint.colour, m.paint.opacity).fill();
    } else if (m.role === 'port') {
      doc.circle(m.x, m.y, 3).fillColor(REPORT_PALETTE.white.colour, 1).fill();
      doc.circle(m.x, m.y, 3);
      stroke(doc, m.paint, 1.3);
    } else if (m.role === 'stage') {
      doc.circle(m.x, m.y, 1.8).fillColor(m.paint.colour, m.paint.opacity).fill();
    } else if (m.role === 'centre') {
      doc.circle(m.x, m.y, 2.4);
      stroke(doc, m.paint, 1);
    } else {
      // band edges: small deep-amber dots on the thick trace
      doc.circle(m.x, m.y, 1.9).fillColor(m.paint.colour, m.paint.opacity).fill();
    }
  }
  doc.restore();
}

export function drawSweep(doc: Doc, text: PdfText, pic: SweepPicture): void {
  const p = pic.plot;
  panel(doc, pic.box);
  doc.save();
  doc.rect(p.x, p.y, p.width, p.height).fillColor(REPORT_PALETTE.white.colour, 0.55).fill();
  if (pic.band) doc.rect(pic.band.x0, p.y, Math.max(0.8, pic.band.x1 - pic.band.x0), p.height).fillColor(pic.band.paint.colour, pic.band.paint.opacity).fill();
  for (const t of pic.yTicks) {
    doc.moveTo(p.x, t.at).lineTo(p.x + p.width, t.at);
    stroke(doc, REPORT_PALETTE.gridMinor, 0.4);
    text.draw(t.text, p.x - 3, t.at + 2, { size: 6, paint: REPORT_PALETTE.gridLabel }, 'right');
  }
  for (const t of pic.xTicks) {
    doc.moveTo(t.at, p.y).lineTo(t.at, p.y + p.height);
    stroke(doc, REPORT_PALETTE.gridMinor, 0.4);
    text.draw(t.text, t.at, p.y + p.height + 8, { size: 6, paint: REPORT_PALETTE.gridLabel }, 'center');
  }
  doc.rect(p.x, p.y, p.width, p.height);
  stroke(doc, REPORT_PALETTE.gridMajor, 0.6);

  for (const e of pic.bandwidthEdges) {
    doc.moveTo(e.x, p.y).lineTo(e.x, p.y + p.height).dash(2, { space: 2 });
    stroke(doc, REPORT_PALETTE.goal, 0.7);
    doc.undash();
  }
  if (pic.goal) {
    doc.moveTo(p.x, pic.goal.y).lineTo(p.x + p.width, pic.goal.y).dash(4, { space: 2 });
    stroke(doc, pic.goal.paint, 1);
    doc.undash();
  }
  doc.save();
  doc.rect(p.x, p.y - 1, p.width, p.height + 2).clip();
  doc.lineCap('round').lineJoin('round');
  if (polyline(doc, pic.trace)) stroke(doc, pic.tracePaint, 1.8);
  doc.restore();
  if (pic.goal) {
    // The goal's label last, on a paper patch, so neither the trace nor an edge line crosses it.
    const label = { size: 6, weight: 'semibold' as const, paint: pic.goal.paint };
    const w = text.width(pic.goal.text, label);
    doc.rect(p.x + p.width - 5 - w, pic.goal.y - 9, w + 4, 7.5).fillColor(REPORT_PALETTE.paper.colour, 0.92).fill();
    text.draw(pic.goal.text, p.x + p.width - 3, pic.goal.y - 2.5, label, 'right');
  }
  doc.restore();

  text.draw(pic.xLabel, p.x + p.width / 2, p.y + p.height + 18, { size: 6.5, paint: REPORT_PALETTE.inkSoft }, 'center');
  doc.save();
  doc.rotate(-90, { origin: [pic.box.x + 9, p.y + p.height / 2] });
  text.draw(pic.yLabel, pic.box.x + 9, p.y + p.height / 2 + 2, { size: 6.5, paint: REPORT_PALETTE.inkSoft }, 'center');
  doc.restore();
}
