/**
 * FOR THE WORKSPACE ENGINEER: <SweepPlot width height design result mode="return-loss" | "vswr"
 * compare? envelope? />. Return loss is plotted as positive dB (up = better match, the axis says
 * so); VSWR with 1 at the bottom. The band is shaded, the goal is a dashed line, the bandwidth edges
 * are marked, a compared snapshot is a dashed slate trace and a yield envelope a faint amber band.
 * Drag across the plot to zoom in on frequency; double-click to zoom back out. Types from
 * ../analysis/engine-types.
 */
import { memo, useEffect, useLayoutEffect, useMemo, useRef, useState } from 'react';
import uPlot from 'uplot';
import 'uplot/dist/uPlot.min.css';
import type { Design } from '../../../../shared/rf/design';
import type { AnalysisResult } from '../analysis/engine-types';
import { markDrawn } from '../analysis/draw-marks';
import { drawingKeyOf, sameDrawingProps } from '../analysis/drawing-key';
import { withLowLatencyCanvases } from '../layout/low-latency-canvas';
import { buildPlotModel, plotSummary, yLabelFor, type PlotModel, type SweepPlotMode } from './plot-model';

export type { SweepPlotMode };

export interface SweepPlotProps {
  width: number;
  height: number;
  design: Design | null;
  result: AnalysisResult | null;
  mode: SweepPlotMode;
  compare?: { result: AnalysisResult; label: string } | null;
  /** yield envelope: |Γ| per sweep frequency (drawn as a faint band) */
  envelope?: { minGamma: Float64Array; maxGamma: Float64Array } | null;
}

const C = {
  ink: '#1e2b47',
  inkSoft: '#45526e',
  inkFaint: '#6c7791',
  grid: 'rgba(30, 43, 71, 0.10)',
  band: 'rgba(217, 150, 43, 0.13)',
  trace: '#d9962b',
  traceDeep: '#8a5a0e',
  goal: '#136560',
  bandwidth: '#1d8a84',
  compare: '#5b6b80',
  envelope: 'rgba(217, 150, 43, 0.22)',
  paper: '#fffdf8',
};
const FONT = "11px 'Nunito Sans', ui-sans-serif, system-ui, sans-serif";
const LABEL_FONT = "bold 11px 'Nunito Sans', ui-sans-serif, system-ui, sans-serif";
const READOUT_HEIGHT = 20;

/** uPlot's aligned data for a model: x, main, [compare], [envelope best, envelope worst]. */
function alignedData(m: PlotModel): uPlot.AlignedData {
  const data: (ArrayLike<number | null> | Float64Array)[] = [m.x, m.main];
  if (m.compare) data.push(m.compare);
  if (m.envelope) data.push(m.envelope.best, m.envelope.worst);
  return data as uPlot.AlignedData;
}

/** What forces a new uPlot instance (series layout and mode); everything else is setData/setScale. */
function shapeKey(m: PlotModel): string {
  return `${m.mode}|${m.compare ? 'c' : ''}|${m.envelope ? 'e' : ''}|${m.unit.label}`;
}

function decorations(u: uPlot, m: PlotModel): void {
  const ctx = u.ctx;
  const { left, top, width, height } = u.bbox;
  const px = (v: number) => u.valToPos(v, 'x', true);
  const py = (v: number) => u.valToPos(v, 'y', true);
  const dpr = uPlot.pxRatio;
  ctx.save();
  ctx.beginPath();
  ctx.rect(left, top, width, height);
  ctx.clip();
  if (m.band) {
    const x0 = Math.max(left, px(m.band.start));
    const x1 = Math.min(left + width, px(m.band.stop));
    if (x1 > x0) {
      ctx.fillStyle = C.band;
      ctx.fillRect(x0, top, x1 - x0, height);
    }
    const xc = px(m.band.centre);
    ctx.strokeStyle = C.traceDeep;
    ctx.globalAlpha = 0.5;
    ctx.lineWidth = dpr;
    ctx.setLineDash([2 * dpr, 3 * dpr]);
    ctx.beginPath();
    ctx.moveTo(xc, top);
    ctx.lineTo(xc, top + height);
    ctx.stroke();
    ctx.globalAlpha = 1;
  }
  if (m.goal !== null) {
    const y = py(m.goal);
    ctx.strokeStyle = C.goal;
    ctx.lineWidth = 1.4 * dpr;
    ctx.setLineDash([7 * dpr, 5 * dpr]);
    ctx.beginPath();
    ctx.moveTo(left, y);
    ctx.lineTo(left + width, y);
    ctx.stroke();
    ctx.setLineDash([]);
    ctx.fillStyle = C.goal;
    ctx.font = FONT.replace('11px', `${11 * dpr}px`);
    ctx.textBaseline = 'bottom';
    const text = m.mode === 'return-loss' ? `goal ${m.goal.toFixed(1)} dB` : `goal VSWR ${Number(m.goal.toPrecision(3))}`;
    // at the right end, or the left end when a bandwidth edge would cross the label there
    const w = ctx.measureText(text).width + 8 * dpr;
    const edges = m.bandwidth ? [px(m.bandwidth.low), px(m.bandwidth.high)] : [];
    const rightFree = !edges.some((x) => x > left + width - w && x < left + width);
    ctx.textAlign = rightFree ? 'right' : 'left';
    ctx.fillText(text, rightFree ? left + width - 4 * dpr : left + 4 * dpr, y - 2 * dpr);
  }
  if (m.bandwidth) {
    ctx.strokeStyle = C.bandwidth;
    ctx.lineWidth = 1.5 * dpr;
    ctx.setLineDash([]);
    ctx.font = LABEL_FONT.replace('11px', `${10 * dpr}px`);
    ctx.fillStyle = C.bandwidth;
    ctx.textBaseline = 'top';
    for (const [v, outward] of [
      [m.bandwidth.low, 'right'],
      [m.bandwidth.high, 'left'],
    ] as const) {
      const x = px(v);
      ctx.beginPath();
      ctx.moveTo(x, top);
      ctx.lineTo(x, top + height);
      ctx.stroke();
      // label outside the bandwidth, unless that would leave the plot
      const text = `${Number(v.toPrecision(4))}`;
      const w = ctx.measureText(text).width + 4 * dpr;
      const align = outward === 'right' ? (x - w < left ? 'left' : 'right') : x + w > left + width ? 'right' : 'left';
      ctx.textAlign = align;
      ctx.fillText(text, x + (align === 'left' ? 3 : -3) * dpr, top + 3 * dpr);
    }
  }
  ctx.restore();
}

