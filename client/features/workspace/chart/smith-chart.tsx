/**
 * FOR THE WORKSPACE ENGINEER: <SmithChart width height design result path ... /> (props below).
 * Types: AnalysisResult / ImpedancePath from ../analysis/engine-types (the engine's own types).
 * - `view` is controlled when given (the chart then only calls onViewChange); without it the chart
 *   keeps its own zoom/pan. Wheel zooms about the pointer, drag pans, double-click resets.
 * - A click on an impedance-path segment calls onSelectElement(id); a click on the band trace calls
 *   onPickFrequency(hz); a click elsewhere calls onSelectElement(null).
 * - onCursorMove(Γ) reports the pointer in the Γ plane (null on leave) for presence; `cursors` draws
 *   other people's pointers.
 *
 * Two Konva layers: the chart (the grid, cached as one bitmap rebuilt only on size/view/grid
 * options, under one shape drawing the trace model, trace-drawing.ts; redrawn synchronously when a
 * new model is built: a result, the view, a selection, an overlay) and the pointer layer (hover,
 * cursors; hidden while empty). A new result re-renders this component but not the Konva stage: react-konva reconciles
 * the stage only when the grid, the cursors or the hover change.
 */
import { memo, useCallback, useEffect, useLayoutEffect, useMemo, useRef, useState, type RefObject } from 'react';
import { Circle, Group, Layer, Line, Rect, Shape, Stage, Text } from 'react-konva';
import type Konva from 'konva';
import type { Design } from '../../../../shared/rf/design';
import type { AnalysisResult, ImpedancePath } from '../analysis/engine-types';
import { markDrawn } from '../analysis/draw-marks';
import { drawingKeyOf, sameDrawingProps } from '../analysis/drawing-key';
import { CHART_PALETTE, elementKindColour, elementKindFamily } from './chart-palette';
import { DEFAULT_VIEW, panView, pixelToGamma, zoomViewAt, type ChartView } from './geometry';
import { buildGridModel, labelWidth, type GridModel } from './grid-model';
import { chartReadout, chartSummary, type Readout } from './readout';
import { CHART_FONT, drawTraceModel } from './trace-drawing';
import { cacheOffScreen, installLowLatencyKonvaCanvases } from '../layout/low-latency-canvas';
import { buildTraceModel, chartZ0, nearestTracePoint, pathElementAt, traceGammas, type CursorMark, type TraceModel } from './trace-model';

export interface ChartCursor {
  userId: string;
  name: string;
  color: string;
  gamma: [number, number];
}

export interface ChartPeerSelection {
  userId: string;
  name: string;
  color: string;
  elementId: string;
}

export interface SmithChartProps {
  width: number;
  height: number;
  design: Design | null;
  result: AnalysisResult | null;
  path: ImpedancePath | null;
  showAdmittance?: boolean;
  /** constant-Q arcs to draw, e.g. [1, 3] */
  showQ?: number[];
  selectedElementId?: string | null;
  onSelectElement?: (id: string | null) => void;
  /** yield envelope: |Γ| per sweep frequency */
  envelope?: { minGamma: Float64Array; maxGamma: Float64Array } | null;
  compare?: { result: AnalysisResult; path: ImpedancePath | null; label: string } | null;
  /** match-finder candidate preview */
  preview?: { result: AnalysisResult; path: ImpedancePath | null } | null;
  cursors?: ChartCursor[];
  /** other people's selected elements: their stage of the impedance path is marked in their colour */
  peerSelections?: ChartPeerSelection[];
  onCursorMove?: (gamma: [number, number] | null) => void;
  view?: { zoom: number; cx: number; cy: number };
  onViewChange?: (v: { zoom: number; cx: number; cy: number }) => void;
  /** click on the band trace (for notes) */
  onPickFrequency?: (hz: number) => void;
}

installLowLatencyKonvaCanvases();

const FONT = CHART_FONT;
const MONO = "ui-monospace, 'DejaVu Sans Mono', 'Liberation Mono', monospace";
const ZOOM_STEP = 1.25;

interface Hover {
  x: number;
  y: number;
  gamma: [number, number];
  hz: number | null;
  readout: Readout;
}

/**
 * Re-renders only when something it draws changes: a new `design` object whose z0, band, goal and
 * chain length are unchanged (a value being tuned) waits for its analysis result instead.
 */
export const SmithChart = memo(SmithChartView, sameDrawingProps);

