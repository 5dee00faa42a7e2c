/**
 * FOR THE WORKSPACE ENGINEER: <SmithChart width height design result path ... /> — props below.
 * Types: AnalysisResult / ImpedancePath from ../analysis/engine-types. `view` is controlled when
 * given (then call back through onViewChange), otherwise the chart keeps its own.
 * (Thin first version: the full drawing lands in the following commits; the props are final.)
 */
import { Circle, Layer, Rect, Stage } from 'react-konva';
import type { Design } from '../../../../shared/rf/design';
import type { AnalysisResult, ImpedancePath } from '../analysis/engine-types';
import { viewFrame } from './geometry';

export interface ChartCursor {
  userId: string;
  name: string;
  color: string;
  gamma: [number, number];
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
  onCursorMove?: (gamma: [number, number] | null) => void;
  view?: { zoom: number; cx: number; cy: number };
  onViewChange?: (v: { zoom: number; cx: number; cy: number }) => void;
  /** click on the band trace (for notes) */
  onPickFrequency?: (hz: number) => void;
}

export function SmithChart(props: SmithChartProps) {
  const f = viewFrame(props.width, props.height, props.view);
  return (
    <div role="img" aria-label="Smith chart" style={{ width: props.width, height: props.height }}>
      <Stage width={props.width} height={props.height}>
        <Layer listening={false}>
          <Rect width={props.width} height={props.height} fill="#f6f1e7" />
          <Circle x={f.cx} y={f.cy} radius={f.radius} stroke="#1e2b47" strokeWidth={1.2} />
        </Layer>
      </Stage>
    </div>
  );
}
