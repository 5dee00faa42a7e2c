/**
 * Matchloom's schematic symbols, drawn in one chain-canvas cell (CELL_WIDTH wide, the signal rail
 * at RAIL_Y, ground at GROUND_Y). Series parts sit inline on the rail in teal, shunt parts hang
 * from it to ground in coral, lines and stubs are thick slate bars (a stub drops down and ends
 * open or shorted), the transformer is a pair of linked rings and a measured two-port a box.
 */
import type Konva from 'konva';
import { Circle, Group, Line, Rect, Shape, Text } from 'react-konva';
import type { Element } from '../../../../shared/rf/design';
import { kindInfo } from './element-catalog';
import { CELL_WIDTH, GROUND_Y, RAIL_Y } from './chain-layout';

export const INK = '#1e2b47';
export const SERIES_TINT = '#1d8a84';
export const SHUNT_TINT = '#e06a4f';
export const LINE_TINT = '#5b6b80';
const PAPER = '#fffdf8';
const MID = CELL_WIDTH / 2;
const STROKE = 2;

export function tintOf(e: Pick<Element, 'kind'>): string {
  const p = kindInfo(e.kind).placement;
  if (p === 'series') return SERIES_TINT;
  if (p === 'shunt') return SHUNT_TINT;
  if (p === 'line' || p === 'stub') return LINE_TINT;
  return INK;
}

function Wire({ points, color = INK }: { points: number[]; color?: string }) {
  return <Line points={points} stroke={color} strokeWidth={STROKE} lineCap="round" lineJoin="round" listening={false} />;
}

/** Ground: three shortening bars under `x, y`. */
export function Ground({ x, y }: { x: number; y: number }) {
  return (
    <Group x={x} y={y} listening={false}>
      <Line points={[-12, 0, 12, 0]} stroke={INK} strokeWidth={STROKE} />
      <Line points={[-8, 5, 8, 5]} stroke={INK} strokeWidth={STROKE} />
      <Line points={[-4, 10, 4, 10]} stroke={INK} strokeWidth={STROKE} />
    </Group>
  );
}

/** A coil of `turns` half-rings from (x0, y) to (x1, y), or vertically when `vertical`. */
function Coil({ from, to, at, vertical, color }: { from: number; to: number; at: number; vertical?: boolean; color: string }) {
  const turns = 4;
  const r = (to - from) / (2 * turns);
  return (
    <Shape
      listening={false}
      stroke={color}
      strokeWidth={STROKE + 0.5}
      sceneFunc={(ctx: Konva.Context, shape: Konva.Shape) => {
        ctx.beginPath();
        for (let i = 0; i < turns; i++) {
          const c = from + r * (2 * i + 1);
          if (vertical) ctx.arc(at, c, r, -Math.PI / 2, Math.PI / 2, false);
          else ctx.arc(c, at, r, Math.PI, 0, false);
        }
        ctx.strokeShape(shape);
      }}
    />
  );
}

function Plates({ vertical, at, center, color }: { vertical?: boolean; at: number; center: number; color: string }) {
  const gap = 5;
  const half = 14;
  return vertical ? (
    <Group listening={false}>
      <Line points={[at - half, center - gap, at + half, center - gap]} stroke={color} strokeWidth={STROKE + 1.5} />
      <Line points={[at - half, center + gap, at + half, center + gap]} stroke={color} strokeWidth={STROKE + 1.5} />
    </Group>
  ) : (
    <Group listening={false}>
      <Line points={[center - gap, at - half, center - gap, at + half]} stroke={color} strokeWidth={STROKE + 1.5} />
      <Line points={[center + gap, at - half, center + gap, at + half]} stroke={color} strokeWidth={STROKE + 1.5} />
    </Group>
  );
}

function SeriesPart({ kind, color }: { kind: 'l' | 'c' | 'r'; color: string }) {
  if (kind === 'l')
    return (
      <>
        <Wire points={[0, RAIL_Y, 32, RAIL_Y]} />
        <Coil from={32} to={88} at={RAIL_Y} color={color} />
        <Wire points={[88, RAIL_Y, CELL_WIDTH, RAIL_Y]} />
      </>
    );
  if (kind === 'c')
    return (
      <>
        <Wire points={[0, RAIL_Y, MID - 5, RAIL_Y]} />
        <Plates at={RAIL_Y} center={MID} color={color} />
        <Wire points={[MID + 5, RAIL_Y, CELL_WIDTH, RAIL_Y]} />
      </>
    );
  return (
    <>
      <Wire points={[0, RAIL_Y, 36, RAIL_Y]} />
      <Rect x={36} y={RAIL_Y - 8} width={48} height={16} stroke={color} strokeWidth={STROKE + 0.5} fill={PAPER} listening={false} />
      <Wire points={[84, RAIL_Y, CELL_WIDTH, RAIL_Y]} />
    </>
  );
}