/**
 * A drag that began elsewhere (a value tuned on the chain canvas) passes over the plot without
 * moving its cursor and read-out: that would cost a cursor update and a React render per pointer
 * event while the plot is being redrawn for the tuned value. A drag begun on the plot (frequency
 * zoom) works as usual.
 */
function passOverWhileDraggingElsewhere(): uPlot.Cursor.Bind {
  let pressedHere = false;
  // as uPlot's own bindings: a press with the main button, events on the plot's own area
  return {
    mousedown: (_u, targ, handler, onlyTarg = true) => (e) => {
      if (e.button !== 0 || (onlyTarg && e.target !== targ)) return null;
      pressedHere = true;
      return handler(e);
    },
    mousemove: (_u, targ, handler, onlyTarg = true) => (e) => {
      if (e.buttons === 0) pressedHere = false;
      else if (!pressedHere) return null;
      return onlyTarg && e.target !== targ ? null : handler(e);
    },
  };
}

function plotOptions(m: PlotModel, width: number, height: number, model: { current: PlotModel }, onDrawn: () => void, onCursor: (i: number | null) => void): uPlot.Options {
  const series: uPlot.Series[] = [
    {},
    { label: m.mode === 'return-loss' ? 'Return loss' : 'VSWR', stroke: C.trace, width: 2.5, points: { show: false } },
  ];
  const bands: uPlot.Band[] = [];
  if (m.compare) series.push({ label: m.compareLabel ?? 'compared', stroke: C.compare, width: 1.6, dash: [6, 4], points: { show: false } });
  if (m.envelope) {
    const first = series.length;
    series.push({ label: 'yield best', stroke: 'transparent', width: 0, points: { show: false } });
    series.push({ label: 'yield worst', stroke: 'transparent', width: 0, points: { show: false } });
    // fill between the two edges (uPlot fills from the first series of the pair toward the second)
    bands.push({ series: m.mode === 'return-loss' ? [first, first + 1] : [first + 1, first], fill: C.envelope });
  }
  const axis = (label: string): uPlot.Axis => ({
    label,
    font: FONT,
    labelFont: LABEL_FONT,
    stroke: C.inkSoft,
    grid: { stroke: C.grid, width: 1 },
    ticks: { stroke: C.grid, width: 1, size: 4 },
  });
  return {
    width,
    height: Math.max(60, height - READOUT_HEIGHT),
    legend: { show: false },
    cursor: {
      drag: { x: true, y: false, setScale: true },
      points: { size: 7, fill: C.paper, stroke: C.traceDeep, width: 2 },
      bind: passOverWhileDraggingElsewhere(),
    },
    scales: {
      x: { time: false },
      y: { range: () => model.current.yRange },
    },
    axes: [
      { ...axis(m.xLabel), size: 28, labelSize: 16, labelGap: 0, values: (_u, splits) => splits.map((v) => String(Number(v.toPrecision(6)))) },
      { ...axis(yLabelFor(m, height - READOUT_HEIGHT)), size: 40, labelSize: 18, labelGap: 0, values: (_u, splits) => splits.map((v) => String(Number(v.toPrecision(4)))) },
    ],
    series,
    bands,
    hooks: {
      drawClear: [(u) => decorations(u, model.current)],
      draw: [() => onDrawn()],
      setCursor: [(u) => onCursor(u.cursor.idx ?? null)],
    },
  };
}

