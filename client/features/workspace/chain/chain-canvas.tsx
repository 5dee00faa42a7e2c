/**
 * The chain canvas: the chain as a schematic, port on the left, load on the right. Click an
 * element to select it, drag it sideways to reorder, drag its value up or down (or turn the mouse
 * wheel over it) to tune it live. With the canvas focused: ← → select the neighbour, ↑ ↓ tune
 * (Shift coarse, Alt fine), Ctrl+← → move the element, Delete removes, Ctrl+D duplicates.
 */
import type Konva from 'konva';
import { memo, useEffect, useLayoutEffect, useMemo, useRef, type KeyboardEvent } from 'react';
import { Circle, Group, Layer, Line, Rect, Stage, Text } from 'react-konva';
import type { Design, Element } from '../../../../shared/rf/design';
import type { ESeries } from '../../../../shared/rf/eseries';
import { formatEngineering } from '../../../../shared/rf/units';
import type { Peer, PresenceCursor } from '../collab/presence-state';
import { initials } from '../collab/presence-state';
import { tunableOf } from '../value/tunable';
import { dragSteps, stepSizeFromModifiers, stepValue, wheelSteps } from '../value/tuning-step';
import { elementName } from './element-catalog';
import { elementDescription, elementValueLabel } from './element-summary';
import { CANVAS_HEIGHT, CELL_WIDTH, GROUND_Y, LOAD_WIDTH, PORT_WIDTH, RAIL_Y, chainLayout, dropIndex } from './chain-layout';
import { ElementSymbol, Ground, INK, LockMark, tintOf } from './element-symbol';
import { loadSummary } from './load-summary';
import { cacheOffScreen, installLowLatencyKonvaCanvases } from '../layout/low-latency-canvas';

installLowLatencyKonvaCanvases();

export interface ChainCanvasProps {
  design: Design;
  /** available width; the canvas scrolls sideways when the chain is longer */
  width: number;
  selectedId: string | null;
  onSelect(id: string | null): void;
  editable: boolean;
  /** E-series for stepping lumped values, or null for smooth steps */
  series: ESeries | null;
  onTune(id: string, field: string, value: unknown): void;
  onMove(id: string, index: number): void;
  onRemove(id: string): void;
  onDuplicate(id: string): void;
  peers: Peer[];
  onCursor(cursor: PresenceCursor | null): void;
}

const AMBER = '#d9962b';
const FAINT = '#6c7791';

interface TuneDrag {
  id: string;
  startY: number;
  startValue: number;
}

/** Re-renders only when one of its props changes (the workspace passes stable callbacks). */
export const ChainCanvas = memo(ChainCanvasView);