function SmithChartView(props: SmithChartProps) {
  const { width, height, design, result, path } = props;
  const [ownView, setOwnView] = useState<ChartView>(DEFAULT_VIEW);
  const view = props.view ?? ownView;
  const setView = useCallback(
    (v: ChartView) => {
      if (!props.view) setOwnView(v);
      props.onViewChange?.(v);
    },
    [props],
  );

  const grid = useMemo(
    () => buildGridModel({ width, height, view, showAdmittance: props.showAdmittance, showQ: props.showQ }),
    [width, height, view.zoom, view.cx, view.cy, props.showAdmittance, (props.showQ ?? []).join(',')],
  );
  const trace = useMemo(
    () =>
      buildTraceModel({
        width,
        height,
        view,
        design,
        result,
        path,
        selectedElementId: props.selectedElementId,
        envelope: props.envelope,
        compare: props.compare,
        preview: props.preview,
        cursors: props.cursors,
        peerSelections: props.peerSelections,
      }),
    // the design matters only through z0, band and goal: a tuned value alone waits for its result
    [width, height, view.zoom, view.cx, view.cy, drawingKeyOf(design), result, path, props.selectedElementId, props.envelope, props.compare, props.preview, cursorsKeyOf(props.cursors), peerSelectionsKeyOf(props.peerSelections)],
  );

  const gridGroup = useRef<Konva.Group>(null);
  const traceLayer = useRef<Konva.Layer>(null);

  // Cache the grid as one bitmap after it changes (and again once the web font has loaded).
  useLayoutEffect(() => {
    const g = gridGroup.current;
    if (!g) return;
    cacheGrid(g, grid.width, grid.height);
    traceLayer.current?.batchDraw();
  }, [grid]);
  useEffect(() => {
    if (typeof document === 'undefined' || !document.fonts) return;
    let live = true;
    void document.fonts.ready.then(() => {
      if (!live || !gridGroup.current) return;
      cacheGrid(gridGroup.current, latest.current.props.width, latest.current.props.height);
      traceLayer.current?.batchDraw();
    });
    return () => {
      live = false;
    };
  }, []);

  // Draw the traces now rather than on the next animation frame, and tell the bench. The trace
  // layer's one shape reads the newest model from here whenever Konva draws it.
  const drawnTrace = useRef(trace);
  const sceneFunc = useCallback((context: Konva.Context) => drawTraceModel(context._context, drawnTrace.current), []);
  useLayoutEffect(() => {
    drawnTrace.current = trace;
    traceLayer.current?.draw();
    markDrawn('chart', result);
  }, [trace, result]);
  // other people's cursors by content (the trace model is rebuilt for every result)
  const cursorMarks = useMemo(() => trace.cursors, [cursorMarksKeyOf(trace.cursors)]);

  // ---- pointer: hover read-out, zoom, pan, clicks -------------------------------------------
  const box = useRef<HTMLDivElement>(null);
  const [hover, setHover] = useState<Hover | null>(null);
  const drag = useRef<{ x: number; y: number; view: ChartView; moved: boolean; id: number } | null>(null);
  const latest = useRef({ trace, view, props });
  latest.current = { trace, view, props };

  const local = (e: { clientX: number; clientY: number }): [number, number] => {
    const r = box.current?.getBoundingClientRect();
    return r ? [e.clientX - r.left, e.clientY - r.top] : [e.clientX, e.clientY];
  };

  const hoverAt = useCallback(
    (px: number, py: number) => {
      const { trace: t, props: p } = latest.current;
      const z0 = chartZ0(p.design);
      const near = nearestTracePoint(t, px, py, 10);
      let gamma = pixelToGamma([px, py], t.frame);
      let hz: number | null = null;
      let x = px;
      let y = py;
      if (near && p.result) {
        const gs = traceGammas(p.result, z0);
        gamma = [gs[2 * near.index], gs[2 * near.index + 1]];
        hz = near.hz;
        x = t.hit!.pixels[2 * near.index];
        y = t.hit!.pixels[2 * near.index + 1];
      }
      p.onCursorMove?.(pixelToGamma([px, py], t.frame));
      if (!near && Math.hypot(gamma[0], gamma[1]) > 1) {
        setHover(null);
        return;
      }
      setHover({ x, y, gamma, hz, readout: chartReadout(gamma, z0, hz) });
    },
    [],
  );

  useEffect(() => {
    const el = box.current;
    if (!el) return;
    const onWheel = (e: WheelEvent) => {
      e.preventDefault();
      const { view: v, props: p } = latest.current;
      const factor = Math.exp(-e.deltaY * (e.deltaMode === 1 ? 0.05 : 0.0015));
      const r = el.getBoundingClientRect();
      const next = zoomViewAt(p.width, p.height, v, [e.clientX - r.left, e.clientY - r.top], factor);
      if (!p.view) setOwnView(next);
      p.onViewChange?.(next);
    };
    el.addEventListener('wheel', onWheel, { passive: false });
    return () => el.removeEventListener('wheel', onWheel);
  }, []);

  const onPointerDown = (e: React.PointerEvent<HTMLDivElement>) => {
    if (e.button !== 0 || (e.target as HTMLElement).closest('button')) return;
    const [x, y] = local(e);
    drag.current = { x, y, view, moved: false, id: e.pointerId };
    e.currentTarget.setPointerCapture?.(e.pointerId);
  };
  const onPointerMove = (e: React.PointerEvent<HTMLDivElement>) => {
    const [x, y] = local(e);
    const d = drag.current;
    if (d && d.id === e.pointerId) {
      const dx = x - d.x;
      const dy = y - d.y;
      if (!d.moved && Math.hypot(dx, dy) < 3) return;
      d.moved = true;
      setHover(null);
      setView(panView(width, height, d.view, dx, dy));
      return;
    }
    if (e.buttons !== 0) {
      // a drag that began elsewhere (a value tuned on the chain canvas) passes over: no read-out
      if (hover) setHover(null);
      props.onCursorMove?.(pixelToGamma([x, y], trace.frame));
      return;
    }
    hoverAt(x, y);
  };
  const onPointerUp = (e: React.PointerEvent<HTMLDivElement>) => {
    const d = drag.current;
    drag.current = null;
    if (!d || d.moved || d.id !== e.pointerId) return;
    const [x, y] = local(e);
    const id = pathElementAt(trace, x, y, 7);
    if (id) {
      props.onSelectElement?.(id);
      return;
    }
    const near = nearestTracePoint(trace, x, y, 8);
    if (near && props.onPickFrequency) {
      props.onPickFrequency(near.hz);
      return;
    }
    props.onSelectElement?.(null);
  };
  const onPointerLeave = () => {
    if (drag.current) return;
    setHover(null);
    props.onCursorMove?.(null);
  };

  const summary = useMemo(() => chartSummary(design, result), [design, result]);
  const kinds = useMemo(() => legendKinds(trace), [trace]);
  const readoutText = hover ? readoutSentence(hover.readout) : '';

  return (
    <div
      ref={box}
      className="relative select-none overflow-hidden rounded-lg"
      style={{ width, height, touchAction: 'none', background: CHART_PALETTE.paper, cursor: drag.current?.moved ? 'grabbing' : 'crosshair' }}
      onPointerDown={onPointerDown}
      onPointerMove={onPointerMove}
      onPointerUp={onPointerUp}
      onPointerCancel={() => (drag.current = null)}
      onPointerLeave={onPointerLeave}
      onDoubleClick={() => setView(DEFAULT_VIEW)}
      data-testid="smith-chart"
    >
      <div role="img" aria-label={summary}>
        <ChartStage
          width={width}
          height={height}
          grid={grid}
          cursors={cursorMarks}
          hover={hover}
          sceneFunc={sceneFunc}
          gridGroup={gridGroup}
          traceLayer={traceLayer}
        />
      </div>
      {hover ? <ReadoutCard hover={hover} width={width} /> : null}
      {kinds.length ? <Legend kinds={kinds} compare={props.compare?.label ?? null} preview={!!props.preview} /> : null}
      <ZoomButtons
        onZoom={(f) => setView(zoomViewAt(width, height, view, [width / 2, height / 2], f))}
        onReset={() => setView(DEFAULT_VIEW)}
        zoomed={view.zoom !== 1 || view.cx !== 0 || view.cy !== 0}
      />
      <p className="sr-only" aria-live="polite">
        {readoutText}
      </p>
    </div>
  );
}

