/**
 * Timing hooks for the UI benchmark (e2e/bench/ui.ts) and for anyone profiling in the browser.
 *
 * After the chart or the sweep plot has finished drawing a result, `markDrawn` records
 *   window.__mlDrawn = { chart?: DrawRecord, plot?: DrawRecord }
 * where DrawRecord = { at, seq, probe }:
 *   at    — epoch milliseconds (performance.timeOrigin + performance.now()), comparable across tabs
 *   seq   — the analysis request number whose result was drawn (per page)
 *   probe — window.__mlProbe?.(design) for the design that result was computed from (the bench sets
 *           a probe that reads the value it is dragging, e.g. d => d.elements[3].value)
 * It also calls window.__mlOnDrawn?.(which, record). For a breakdown, useAnalysis calls
 * window.__mlOnStage?.(stage, { at, seq }) with stage "requested" (the design went to the engine)
 * and "analysed" (its result came back). Nothing is recorded until the page defines
 * window.__mlDrawn (the bench does), so normal use pays one property check per draw.
 * (No performance.mark: in headless Chromium one cost about 0.6 ms of main-thread time, four per
 * tuning step, which the benchmark then measured as latency.)
 */
import type { Design } from '../../../../shared/rf/design';

export interface DrawRecord {
  at: number;
  seq: number;
  probe: unknown;
}

interface BenchWindow {
  __mlDrawn?: { chart?: DrawRecord; plot?: DrawRecord };
  __mlOnDrawn?: (which: 'chart' | 'plot', record: DrawRecord) => void;
  __mlOnStage?: (stage: 'requested' | 'analysed', record: { at: number; seq: number }) => void;
  __mlProbe?: (design: Design) => unknown;
}

const sources = new WeakMap<object, { seq: number; design: Design }>();

/** Remember which request and design produced a result (called by useAnalysis). */
export function noteResultSource(result: object, seq: number, design: Design): void {
  sources.set(result, { seq, design });
}

export function resultSource(result: object): { seq: number; design: Design } | undefined {
  return sources.get(result);
}

export function epochNow(): number {
  return performance.timeOrigin + performance.now();
}

export function markDrawn(which: 'chart' | 'plot', result: object | null): void {
  if (typeof window === 'undefined') return;
  const w = window as unknown as BenchWindow;
  if (!w.__mlDrawn || !result) return;
  const src = sources.get(result);
  let probe: unknown;
  try {
    probe = src && w.__mlProbe ? w.__mlProbe(src.design) : null;
  } catch {
    probe = null;
  }
  const record: DrawRecord = { at: epochNow(), seq: src?.seq ?? 0, probe };
  w.__mlDrawn[which] = record;
  w.__mlOnDrawn?.(which, record);
}

/** A step of the live analysis, for the benchmark's breakdown (no-op unless the page asked for it). */
export function markStage(stage: 'requested' | 'analysed', seq: number): void {
  if (typeof window === 'undefined') return;
  const w = window as unknown as BenchWindow;
  if (!w.__mlDrawn || !w.__mlOnStage) return;
  w.__mlOnStage(stage, { at: epochNow(), seq });
}