function ChainCanvasView(props: ChainCanvasProps) {
  const { design, selectedId, editable } = props;
  const elements = design.elements;
  const layout = chainLayout(elements.length);
  const stageWidth = Math.max(props.width, layout.width);
  const offsetX = Math.max(0, Math.floor((stageWidth - layout.width) / 2));
  const latest = useRef(props);
  latest.current = props;
  const drag = useRef<TuneDrag | null>(null);

  // Vertical value drags follow the pointer outside the canvas too. Each move is applied at once
  // (the live analysis drops superseded requests itself), so the chart follows without a frame's wait.
  useEffect(() => {
    const apply = (ev: { clientY: number; shiftKey: boolean; altKey: boolean }) => {
      const d = drag.current;
      if (!d) return;
      const p = latest.current;
      const el = p.design.elements.find((e) => e.id === d.id);
      const t = el ? tunableOf(el) : null;
      if (!t) return;
      const next = stepValue(d.startValue, dragSteps(ev.clientY - d.startY), {
        scale: t.scale,
        size: stepSizeFromModifiers(ev),
        series: t.preferredValues ? p.series : null,
      });
      if (next !== t.current) p.onTune(d.id, t.field, t.fieldValue(next));
    };
    const move = (ev: PointerEvent) => apply(ev);
    const up = (ev: PointerEvent) => {
      apply(ev);
      drag.current = null;
      document.body.style.cursor = '';
    };
    window.addEventListener('pointermove', move);
    window.addEventListener('pointerup', up);
    return () => {
      window.removeEventListener('pointermove', move);
      window.removeEventListener('pointerup', up);
    };
  }, []);

  const peerSelections = useMemo(() => {
    const byId = new Map<string, Peer[]>();
    for (const peer of props.peers) if (peer.selection) byId.set(peer.selection, [...(byId.get(peer.selection) ?? []), peer]);
    return byId;
  }, [props.peers]);

  const tuneBy = (e: Element, steps: number, mods: { shiftKey?: boolean; altKey?: boolean }) => {
    const p = latest.current;
    const t = tunableOf(e);
    if (!t || !p.editable) return;
    const next = stepValue(t.current, steps, { scale: t.scale, size: stepSizeFromModifiers(mods), series: t.preferredValues ? p.series : null });
    if (next !== t.current) p.onTune(e.id, t.field, t.fieldValue(next));
  };
  const tuneByRef = useRef(tuneBy);
  tuneByRef.current = tuneBy;
  const cellActions = useMemo<CellActions>(
    () => ({
      select: (id) => latest.current.onSelect(id),
      move: (id, index) => latest.current.onMove(id, index),
      count: () => latest.current.design.elements.length,
      tuneBy: (e, steps, mods) => tuneByRef.current(e, steps, mods),
      startDrag: (e, clientY, startValue) => {
        drag.current = { id: e.id, startY: clientY, startValue };
        document.body.style.cursor = 'ns-resize';
      },
    }),
    [],
  );

  const onKeyDown = (ev: KeyboardEvent<HTMLDivElement>) => {
    const index = elements.findIndex((e) => e.id === selectedId);
    const selected = index >= 0 ? elements[index] : null;
    const ctrl = ev.ctrlKey || ev.metaKey;
    // ← is toward the port (higher chain index), → toward the load.
    if ((ev.key === 'ArrowLeft' || ev.key === 'ArrowRight') && !ctrl) {
      if (!elements.length) return;
      const towardPort = ev.key === 'ArrowLeft';
      const next = index < 0 ? (towardPort ? 0 : elements.length - 1) : Math.max(0, Math.min(elements.length - 1, index + (towardPort ? 1 : -1)));
      props.onSelect(elements[next].id);
      ev.preventDefault();
      return;
    }
    if (!selected) return;
    if ((ev.key === 'ArrowUp' || ev.key === 'ArrowDown') && editable) {
      tuneBy(selected, ev.key === 'ArrowUp' ? 1 : -1, ev);
      ev.preventDefault();
    } else if ((ev.key === 'ArrowLeft' || ev.key === 'ArrowRight') && ctrl && editable) {
      const target = index + (ev.key === 'ArrowLeft' ? 1 : -1);
      if (target >= 0 && target < elements.length) props.onMove(selected.id, target);
      ev.preventDefault();
    } else if ((ev.key === 'Delete' || ev.key === 'Backspace') && editable) {
      props.onRemove(selected.id);
      ev.preventDefault();
    } else if (ev.key.toLowerCase() === 'd' && ctrl && editable) {
      props.onDuplicate(selected.id);
      ev.preventDefault();
    } else if (ev.key === 'Escape') {
      props.onSelect(null);
    }
  };

  const pointer = (stage: Konva.Stage | null): PresenceCursor | null => {
    const p = stage?.getPointerPosition();
    return p ? { area: 'canvas', x: p.x - offsetX, y: p.y } : null;
  };

  const remoteCursors = props.peers.filter((p): p is Peer & { cursor: { area: 'canvas'; x: number; y: number } } => p.cursor?.area === 'canvas');
  const selected = elements.find((e) => e.id === selectedId);

  return (
    <div
      className="chain-canvas h-full overflow-x-auto overflow-y-hidden rounded-md outline-offset-[-3px]"
      tabIndex={0}
      role="group"
      aria-roledescription="chain canvas"
      aria-label={`Chain, port on the left, load on the right: ${elements.length ? elements.map((e) => elementName(e)).join(', ') : 'no elements yet'}`}
      aria-describedby="chain-canvas-help"
      onKeyDown={onKeyDown}
    >
      <p id="chain-canvas-help" className="sr-only">
        Left and right arrows select an element.{' '}
        {editable ? 'Up and down arrows tune it (Shift coarse, Alt fine), Control with left or right moves it, Delete removes it, Control D duplicates it.' : 'You are watching: the chain cannot be edited here.'}
      </p>
      <p className="sr-only" aria-live="polite">
        {selected ? `Selected ${elementDescription(selected)}` : ''}
      </p>
      <Stage
        width={stageWidth}
        height={layout.height}
        onMouseMove={(e) => props.onCursor(pointer(e.target.getStage()))}
        onMouseLeave={() => props.onCursor(null)}
        onClick={(e) => {
          if (e.target === e.target.getStage()) props.onSelect(null);
        }}
      >
        <Layer x={offsetX}>
          <Rect width={layout.width} height={layout.height} fill="#fffdf8" onClick={() => props.onSelect(null)} />
          <PortSymbol design={design} />
          <LoadSymbol design={design} x={layout.loadX} />
          {elements.length === 0 && (
            <>
              <Line points={[PORT_WIDTH - 20, RAIL_Y, layout.loadX + 20, RAIL_Y]} stroke={INK} strokeWidth={2} listening={false} />
              <Text
                x={PORT_WIDTH}
                y={RAIL_Y + 30}
                width={layout.loadX - PORT_WIDTH}
                align="center"
                text={editable ? 'No network yet:\nadd parts above' : 'No network yet'}
                lineHeight={1.4}
                fontSize={12}
                fill={FAINT}
                listening={false}
              />
            </>
          )}
          {elements.map((e, index) => (
            <ChainCell
              key={e.id}
              element={e}
              index={index}
              x={layout.cellX(index)}
              isSelected={e.id === selectedId}
              others={peerSelections.get(e.id) ?? NO_PEERS}
              editable={editable}
              actions={cellActions}
            />
          ))}
          {remoteCursors.map((peer) => (
            <Group key={peer.clientId} x={peer.cursor.x} y={peer.cursor.y} listening={false}>
              <Line points={[0, 0, 0, 14, 4, 10, 10, 10]} closed fill={peer.user.color} stroke="#ffffff" strokeWidth={1} />
              <Text x={10} y={10} text={peer.user.name} fontSize={11} fill={peer.user.color} fontStyle="bold" />
            </Group>
          ))}
        </Layer>
      </Stage>
    </div>
  );
}

