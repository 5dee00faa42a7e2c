/**
 * Draws a TraceModel (trace-model.ts) straight onto a 2D context: the chart's trace layer is one
 * Konva shape whose scene function calls this, so a new analysis result redraws the layer without
 * React or react-konva reconciling a node per segment and marker.
 *
 * Order, bottom to top: yield envelope, goal circle and its label, compared and previewed overlays,
 * the band trace (thin outside the band, thick inside), other people's selection halos, the
 * impedance path (selection glow, then each segment in its kind's tint), the stage markers, the
 * band edge and centre marks with their frequency labels.
 */
import { CHART_PALETTE } from './chart-palette';
import { labelWidth } from './grid-model';
import { frequencyText } from './readout';
import type { Overlay, TraceModel } from './trace-model';

export const CHART_FONT = "'Nunito Sans', ui-sans-serif, system-ui, sans-serif";

interface StrokeStyle {
  colour: string;
  width: number;
  dash?: number[];
  opacity?: number;
  round?: boolean;
}

function polyline(ctx: CanvasRenderingContext2D, pts: ArrayLike<number>, closed = false): boolean {
  if (pts.length < 4) return false;
  ctx.beginPath();
  ctx.moveTo(pts[0], pts[1]);
  for (let i = 2; i + 1 < pts.length; i += 2) ctx.lineTo(pts[i], pts[i + 1]);
  if (closed) ctx.closePath();
  return true;
}

function strokeLine(ctx: CanvasRenderingContext2D, pts: ArrayLike<number>, s: StrokeStyle): void {
  if (!polyline(ctx, pts)) return;
  ctx.globalAlpha = s.opacity ?? 1;
  ctx.strokeStyle = s.colour;
  ctx.lineWidth = s.width;
  ctx.setLineDash(s.dash ?? []);
  ctx.lineCap = s.round ? 'round' : 'butt';
  ctx.lineJoin = s.round ? 'round' : 'miter';
  ctx.stroke();
}

function circle(ctx: CanvasRenderingContext2D, x: number, y: number, r: number, fill: string | null, stroke: string | null, width = 1): void {
  ctx.beginPath();
  ctx.arc(x, y, r, 0, Math.PI * 2);
  ctx.closePath();
  ctx.globalAlpha = 1;
  if (fill) {
    ctx.fillStyle = fill;
    ctx.fill();
  }
  if (stroke) {
    ctx.setLineDash([]);
    ctx.strokeStyle = stroke;
    ctx.lineWidth = width;
    ctx.stroke();
  }
}

/** Text with its top-left corner at (x, y), like a Konva Text of one line. */
function text(ctx: CanvasRenderingContext2D, s: string, x: number, y: number, colour: string, bold = false): void {
  ctx.globalAlpha = 1;
  ctx.font = `${bold ? 'bold' : 'normal'} 10px ${CHART_FONT}`;
  ctx.textBaseline = 'middle';
  ctx.textAlign = 'left';
  // on a backdrop of the chart's paper, so that a label stays readable over a grid label or a circle
  // (a filled box: stroking the glyphs for a halo costs several times more to raster)
  ctx.globalAlpha = 0.8;
  ctx.fillStyle = CHART_PALETTE.paper;
  ctx.fillRect(x - 2, y - 1, labelWidth(s) + (bold ? 4 : 2), 12);
  ctx.globalAlpha = 1;
  ctx.fillStyle = colour;
  ctx.fillText(s, x, y + 5);
}

function overlay(ctx: CanvasRenderingContext2D, o: Overlay, colour: string): void {
  for (const pts of o.path) strokeLine(ctx, pts, { colour, width: 2, dash: [6, 4], opacity: 0.75, round: true });
  if (!o.trace) return;
  for (const pts of o.trace.outside) strokeLine(ctx, pts, { colour, width: 1.2, dash: [4, 4], opacity: 0.55 });
  strokeLine(ctx, o.trace.inBand, { colour, width: 3, dash: [8, 5], opacity: 0.7, round: true });
}