interface ChartStageProps {
  width: number;
  height: number;
  grid: GridModel;
  cursors: CursorMark[];
  hover: Hover | null;
  sceneFunc: (context: Konva.Context) => void;
  gridGroup: RefObject<Konva.Group | null>;
  traceLayer: RefObject<Konva.Layer | null>;
}

/** The Konva stage; re-rendered (and reconciled by react-konva) only when one of its props changes. */
const ChartStage = memo(function ChartStage({ width, height, grid, cursors, hover, sceneFunc, gridGroup, traceLayer }: ChartStageProps) {
  // The cached grid and the traces share one canvas (a redraw copies the grid's bitmap under the
  // traces), and the pointer layer's canvas is hidden while it has nothing to show: every stacked
  // canvas is composited again at each frame, in software on these machines.
  return (
    <Stage width={width} height={height} listening={false}>
      <Layer ref={traceLayer} listening={false}>
        <Group ref={gridGroup}>
          <GridShapes grid={grid} />
        </Group>
        <Shape sceneFunc={sceneFunc} listening={false} perfectDrawEnabled={false} />
      </Layer>
      <Layer listening={false} visible={cursors.length > 0 || hover !== null}>
        <PointerShapes cursors={cursors} hover={hover} />
      </Layer>
    </Stage>
  );
});

