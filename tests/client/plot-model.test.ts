import { describe, expect, it } from 'vitest';
import { engineCore } from '../../client/features/workspace/analysis/engine-core';
import {
  buildPlotModel,
  frequencyUnitFor,
  plotSummary,
  plottedValue,
  RETURN_LOSS_CEILING_DB,
  yLabelFor,
} from '../../client/features/workspace/plot/plot-model';
import { chipAntennaDesign } from './analysis-fixtures';

const design = chipAntennaDesign();
const { result } = engineCore.analyze(design);

describe('plottedValue', () => {
  it('plots return loss as −20·log10|Γ| in positive dB (CONTRACT §1)', () => {
    expect(plottedValue(0.1, 'return-loss')).toBeCloseTo(20, 12);
    expect(plottedValue(1 / 3, 'return-loss')).toBeCloseTo(9.542, 3); // VSWR 2 ≈ 9.54 dB (common practice)
    expect(plottedValue(1, 'return-loss')).toBe(0);
  });

  it('plots VSWR as (1 + |Γ|)/(1 − |Γ|), total reflection off the top (CONTRACT §1)', () => {
    expect(plottedValue(1 / 3, 'vswr')).toBeCloseTo(2, 12);
    expect(plottedValue(0, 'vswr')).toBe(1);
    expect(plottedValue(1, 'vswr')).toBe(100);
    expect(Number.isFinite(plottedValue(Number.NaN, 'vswr'))).toBe(true);
  });
});

describe('buildPlotModel', () => {
  it('puts frequencies in GHz for a 2–3 GHz sweep and in MHz for a 433 MHz one', () => {
    expect(frequencyUnitFor(3e9).label).toBe('GHz');
    expect(frequencyUnitFor(500e6).label).toBe('MHz');
    const m = buildPlotModel({ design, result, mode: 'return-loss' });
    expect(m.xLabel).toBe('Frequency (GHz)');
    expect(m.x[0]).toBeCloseTo(2, 12);
    expect(m.x[m.x.length - 1]).toBeCloseTo(3, 12);
  });

  it('matches the engine’s return loss point by point and says which way is better on the axis', () => {
    const m = buildPlotModel({ design, result, mode: 'return-loss' });
    expect(m.yLabel).toMatch(/Return loss \(dB\), higher is better/);
    // Common practice: an axis label is shown whole or shortened, never clipped by a short plot.
    expect(yLabelFor(m, 400)).toBe(m.yLabel);
    expect(yLabelFor(m, 150)).toBe('Return loss (dB)');
    expect(yLabelFor(buildPlotModel({ design, result, mode: 'vswr' }), 150)).toBe('VSWR');
    for (let i = 0; i < m.main.length; i++) expect(m.main[i]).toBeCloseTo(result.returnLossDb[i], 9);
  });

  it('matches the engine’s VSWR and draws the goal at the goal VSWR', () => {
    const m = buildPlotModel({ design, result, mode: 'vswr' });
    for (let i = 0; i < m.main.length; i++) if (Number.isFinite(result.vswr[i])) expect(m.main[i]).toBeCloseTo(result.vswr[i], 9);
    expect(m.goal).toBeCloseTo(2, 12);
    expect(m.yRange[0]).toBe(1);
    expect(m.yRange[1]).toBeGreaterThan(2);
  });

  it('draws the return-loss goal from a VSWR goal (VSWR 2 → 9.54 dB; common practice)', () => {
    const m = buildPlotModel({ design, result, mode: 'return-loss' });
    expect(m.goal).toBeCloseTo(9.542, 3);
    expect(m.yRange[0]).toBe(0);
    expect(m.yRange[1]).toBeLessThanOrEqual(RETURN_LOSS_CEILING_DB);
    expect(m.yRange[1]).toBeGreaterThan(m.goal!);
  });

  it('shades the band and marks the bandwidth edges in the plot unit', () => {
    const m = buildPlotModel({ design, result, mode: 'return-loss' });
    expect(m.band).toEqual({ start: 2.4, stop: 2.4835, centre: 2.44 });
    if (result.bandwidth) {
      expect(m.bandwidth!.low).toBeCloseTo(result.bandwidth.lowHz / 1e9, 12);
      expect(m.bandwidth!.high).toBeCloseTo(result.bandwidth.highHz / 1e9, 12);
    } else expect(m.bandwidth).toBeNull();
  });

  it('resamples a compared snapshot onto the plotted frequencies', () => {
    const before = engineCore.analyze(chipAntennaDesign({ elements: [], sweep: { startHz: 2.2e9, stopHz: 2.8e9, points: 61 } })).result;
    const m = buildPlotModel({ design, result, mode: 'return-loss', compare: { result: before, label: 'bare antenna' } });
    expect(m.compareLabel).toBe('bare antenna');
    expect(m.compare).toHaveLength(m.main.length);
    expect(m.compare![0]).toBeNull(); // 2.0 GHz lies outside the compared sweep
    const i = m.x.findIndex((v) => Math.abs(v - 2.5) < 1e-9);
    const j = Array.from(before.frequenciesHz).findIndex((f) => Math.abs(f - 2.5e9) < 1);
    expect(m.compare![i]).toBeCloseTo(before.returnLossDb[j], 6);
  });

  it('turns a yield envelope into best and worst edges', () => {
    const g = result.gammaMagnitude;
    const envelope = { minGamma: g.map((v) => v * 0.5), maxGamma: g.map((v) => Math.min(1, v * 1.5)) };
    const m = buildPlotModel({ design, result, mode: 'return-loss', envelope });
    expect(m.envelope!.best[10]!).toBeGreaterThan(m.main[10]!);
    expect(m.envelope!.worst[10]!).toBeLessThan(m.main[10]!);
    // a mismatched length (an envelope of an older sweep) is not drawn
    expect(buildPlotModel({ design, result, mode: 'vswr', envelope: { minGamma: new Float64Array(3), maxGamma: new Float64Array(3) } }).envelope).toBeNull();
  });

  it('never holds NaN or an infinite value in the plotted data', () => {
    const open = engineCore.analyze(chipAntennaDesign({ load: { kind: 'impedance', ohms: [0, 25] }, elements: [] })).result;
    for (const mode of ['return-loss', 'vswr'] as const) {
      const m = buildPlotModel({ design, result: open, mode });
      for (const v of m.main) expect(v === null || Number.isFinite(v)).toBe(true);
    }
  });

  it('summarises the plot in one sentence', () => {
    const m = buildPlotModel({ design, result, mode: 'return-loss' });
    expect(plotSummary(m, result)).toMatch(/^Return loss against frequency, 2 to 3 GHz\. Goal: at least 9\.5 dB\. Worst in band: \d+\.\d dB\./);
    expect(plotSummary(buildPlotModel({ design: null, result: null, mode: 'vswr' }), null)).toBe('Sweep plot: no analysis yet.');
  });
});