const NO_PEERS: Peer[] = [];
const keepOnRail = (pos: { x: number; y: number }) => ({ x: pos.x, y: 0 });
const clearCursor = (ev: Konva.KonvaEventObject<MouseEvent>) => {
  const c = ev.target.getStage()?.container();
  if (c) c.style.cursor = '';
};

/** What a chain cell asks of the canvas; one stable object, reading the canvas's newest props. */
interface CellActions {
  select(id: string): void;
  move(id: string, index: number): void;
  count(): number;
  tuneBy(e: Element, steps: number, mods: { shiftKey?: boolean; altKey?: boolean }): void;
  startDrag(e: Element, clientY: number, startValue: number): void;
}

interface ChainCellProps {
  element: Element;
  index: number;
  x: number;
  isSelected: boolean;
  others: Peer[];
  editable: boolean;
  actions: CellActions;
}

/** One element on the canvas; memoised, so tuning one value re-renders only its cell. */
const ChainCell = memo(function ChainCell({ element: e, index, x, isSelected, others, editable, actions }: ChainCellProps) {
  // Each cell is kept as a bitmap: the layer redraws whenever any cell changes, and then the other
  // cells cost one bitmap copy each instead of their shapes and text. Events still reach the shapes
  // (Konva keeps a cached hit region too). A cell that changes (it renders only when its element,
  // selection or peers change) draws its shapes until it has been still for RECACHE_AFTER_MS: while a
  // value is dragged, making its bitmap again at every step cost more (new canvases) than it saved.
  const group = useRef<Konva.Group>(null);
  const recache = useRef<ReturnType<typeof setTimeout> | null>(null);
  const mounted = useRef(false);
  useLayoutEffect(() => {
    const g = group.current;
    if (!g) return;
    if (!mounted.current) {
      mounted.current = true;
      cacheCell(g);
      return;
    }
    if (g.isCached()) g.clearCache();
    if (recache.current) clearTimeout(recache.current);
    recache.current = setTimeout(() => {
      recache.current = null;
      if (!group.current) return;
      cacheCell(group.current);
      group.current.getLayer()?.batchDraw();
    }, RECACHE_AFTER_MS);
  });
  useEffect(
    () => () => {
      if (recache.current) clearTimeout(recache.current);
    },
    [],
  );
  useEffect(() => {
    if (typeof document === 'undefined' || !document.fonts) return;
    let live = true;
    // the labels again in the web font once it has loaded
    void document.fonts.ready.then(() => {
      if (live && group.current) {
        cacheCell(group.current);
        group.current.getLayer()?.batchDraw();
      }
    });
    return () => {
      live = false;
    };
  }, []);
  const select = () => actions.select(e.id);
  const onDragEnd = (ev: Konva.KonvaEventObject<DragEvent>) => {
    const node = ev.target;
    const target = dropIndex(node.x(), actions.count());
    node.position({ x, y: 0 });
    if (target !== index) actions.move(e.id, target);
  };
  const onWheel = (ev: Konva.KonvaEventObject<WheelEvent>) => {
    if (!editable || !tunableOf(e)) return;
    ev.evt.preventDefault();
    actions.select(e.id);
    actions.tuneBy(e, wheelSteps(ev.evt.deltaY), ev.evt);
  };
  const onEnter = (ev: Konva.KonvaEventObject<MouseEvent>) => {
    const c = ev.target.getStage()?.container();
    if (c && editable) c.style.cursor = 'grab';
  };
  const onValueEnter = (ev: Konva.KonvaEventObject<MouseEvent>) => {
    const c = ev.target.getStage()?.container();
    if (c && editable && tunableOf(e)) c.style.cursor = 'ns-resize';
  };
  const onValueDown = (ev: Konva.KonvaEventObject<MouseEvent>) => {
    const t = tunableOf(e);
    if (!editable || !t) return;
    ev.cancelBubble = true;
    ev.evt.preventDefault();
    actions.select(e.id);
    actions.startDrag(e, ev.evt.clientY, t.current);
  };
  return (
    <Group
      ref={group}
      key={e.id}
      x={x}
      y={0}
      draggable={editable}
      dragBoundFunc={keepOnRail}
      onDragStart={select}
      onDragEnd={onDragEnd}
      onClick={select}
      onTap={select}
      onWheel={onWheel}
      onMouseEnter={onEnter}
      onMouseLeave={clearCursor}
    >
      <Rect
        x={3}
        y={3}
        width={CELL_WIDTH - 6}
        height={GROUND_Y + 16}
        cornerRadius={8}
        fill={isSelected ? '#f8ead0' : 'rgba(0,0,0,0)'}
        stroke={isSelected ? AMBER : undefined}
        strokeWidth={isSelected ? 2 : 0}
      />
      {others.map((peer, i) => (
        <Group key={peer.clientId}>
          <Rect
            x={6 + i * 3}
            y={6 + i * 3}
            width={CELL_WIDTH - 12 - i * 6}
            height={GROUND_Y + 10 - i * 6}
            cornerRadius={7}
            stroke={peer.user.color}
            strokeWidth={2}
            dash={[6, 4]}
            listening={false}
          />
          <Rect x={CELL_WIDTH - 30 - i * 22} y={GROUND_Y + 2} width={20} height={14} cornerRadius={7} fill={peer.user.color} listening={false} />
          <Text
            x={CELL_WIDTH - 30 - i * 22}
            y={GROUND_Y + 4}
            width={20}
            align="center"
            text={initials(peer.user.name)}
            fontSize={9}
            fontStyle="bold"
            fill="#ffffff"
            listening={false}
          />
        </Group>
      ))}
      <ElementSymbol element={e} />
      <Text x={0} y={8} width={CELL_WIDTH} align="center" text={elementName(e)} fontSize={13} fontStyle="bold" fill={tintOf(e)} listening={false} />
      <Text
        x={8}
        y={24}
        width={CELL_WIDTH - 16}
        height={16}
        align="center"
        text={elementValueLabel(e)}
        fontSize={12}
        fontFamily="ui-monospace, 'DejaVu Sans Mono', monospace"
        fill={INK}
        wrap="none"
        ellipsis
        onMouseEnter={onValueEnter}
        onMouseDown={onValueDown}
      />
      {e.locked && <LockMark x={CELL_WIDTH - 22} y={8} />}
    </Group>
  );
});