function cursorMarksKeyOf(marks: CursorMark[]): string {
  return marks.map((c) => `${c.userId}:${c.name}:${c.colour}:${c.x}:${c.y}`).join('|');
}

/** Other people's cursors by value: presence hands over a new array on every awareness change. */
function cursorsKeyOf(cursors: ChartCursor[] | undefined): string {
  return (cursors ?? []).map((c) => `${c.userId}:${c.name}:${c.color}:${c.gamma[0]}:${c.gamma[1]}`).join('|');
}

function peerSelectionsKeyOf(sel: ChartPeerSelection[] | undefined): string {
  return (sel ?? []).map((p) => `${p.userId}:${p.name}:${p.color}:${p.elementId}`).join('|');
}

// ---- grid ----------------------------------------------------------------------------------

/** Cache the grid as one bitmap of the canvas's own size (zoomed in, its circles reach far beyond it). */
function cacheGrid(g: Konva.Group, width: number, height: number): void {
  cacheOffScreen(g, width, height);
}

/** Memoised: any re-render would hand Konva a new clip function and redraw the cached grid. */
const GridShapes = memo(function GridShapes({ grid }: { grid: GridModel }) {
  const f = grid.frame;
  const clip = (ctx: Konva.Context) => {
    ctx.beginPath();
    ctx.arc(f.cx, f.cy, f.radius, 0, Math.PI * 2);
    ctx.closePath();
  };
  const [rim, ...inner] = grid.circles;
  return (
    <>
      <Rect width={grid.width} height={grid.height} fill={CHART_PALETTE.paper} />
      <Circle x={f.cx} y={f.cy} radius={f.radius} fill="#fbf7ef" />
      <Group clipFunc={clip}>
        {inner.map((c, i) => (
          <Circle key={i} x={c.x} y={c.y} radius={c.r} stroke={c.stroke} strokeWidth={c.width} dash={c.dash} perfectDrawEnabled={false} />
        ))}
        <Line points={grid.axis} stroke={CHART_PALETTE.gridMajor} strokeWidth={1} />
      </Group>
      {rim ? <Circle x={rim.x} y={rim.y} radius={rim.r} stroke={rim.stroke} strokeWidth={rim.width} /> : null}
      {grid.labels.map((l, i) => (
        <Text
          key={i}
          x={l.align === 'left' ? l.x : l.align === 'right' ? l.x - labelWidth(l.text) : l.x - labelWidth(l.text) / 2}
          y={l.y}
          width={labelWidth(l.text)}
          align={l.align}
          text={l.text}
          fontSize={10}
          fontFamily={FONT}
          fill={l.colour}
        />
      ))}
    </>
  );
});

// ---- pointer layer ----------------------------------------------------------------------

function PointerShapes({ cursors, hover }: { cursors: CursorMark[]; hover: Hover | null }) {
  return (
    <>
      {cursors.map((c) => (
        <Group key={c.userId} x={c.x} y={c.y}>
          <Circle radius={5} fill={c.colour} stroke={CHART_PALETTE.paper} strokeWidth={1.5} />
          <Rect x={8} y={-8} width={labelWidth(c.name) + 8} height={16} cornerRadius={8} fill={c.colour} opacity={0.92} />
          <Text x={12} y={-5} text={c.name} fontSize={10} fontStyle="bold" fontFamily={FONT} fill="#fffdf8" />
        </Group>
      ))}
      {hover ? (
        <Circle x={hover.x} y={hover.y} radius={hover.hz === null ? 3 : 6} stroke={CHART_PALETTE.ink} strokeWidth={1.5} fill={hover.hz === null ? CHART_PALETTE.ink : undefined} />
      ) : null}
    </>
  );
}