export function drawTraceModel(ctx: CanvasRenderingContext2D, model: TraceModel): void {
  ctx.save();
  if (model.envelope && polyline(ctx, model.envelope, true)) {
    ctx.fillStyle = CHART_PALETTE.envelope;
    ctx.fill();
  }
  if (model.goal && model.goal.r > 0.5) {
    const g = model.goal;
    ctx.beginPath();
    ctx.arc(g.x, g.y, g.r, 0, Math.PI * 2);
    ctx.strokeStyle = CHART_PALETTE.goal;
    ctx.lineWidth = 1.4;
    ctx.setLineDash([7, 5]);
    ctx.stroke();
    const gv = (1 + g.gamma) / (1 - g.gamma);
    text(ctx, `goal VSWR ${Number(gv.toPrecision(3))}`, g.x + g.r * 0.7071 + 3, g.y - g.r * 0.7071 - 13, CHART_PALETTE.goal);
  }
  if (model.compare) overlay(ctx, model.compare, CHART_PALETTE.compare);
  if (model.preview) overlay(ctx, model.preview, CHART_PALETTE.preview);
  if (model.trace) {
    for (const pts of model.trace.outside) strokeLine(ctx, pts, { colour: CHART_PALETTE.traceOutOfBand, width: 1.6, round: true });
    strokeLine(ctx, model.trace.inBand, { colour: CHART_PALETTE.trace, width: 4.5, round: true });
  }
  // other people's selections: a halo in each person's colour (several on one stage nest, widest below)
  const peersOn = new Map<string, number>();
  const halos = model.peerSelections.map((p) => {
    const n = peersOn.get(p.elementId) ?? 0;
    peersOn.set(p.elementId, n + 1);
    return { p, width: 14 + 5 * n };
  });
  for (const { p, width } of halos.sort((a, b) => b.width - a.width)) strokeLine(ctx, p.points, { colour: p.colour, width, opacity: 0.45, round: true });
  for (const s of model.path) {
    if (s.selected) strokeLine(ctx, s.points, { colour: CHART_PALETTE.selection, width: 10, round: true });
    strokeLine(ctx, s.points, { colour: s.colour, width: 2.6, round: true });
  }
  ctx.globalAlpha = 1;
  ctx.setLineDash([]);
  for (const m of model.stages) {
    if (m.role === 'load') {
      ctx.beginPath();
      if (typeof ctx.roundRect === 'function') ctx.roundRect(m.x - 4.5, m.y - 4.5, 9, 9, 1.5);
      else ctx.rect(m.x - 4.5, m.y - 4.5, 9, 9);
      ctx.fillStyle = CHART_PALETTE.ink;
      ctx.fill();
    } else circle(ctx, m.x, m.y, m.role === 'port' ? 5.5 : 4, m.role === 'port' ? m.colour : CHART_PALETTE.paper, m.colour, 2);
  }
  const centre = model.bandMarks.find((b) => b.role === 'centre');
  for (const b of model.bandMarks) {
    if (b.role === 'centre') {
      // a diamond (a square on its corner), as Konva's four-sided RegularPolygon of radius 6
      ctx.beginPath();
      ctx.moveTo(b.x, b.y - 6);
      ctx.lineTo(b.x + 6, b.y);
      ctx.lineTo(b.x, b.y + 6);
      ctx.lineTo(b.x - 6, b.y);
      ctx.closePath();
      ctx.fillStyle = CHART_PALETTE.traceDeep;
      ctx.fill();
      ctx.strokeStyle = CHART_PALETTE.paper;
      ctx.lineWidth = 1.2;
      ctx.stroke();
      continue;
    }
    circle(ctx, b.x, b.y, 4.5, CHART_PALETTE.paper, CHART_PALETTE.traceDeep, 2);
    const label = frequencyText(b.hz);
    // push each edge label away from the centre mark (so the two edges never share a spot), else away from Γ = 0
    let dx = centre ? b.x - centre.x : 0;
    let dy = centre ? b.y - centre.y : 0;
    if (Math.hypot(dx, dy) < 2) {
      dx = b.x - model.frame.cx;
      dy = b.y - model.frame.cy;
    }
    const d = Math.hypot(dx, dy) || 1;
    const w = labelWidth(label);
    text(ctx, label, b.x + (dx / d) * 14 - (dx < 0 ? w : 0), b.y + (dy / d) * 14 - 6, CHART_PALETTE.traceDeep, true);
  }
  ctx.restore();
}
