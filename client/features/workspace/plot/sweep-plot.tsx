/**
 * FOR THE WORKSPACE ENGINEER: <SweepPlot width height design result mode="return-loss" | "vswr" ... />.
 * Return loss is plotted as positive dB (up = better match), with the goal as a line.
 * (Thin first version: the uPlot drawing lands in the following commits; the props are final.)
 */
import type { Design } from '../../../../shared/rf/design';
import type { AnalysisResult } from '../analysis/engine-types';

export type SweepPlotMode = 'return-loss' | 'vswr';

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

export function SweepPlot(props: SweepPlotProps) {
  return <div role="img" aria-label="Sweep plot" style={{ width: props.width, height: props.height }} />;
}