// ---- HTML overlays -------------------------------------------------------------------------

function readoutSentence(r: Readout): string {
  return `${r.frequency ? `${r.frequency}: ` : ''}z ${r.z}, y ${r.y}, Γ ${r.gamma}, VSWR ${r.vswr}, return loss ${r.returnLoss}`;
}

function ReadoutCard({ hover, width }: { hover: Hover; width: number }) {
  const onLeft = hover.x > width / 2;
  const r = hover.readout;
  const rows: [string, string][] = [
    ['z', r.z],
    ['y', r.y],
    ['Γ', r.gamma],
    ['VSWR', r.vswr],
    ['RL', r.returnLoss],
  ];
  return (
    <div
      aria-hidden="true"
      className="pointer-events-none absolute top-2 rounded-md border px-2.5 py-1.5 text-[11px] leading-[1.45] shadow-sm"
      style={{ [onLeft ? 'left' : 'right']: 8, background: 'rgba(255, 253, 248, 0.94)', borderColor: '#d9cfbd', color: CHART_PALETTE.ink }}
      data-testid="chart-readout"
    >
      {r.frequency ? <div className="font-bold" style={{ color: CHART_PALETTE.traceDeep }}>{r.frequency}</div> : null}
      {rows.map(([k, v]) => (
        <div key={k} className="flex gap-2">
          <span className="w-9" style={{ color: CHART_PALETTE.inkFaint }}>
            {k}
          </span>
          <span style={{ fontFamily: MONO }}>{v}</span>
        </div>
      ))}
    </div>
  );
}

const FAMILY_NAMES = { series: 'series part', shunt: 'shunt part', line: 'line section', other: 'other' } as const;

function legendKinds(model: TraceModel): { family: string; colour: string }[] {
  const seen = new Map<string, string>();
  for (const s of model.path) {
    const fam = FAMILY_NAMES[elementKindFamily(s.kind)];
    if (!seen.has(fam)) seen.set(fam, elementKindColour(s.kind));
  }
  return [...seen].map(([family, colour]) => ({ family, colour }));
}

function Legend({ kinds, compare, preview }: { kinds: { family: string; colour: string }[]; compare: string | null; preview: boolean }) {
  return (
    <div
      aria-hidden="true"
      className="pointer-events-none absolute bottom-2 left-2 flex flex-col gap-0.5 text-[10px]"
      style={{ color: CHART_PALETTE.inkSoft }}
    >
      {kinds.map((k) => (
        <span key={k.family} className="flex items-center gap-1.5">
          <span className="inline-block h-[3px] w-4 rounded" style={{ background: k.colour }} />
          {k.family}
        </span>
      ))}
      <span className="flex items-center gap-1.5">
        <span className="inline-block h-[4px] w-4 rounded" style={{ background: CHART_PALETTE.trace }} />
        band trace
      </span>
      {compare ? (
        <span className="flex items-center gap-1.5">
          <span className="inline-block w-4 border-t-2 border-dashed" style={{ borderColor: CHART_PALETTE.compare }} />
          {compare}
        </span>
      ) : null}
      {preview ? (
        <span className="flex items-center gap-1.5">
          <span className="inline-block w-4 border-t-2 border-dashed" style={{ borderColor: CHART_PALETTE.preview }} />
          candidate
        </span>
      ) : null}
    </div>
  );
}

function ZoomButtons({ onZoom, onReset, zoomed }: { onZoom: (factor: number) => void; onReset: () => void; zoomed: boolean }) {
  const cls =
    'flex h-6 w-6 items-center justify-center rounded border text-[13px] leading-none hover:bg-[#ece4d4] focus-visible:outline-2';
  const style = { borderColor: '#d9cfbd', background: 'rgba(255, 253, 248, 0.9)', color: CHART_PALETTE.ink };
  return (
    <div className="absolute bottom-2 right-2 flex gap-1">
      <button type="button" className={cls} style={style} aria-label="Zoom in on the chart" onClick={() => onZoom(ZOOM_STEP)}>
        +
      </button>
      <button type="button" className={cls} style={style} aria-label="Zoom out of the chart" onClick={() => onZoom(1 / ZOOM_STEP)}>
        −
      </button>
      {zoomed ? (
        <button type="button" className={`${cls} w-auto px-1.5 text-[10px]`} style={style} aria-label="Reset the chart view" onClick={onReset}>
          fit
        </button>
      ) : null}
    </div>
  );
}
