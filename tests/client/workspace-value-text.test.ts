import { describe, expect, it } from 'vitest';
import { formatValueText, parseValueText } from '../../client/features/workspace/value/value-text';

const value = (text: string, unit: Parameters<typeof parseValueText>[1], rules = {}) => {
  const r = parseValueText(text, unit, rules);
  if (!r.ok) throw new Error(`expected a value from ${text}, got: ${r.message}`);
  return r.value;
};
const message = (text: string, unit: Parameters<typeof parseValueText>[1], rules = {}) => {
  const r = parseValueText(text, unit, rules);
  if (r.ok) throw new Error(`expected an error for ${text}, got ${r.value}`);
  return r.message;
};

describe('parseValueText', () => {
  it('reads prefixes with or without the unit and a space (SI prefixes, common practice)', () => {
    expect(value('3.3n', 'H')).toBeCloseTo(3.3e-9, 20);
    expect(value('3.3 nH', 'H')).toBeCloseTo(3.3e-9, 20);
    expect(value('2.2 pF', 'F')).toBeCloseTo(2.2e-12, 24);
    expect(value('2.2p', 'F')).toBeCloseTo(2.2e-12, 24);
    expect(value('4k7', 'Ω')).toBe(4700);
    expect(value('2.45 GHz', 'Hz')).toBe(2.45e9);
    expect(value('50', 'Ω')).toBe(50);
  });

  it('reads degrees with or without the sign', () => {
    expect(value('45', '°')).toBe(45);
    expect(value('45°', '°')).toBe(45);
    expect(value('12.5 deg', '°')).toBe(12.5);
  });

  it('says what is wrong instead of throwing', () => {
    expect(message('abc', 'H')).toMatch(/not a number/);
    expect(message('2.2 pF', 'H')).toMatch(/farads.*expected henries/);
    expect(message('', 'F')).toMatch(/enter a value/);
    expect(message('x°', '°')).toMatch(/degrees/);
  });

  it('applies the rules', () => {
    expect(message('0', 'H', { positive: true })).toMatch(/more than 0/);
    expect(message('-3', '°', { nonNegative: true })).toMatch(/negative/);
    expect(message('0.5', '', { min: 1 })).toMatch(/at least 1/);
    expect(value('1', '', { min: 1 })).toBe(1);
  });
});

describe('formatValueText', () => {
  it('formats with engineering prefixes and units', () => {
    expect(formatValueText(3.3e-9, 'H')).toBe('3.3 nH');
    expect(formatValueText(1.5e-12, 'F')).toBe('1.5 pF');
    expect(formatValueText(4700, 'Ω')).toBe('4.7 kΩ');
    expect(formatValueText(45, '°')).toBe('45°');
    expect(formatValueText(1.5, '')).toBe('1.5');
  });

  it('never shows NaN or Infinity', () => {
    expect(formatValueText(Number.NaN, 'H')).toBe('—');
    expect(formatValueText(Number.POSITIVE_INFINITY, '°')).toBe('—');
  });

  it('round-trips what it shows back to the same number (four figures)', () => {
    for (const [v, unit] of [
      [3.3e-9, 'H'],
      [1.234e-12, 'F'],
      [47.5, 'Ω'],
      [2.44e9, 'Hz'],
      [12.25, '°'],
      [1.414, ''],
    ] as const) {
      expect(value(formatValueText(v, unit), unit)).toBeCloseTo(v, 12 - Math.floor(Math.log10(Math.abs(v))));
    }
  });

  it('with more figures, round-trips band edges such as 2.4835 GHz', () => {
    expect(formatValueText(2.4835e9, 'Hz', 6)).toBe('2.4835 GHz');
    expect(value(formatValueText(2.4835e9, 'Hz', 6), 'Hz')).toBe(2.4835e9);
  });
});
