import { describe, expect, it } from 'vitest';
import { dragSteps, stepSizeFromModifiers, stepValue, tidyValue, wheelSteps } from '../../client/features/workspace/value/tuning-step';
import { tunableOf } from '../../client/features/workspace/value/tunable';

const log = { scale: 'log' as const, size: 'normal' as const };

describe('stepValue on a log scale (L and C)', () => {
  it('moves by a fraction of the value, so 1 nH and 100 nH step alike', () => {
    expect(stepValue(10e-9, 1, log)).toBeCloseTo(10.2e-9, 20);
    expect(stepValue(100e-9, 1, log)).toBeCloseTo(102e-9, 18);
    expect(stepValue(10e-9, -1, log)).toBeCloseTo(9.804e-9, 20);
  });

  it('Shift is coarse and Alt fine', () => {
    expect(stepValue(10e-9, 1, { ...log, size: 'coarse' })).toBeCloseTo(11e-9, 20);
    expect(stepValue(10e-9, 1, { ...log, size: 'fine' })).toBeCloseTo(10.02e-9, 20);
    expect(stepSizeFromModifiers({ shiftKey: true })).toBe('coarse');
    expect(stepSizeFromModifiers({ altKey: true })).toBe('fine');
    expect(stepSizeFromModifiers({})).toBe('normal');
  });

  it('a step up and a step down come back to within rounding', () => {
    const v = 2.7e-12;
    expect(stepValue(stepValue(v, 1, log), -1, log)).toBeCloseTo(v, 15);
  });

  it('never reaches zero, a negative or a non-finite value', () => {
    let v = 1e-12;
    for (let i = 0; i < 2000; i++) v = stepValue(v, -10, { ...log, size: 'coarse' });
    expect(v).toBeGreaterThan(0);
    expect(Number.isFinite(v)).toBe(true);
  });

  it('keeps four significant figures in the document', () => {
    expect(tidyValue(3.26159e-9, 'log')).toBe(3.262e-9);
    expect(stepValue(3.3e-9, 3, log).toPrecision(4)).toBe(String(stepValue(3.3e-9, 3, log).toPrecision(4)));
  });
});

describe('stepValue through an E-series', () => {
  // IEC 60063 E12: 1.0 1.2 1.5 1.8 2.2 2.7 3.3 3.9 4.7 5.6 6.8 8.2
  const e12 = { ...log, series: 'E12' as const };
  it('goes to the next preferred value up or down', () => {
    expect(stepValue(3.3e-9, 1, e12)).toBeCloseTo(3.9e-9, 20);
    expect(stepValue(3.3e-9, -1, e12)).toBeCloseTo(2.7e-9, 20);
    expect(stepValue(8.2e-12, 1, e12)).toBeCloseTo(10e-12, 22);
  });

  it('from a value between preferred ones, goes to the neighbour on that side', () => {
    expect(stepValue(3.5e-9, 1, e12)).toBeCloseTo(3.9e-9, 20);
    expect(stepValue(3.5e-9, -1, e12)).toBeCloseTo(3.3e-9, 20);
  });

  it('Shift steps three preferred values', () => {
    expect(stepValue(3.3e-9, 1, { ...e12, size: 'coarse' })).toBeCloseTo(5.6e-9, 20);
  });
});

describe('stepValue on a linear scale (degrees)', () => {
  const lin = { scale: 'linear' as const, size: 'normal' as const };
  it('adds 1°, 10° with Shift, 0.1° with Alt', () => {
    expect(stepValue(45, 1, lin)).toBe(46);
    expect(stepValue(45, 1, { ...lin, size: 'coarse' })).toBe(55);
    expect(stepValue(45, -1, { ...lin, size: 'fine' })).toBe(44.9);
  });
  it('stops at zero', () => {
    expect(stepValue(3, -1, { ...lin, size: 'coarse' })).toBe(0);
  });
});

describe('pointer steps', () => {
  it('dragging up increases, four pixels a step', () => {
    expect(dragSteps(-8)).toBe(2);
    expect(dragSteps(4)).toBe(-1);
    expect(dragSteps(-9)).toBe(2);
    expect(dragSteps(1)).toBe(0);
  });
  it('one wheel notch per event, up increases', () => {
    expect(wheelSteps(-120)).toBe(1);
    expect(wheelSteps(3)).toBe(-1);
    expect(wheelSteps(0)).toBe(0);
  });
});

describe('tunableOf', () => {
  it('tunes lumped values on a log scale with E-series allowed', () => {
    const t = tunableOf({ id: 'L1', kind: 'series-l', value: 3.3e-9 })!;
    expect(t).toMatchObject({ field: 'value', unit: 'H', scale: 'log', preferredValues: true, current: 3.3e-9 });
    expect(t.fieldValue(3.9e-9)).toBe(3.9e-9);
  });
  it('tunes electrical length in degrees, keeping the reference frequency', () => {
    const t = tunableOf({ id: 'TL1', kind: 'line', z0: 50, length: { degrees: 45, atHz: 2.44e9 } })!;
    expect(t).toMatchObject({ field: 'length', unit: '°', scale: 'linear', preferredValues: false });
    expect(t.fieldValue(50)).toEqual({ degrees: 50, atHz: 2.44e9 });
  });
  it('tunes physical length in metres, keeping the velocity factor', () => {
    const t = tunableOf({ id: 'ST1', kind: 'open-stub', z0: 50, length: { meters: 0.01, velocityFactor: 0.6 } })!;
    expect(t).toMatchObject({ unit: 'm', scale: 'log' });
    expect(t.fieldValue(0.012)).toEqual({ meters: 0.012, velocityFactor: 0.6 });
  });
  it('has nothing to tune on a measured two-port', () => {
    expect(tunableOf({ id: 'N1', kind: 'two-port', touchstone: '# GHz S RI R 50\n1 0 0 1 0 1 0 0 0\n' })).toBeNull();
  });
});