function ShuntPart({ kind, color }: { kind: 'l' | 'c' | 'r'; color: string }) {
  const top = RAIL_Y + 18;
  const bottom = GROUND_Y - 14;
  const center = (top + bottom) / 2;
  return (
    <>
      <Wire points={[0, RAIL_Y, CELL_WIDTH, RAIL_Y]} />
      <Circle x={MID} y={RAIL_Y} radius={3} fill={INK} listening={false} />
      {kind === 'l' && (
        <>
          <Wire points={[MID, RAIL_Y, MID, top]} />
          <Coil from={top} to={bottom} at={MID} vertical color={color} />
          <Wire points={[MID, bottom, MID, GROUND_Y]} />
        </>
      )}
      {kind === 'c' && (
        <>
          <Wire points={[MID, RAIL_Y, MID, center - 5]} />
          <Plates vertical at={MID} center={center} color={color} />
          <Wire points={[MID, center + 5, MID, GROUND_Y]} />
        </>
      )}
      {kind === 'r' && (
        <>
          <Wire points={[MID, RAIL_Y, MID, top]} />
          <Rect x={MID - 8} y={top} width={16} height={bottom - top} stroke={color} strokeWidth={STROKE + 0.5} fill={PAPER} listening={false} />
          <Wire points={[MID, bottom, MID, GROUND_Y]} />
        </>
      )}
      <Ground x={MID} y={GROUND_Y} />
    </>
  );
}

function Stub({ shorted }: { shorted: boolean }) {
  const end = GROUND_Y - (shorted ? 6 : 14);
  return (
    <>
      <Wire points={[0, RAIL_Y, CELL_WIDTH, RAIL_Y]} />
      <Rect x={MID - 6} y={RAIL_Y} width={12} height={end - RAIL_Y} fill={LINE_TINT} cornerRadius={1} listening={false} />
      {shorted ? (
        <>
          <Wire points={[MID, end, MID, GROUND_Y]} />
          <Ground x={MID} y={GROUND_Y} />
        </>
      ) : (
        <Circle x={MID} y={end + 6} radius={5} stroke={LINE_TINT} strokeWidth={STROKE} fill={PAPER} listening={false} />
      )}
    </>
  );
}

/** The symbol of `element`, drawn in cell coordinates. */
export function ElementSymbol({ element }: { element: Element }) {
  const color = tintOf(element);
  switch (element.kind) {
    case 'series-l':
      return <SeriesPart kind="l" color={color} />;
    case 'series-c':
      return <SeriesPart kind="c" color={color} />;
    case 'series-r':
      return <SeriesPart kind="r" color={color} />;
    case 'shunt-l':
      return <ShuntPart kind="l" color={color} />;
    case 'shunt-c':
      return <ShuntPart kind="c" color={color} />;
    case 'shunt-r':
      return <ShuntPart kind="r" color={color} />;
    case 'line':
      return (
        <>
          <Wire points={[0, RAIL_Y, 14, RAIL_Y]} />
          <Rect x={14} y={RAIL_Y - 7} width={CELL_WIDTH - 28} height={14} fill={LINE_TINT} cornerRadius={2} listening={false} />
          <Wire points={[CELL_WIDTH - 14, RAIL_Y, CELL_WIDTH, RAIL_Y]} />
          <Line points={[14, RAIL_Y + 16, CELL_WIDTH - 14, RAIL_Y + 16]} stroke={LINE_TINT} strokeWidth={1} dash={[4, 3]} listening={false} />
        </>
      );
    case 'open-stub':
      return <Stub shorted={false} />;
    case 'short-stub':
      return <Stub shorted />;
    case 'transformer':
      return (
        <>
          <Wire points={[0, RAIL_Y, MID - 24, RAIL_Y]} />
          <Circle x={MID - 9} y={RAIL_Y} radius={15} stroke={color} strokeWidth={STROKE + 0.5} listening={false} />
          <Circle x={MID + 9} y={RAIL_Y} radius={15} stroke={color} strokeWidth={STROKE + 0.5} listening={false} />
          <Wire points={[MID + 24, RAIL_Y, CELL_WIDTH, RAIL_Y]} />
        </>
      );
    case 'two-port':
      return (
        <>
          <Wire points={[0, RAIL_Y, 30, RAIL_Y]} />
          <Rect x={30} y={RAIL_Y - 22} width={60} height={44} stroke={INK} strokeWidth={STROKE} fill={PAPER} cornerRadius={3} listening={false} />
          <Text x={30} y={RAIL_Y - 6} width={60} align="center" text={element.flipped ? '2 ◂ 1' : '1 ▸ 2'} fontSize={12} fill={INK} listening={false} />
          <Wire points={[90, RAIL_Y, CELL_WIDTH, RAIL_Y]} />
        </>
      );
  }
}

/** A small padlock for locked elements (refine leaves them alone). */
export function LockMark({ x, y }: { x: number; y: number }) {
  return (
    <Group x={x} y={y} listening={false}>
      <Shape
        stroke={INK}
        strokeWidth={1.5}
        sceneFunc={(ctx: Konva.Context, shape: Konva.Shape) => {
          ctx.beginPath();
          ctx.arc(5, 5, 3.5, Math.PI, 0, false);
          ctx.strokeShape(shape);
        }}
      />
      <Rect x={0} y={5} width={10} height={8} fill={INK} cornerRadius={1} />
    </Group>
  );
}
