// drawTraceModel (the Smith chart's trace layer) against a recording 2D context: what it strokes and
// fills, in which order and style, for the demo chip antenna's model. Geometry is tested in
// chart-model.test.ts; this checks that the drawing shows what the model holds.
import { describe, expect, it } from 'vitest';
import { engineCore } from '../../client/features/workspace/analysis/engine-core';
import { CHART_PALETTE } from '../../client/features/workspace/chart/chart-palette';
import { drawTraceModel } from '../../client/features/workspace/chart/trace-drawing';
import { buildTraceModel } from '../../client/features/workspace/chart/trace-model';
import { chipAntennaDesign } from './analysis-fixtures';

interface Op {
  kind: 'stroke' | 'fill' | 'text' | 'backdrop';
  style: string;
  width: number;
  /** the current path's points (moveTo / lineTo) or arcs (x, y, r) */
  points: number[];
  arcs: number[][];
  text?: string;
}

/** A stand-in 2D context that records each stroke, fill and text with its style and path. */
function recordingContext(): { ctx: CanvasRenderingContext2D; ops: Op[] } {
  const ops: Op[] = [];
  let points: number[] = [];
  let arcs: number[][] = [];
  const state = { strokeStyle: '', fillStyle: '', lineWidth: 1 };
  const ctx = {
    ...state,
    globalAlpha: 1,
    font: '',
    textBaseline: 'alphabetic',
    textAlign: 'start',
    lineCap: 'butt',
    lineJoin: 'miter',
    save() {},
    restore() {},
    setLineDash() {},
    beginPath() {
      points = [];
      arcs = [];
    },
    closePath() {},
    moveTo(x: number, y: number) {
      points.push(x, y);
    },
    lineTo(x: number, y: number) {
      points.push(x, y);
    },
    arc(x: number, y: number, r: number) {
      arcs.push([x, y, r]);
    },
    rect(x: number, y: number) {
      points.push(x, y);
    },
    roundRect(x: number, y: number) {
      points.push(x, y);
    },
    stroke() {
      ops.push({ kind: 'stroke', style: String(this.strokeStyle), width: this.lineWidth, points: [...points], arcs: [...arcs] });
    },
    fill() {
      ops.push({ kind: 'fill', style: String(this.fillStyle), width: 0, points: [...points], arcs: [...arcs] });
    },
    fillRect(x: number, y: number, w: number, h: number) {
      ops.push({ kind: 'backdrop', style: String(this.fillStyle), width: w, points: [x, y, x + w, y + h], arcs: [] });
    },
    fillText(s: string, x: number, y: number) {
      ops.push({ kind: 'text', style: String(this.fillStyle), width: 0, points: [x, y], arcs: [], text: s });
    },
  };
  return { ctx: ctx as unknown as CanvasRenderingContext2D, ops };
}

describe('drawTraceModel', () => {
  const design = chipAntennaDesign();
  const { result, path } = engineCore.analyze(design);
  const model = buildTraceModel({ width: 480, height: 440, design, result, path, selectedElementId: 'l1' });
  const { ctx, ops } = recordingContext();
  drawTraceModel(ctx, model);

  it('strokes the band trace in band thick, in the trace colour, through every in-band point', () => {
    const inBand = ops.find((o) => o.kind === 'stroke' && o.style === CHART_PALETTE.trace);
    expect(inBand?.width).toBe(4.5);
    expect(inBand?.points).toEqual(Array.from(model.trace!.inBand));
  });

  it('strokes each stage of the impedance path in its kind’s tint, over a glow for the selected one', () => {
    const segments = model.path.map((s) => ops.findIndex((o) => o.kind === 'stroke' && o.style === s.colour && o.width === 2.6 && o.points[0] === s.points[0]));
    expect(segments.every((i) => i >= 0)).toBe(true);
    const glow = ops.findIndex((o) => o.kind === 'stroke' && o.style === CHART_PALETTE.selection);
    expect(glow).toBeGreaterThanOrEqual(0);
    expect(glow).toBeLessThan(segments[1]); // l1 is selected: its glow lies under it
    // the path lies over the band trace
    expect(Math.min(...segments)).toBeGreaterThan(ops.findIndex((o) => o.style === CHART_PALETTE.trace));
  });

  it('draws the goal circle at its radius with its VSWR label, and a marker at every stage', () => {
    const goal = ops.find((o) => o.kind === 'stroke' && o.style === CHART_PALETTE.goal);
    expect(goal?.arcs[0]).toEqual([model.goal!.x, model.goal!.y, model.goal!.r]);
    expect(ops.some((o) => o.kind === 'text' && o.text === 'goal VSWR 2')).toBe(true);
    // stage markers: one filled square for the load, a circle for each later stage
    const stageFills = ops.filter((o) => o.kind === 'fill' && model.stages.some((m) => o.arcs.some((a) => a[0] === m.x && a[1] === m.y) || (o.points[0] === m.x - 4.5 && o.points[1] === m.y - 4.5)));
    expect(stageFills).toHaveLength(model.stages.length);
  });

  it('labels the band edges with their frequencies', () => {
    const labels = ops.filter((o) => o.kind === 'text' && o.style === CHART_PALETTE.traceDeep).map((o) => o.text);
    expect(labels).toHaveLength(model.bandMarks.filter((b) => b.role !== 'centre').length);
    expect(labels.every((t) => /GHz|MHz/.test(t ?? ''))).toBe(true);
  });

  it('draws every label over a backdrop of the chart paper that holds the text, just before it', () => {
    // common practice: a label over grid lines stays readable on a box of the background colour
    const texts = ops.map((o, i) => [o, i] as const).filter(([o]) => o.kind === 'text');
    expect(texts.length).toBeGreaterThan(0);
    for (const [t, i] of texts) {
      const box = ops[i - 1];
      expect(box).toMatchObject({ kind: 'backdrop', style: CHART_PALETTE.paper });
      const [x0, y0, x1, y1] = box.points;
      // the text's top-left corner is (x, y − 5) with a 10 px font, middle baseline
      const [x, y] = t.points;
      expect(x0).toBeLessThanOrEqual(x);
      expect(y0).toBeLessThanOrEqual(y - 5);
      expect(y1).toBeGreaterThanOrEqual(y + 5);
      expect(x1 - x).toBeGreaterThanOrEqual(5.5 * (t.text ?? '').length);
    }
  });
});