/** How long a changed chain cell draws its shapes before it is made a bitmap again (ms). */
const RECACHE_AFTER_MS = 400;

function cacheCell(g: Konva.Group): void {
  cacheOffScreen(g, CELL_WIDTH, CANVAS_HEIGHT);
}

const PortSymbol = memo(PortSymbolView, (a, b) => a.design.port === b.design.port && a.design.referenceOhms === b.design.referenceOhms);
const LoadSymbol = memo(LoadSymbolView, (a, b) => a.design.load === b.design.load && a.x === b.x);

function PortSymbolView({ design }: { design: Design }) {
  const [re, im] = design.port?.impedance ?? [design.referenceOhms, 0];
  const zText = im === 0 ? formatEngineering(re, 'Ω', { digits: 3 }) : `${formatEngineering(re, 'Ω', { digits: 3 })}, j${formatEngineering(im, '', { digits: 3 })}`;
  const cx = 44;
  const cy = (RAIL_Y + GROUND_Y) / 2 + 4;
  return (
    <Group listening={false}>
      <Text x={0} y={8} width={PORT_WIDTH - 8} align="center" text="Port" fontSize={13} fontStyle="bold" fill={INK} />
      <Text x={0} y={24} width={PORT_WIDTH - 8} align="center" text={zText} fontSize={12} fill={INK} />
      <Line points={[cx, RAIL_Y, PORT_WIDTH, RAIL_Y]} stroke={INK} strokeWidth={2} />
      <Line points={[cx, RAIL_Y, cx, cy - 16]} stroke={INK} strokeWidth={2} />
      <Circle x={cx} y={cy} radius={16} stroke={INK} strokeWidth={2} fill="#fffdf8" />
      <Line points={[cx - 8, cy, cx - 4, cy - 5, cx, cy, cx + 4, cy + 5, cx + 8, cy]} stroke={INK} strokeWidth={1.5} tension={0.4} />
      <Line points={[cx, cy + 16, cx, GROUND_Y]} stroke={INK} strokeWidth={2} />
      <Ground x={cx} y={GROUND_Y} />
    </Group>
  );
}

function LoadSymbolView({ design, x }: { design: Design; x: number }) {
  const boxX = x + 30;
  return (
    <Group x={0} listening={false}>
      <Text x={x + 4} y={8} width={LOAD_WIDTH - 8} align="center" text="Load" fontSize={13} fontStyle="bold" fill={INK} />
      <Text x={x + 4} y={24} width={LOAD_WIDTH - 8} align="center" text={loadSummary(design.load)} fontSize={11} fill={INK} wrap="none" ellipsis />
      <Line points={[x, RAIL_Y, boxX + 26, RAIL_Y, boxX + 26, RAIL_Y + 20]} stroke={INK} strokeWidth={2} />
      <Rect x={boxX + 10} y={RAIL_Y + 20} width={32} height={50} stroke={INK} strokeWidth={2} fill="#ece4d4" cornerRadius={3} />
      <Text x={boxX + 10} y={RAIL_Y + 38} width={32} align="center" text="ZL" fontSize={12} fill={INK} />
      <Line points={[boxX + 26, RAIL_Y + 70, boxX + 26, GROUND_Y]} stroke={INK} strokeWidth={2} />
      <Ground x={boxX + 26} y={GROUND_Y} />
    </Group>
  );
}