/** Re-renders only when something it draws changes (see SmithChart). */
export const SweepPlot = memo(SweepPlotView, sameDrawingProps);

function SweepPlotView(props: SweepPlotProps) {
  const { width, height, design, result, mode, compare, envelope } = props;
  // the design matters only through band and goal: a tuned value alone waits for its result
  const model = useMemo(
    () => buildPlotModel({ design, result, mode, compare, envelope }),
    [drawingKeyOf(design), result, mode, compare, envelope],
  );
  const holder = useRef<HTMLDivElement>(null);
  const plot = useRef<uPlot | null>(null);
  const latest = useRef(model);
  const drawnResult = useRef<AnalysisResult | null>(null);
  const [cursorIdx, setCursorIdx] = useState<number | null>(null);
  latest.current = model;
  drawnResult.current = result;
  const key = shapeKey(model);

  // (Re)create uPlot when the series layout changes.
  useLayoutEffect(() => {
    const el = holder.current;
    if (!el) return;
    const u = withLowLatencyCanvases(
      () =>
        new uPlot(
          plotOptions(latest.current, width, height, latest, () => markDrawn('plot', drawnResult.current), setCursorIdx),
          alignedData(latest.current),
          el,
        ),
    );
    plot.current = u;
    return () => {
      u.destroy();
      plot.current = null;
    };
    // width/height are applied by the resize effect; only the shape recreates the plot
  }, [key]);

  // New data: keep the user's frequency zoom when the sweep is unchanged. Drawn in the commit that
  // brings the result (like the chart), not after the next paint.
  const prevX = useRef<{ n: number; a: number; b: number } | null>(null);
  useLayoutEffect(() => {
    const u = plot.current;
    if (!u) return;
    const x = model.x;
    const sig = { n: x.length, a: x[0] ?? 0, b: x[x.length - 1] ?? 0 };
    const p = prevX.current;
    const sameSweep = p !== null && p.n === sig.n && p.a === sig.a && p.b === sig.b;
    prevX.current = sig;
    u.setData(alignedData(model), !sameSweep);
    if (sameSweep) {
      const [lo, hi] = model.yRange;
      const ys = u.scales.y;
      if (ys.min !== lo || ys.max !== hi) u.setScale('y', { min: lo, max: hi });
      else u.redraw(true, false);
    }
  }, [model]);

  useEffect(() => {
    const u = plot.current;
    if (!u) return;
    // uPlot draws the axis label from its axis on every draw: the new size's label shows at setSize.
    if (u.axes[1]) u.axes[1].label = yLabelFor(latest.current, height - READOUT_HEIGHT);
    u.setSize({ width, height: Math.max(60, height - READOUT_HEIGHT) });
  }, [width, height]);

  const summary = plotSummary(model, result);
  const readout = cursorReadout(model, cursorIdx);
  return (
    <div className="matchloom-sweep-plot relative" style={{ width, height }} data-testid="sweep-plot">
      <div className="flex h-5 items-center gap-3 px-1 text-[11px]" style={{ color: C.inkSoft }} aria-hidden="true">
        <span className="flex items-center gap-1">
          <span className="inline-block h-[3px] w-4 rounded" style={{ background: C.trace }} />
          {model.mode === 'return-loss' ? 'return loss' : 'VSWR'}
        </span>
        {model.compareLabel ? (
          <span className="flex items-center gap-1">
            <span className="inline-block w-4 border-t-2 border-dashed" style={{ borderColor: C.compare }} />
            {model.compareLabel}
          </span>
        ) : null}
        {model.envelope ? (
          <span className="flex items-center gap-1">
            <span className="inline-block h-2 w-4 rounded-sm" style={{ background: C.envelope }} />
            yield spread
          </span>
        ) : null}
        <span className="ml-auto" style={{ fontFamily: 'ui-monospace, monospace', color: C.ink }}>
          {readout}
        </span>
      </div>
      <div role="img" aria-label={summary} ref={holder} />
    </div>
  );
}

function cursorReadout(m: PlotModel, idx: number | null): string {
  if (idx === null || idx < 0 || idx >= m.x.length) return '';
  const v = m.main[idx];
  const f = `${Number(m.x[idx].toPrecision(6))} ${m.unit.label}`;
  if (v === null) return f;
  const val = m.mode === 'return-loss' ? `${v >= 300 ? '> 120' : v.toFixed(1)} dB` : v >= 100 ? 'VSWR ∞' : `VSWR ${v.toFixed(2)}`;
  const cmp = m.compare?.[idx];
  const cmpText =
    cmp === null || cmp === undefined ? '' : ` · ${m.compareLabel}: ${m.mode === 'return-loss' ? `${cmp.toFixed(1)} dB` : cmp >= 100 ? '∞' : cmp.toFixed(2)}`;
  return `${f}  ${val}${cmpText}`;
}
