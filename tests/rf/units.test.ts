import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { evaluateExpression, formatEngineering, parseEngineering, UnitError, type Unit } from '../../shared/rf/units';

function unitErrorOf(fn: () => unknown): UnitError {
  try {
    fn();
  } catch (err) {
    if (err instanceof UnitError) return err;
    throw err;
  }
  throw new Error('expected a UnitError');
}

describe('parseEngineering', () => {
  // SI prefixes (BIPM SI Brochure, from memory); "m" milli, "M"/"meg" mega as on part labels and in SPICE (common practice).
  const table: [string, Unit | undefined, number][] = [
    ['3.3n', undefined, 3.3e-9],
    ['3.3 nH', 'H', 3.3e-9],
    ['3.3nH', 'H', 3.3e-9],
    ['3.3n', 'H', 3.3e-9],
    ['2.2 pF', 'F', 2.2e-12],
    ['47p', 'F', 47e-12],
    ['0.1uF', 'F', 0.1e-6],
    ['0.1µF', 'F', 0.1e-6],
    ['0.1μF', 'F', 0.1e-6], // Greek mu as well as the micro sign
    ['10 fF', 'F', 10e-15],
    ['2.45 GHz', 'Hz', 2.45e9],
    ['2.45G', 'Hz', 2.45e9],
    ['433.92 MHz', 'Hz', 433.92e6],
    ['2400 MHZ', 'Hz', 2.4e9],
    ['433 mhz', 'Hz', 433e6], // common practice: "m" before Hz always means mega in RF entry
    ['2.4 mHz', 'Hz', 2.4e6],
    ['1 THz', 'Hz', 1e12],
    ['1.2k', undefined, 1200],
    ['1.2 kΩ', 'Ω', 1200],
    ['1.2K', 'Ω', 1200],
    ['100 mΩ', 'Ω', 0.1],
    ['100 mohm', 'Ω', 0.1],
    ['100 mOhms', 'Ω', 0.1],
    ['50 Ω', 'Ω', 50],
    ['50Ω', 'Ω', 50],
    ['50 \u2126', 'Ω', 50], // the ohm sign
    ['50 ohm', 'Ω', 50],
    ['50R', 'Ω', 50],
    ['1 MΩ', 'Ω', 1e6],
    ['1meg', 'Ω', 1e6],
    ['1 Meg', undefined, 1e6],
    ['1MEGohm', 'Ω', 1e6],
    ['1 mH', 'H', 1e-3],
    ['1 MHz', 'Hz', 1e6],
    ['1e-9', 'H', 1e-9],
    ['1E-9', 'F', 1e-9],
    ['1e-9F', 'F', 1e-9],
    ['.5n', 'H', 0.5e-9],
    ['5.', undefined, 5],
    ['+5', undefined, 5],
    ['-3 dB', 'dB', -3],
    ['\u22123 dB', 'dB', -3], // the minus sign
    ['-10.5dB', 'dB', -10.5],
    ['1.6 mm', 'm', 1.6e-3],
    ['35 µm', 'm', 35e-6],
    ['3 m', 'm', 3], // a lone "m" in a metre field is the unit
    ['3 m', 'H', 3e-3], // elsewhere it is milli
    ['3m', undefined, 3e-3],
    ['10 W', 'W', 10],
    ['100 mW', 'W', 0.1],
    ['3.3 V', 'V', 3.3],
    ['20 mA', 'A', 0.02],
    ['20 mS', 'S', 0.02],
    ['  7  ', '', 7],
    ['1.5', '', 1.5],
    ['2k', '', 2000],
  ];
  for (const [text, unit, value] of table) {
    it(`parseEngineering(${JSON.stringify(text)}, ${unit === undefined ? 'no unit' : JSON.stringify(unit)}) is ${value} (SI prefixes, from memory)`, () => {
      const got = parseEngineering(text, unit);
      expect(Math.abs(got - value)).toBeLessThanOrEqual(Math.abs(value) * 1e-15);
    });
  }

  // The letter-and-digit code for resistance and capacitance values (IEC 60062): the letter stands for the decimal point.
  const codes: [string, Unit | undefined, number][] = [
    ['4k7', undefined, 4700],
    ['4k7', 'Ω', 4700],
    ['4K7', 'Ω', 4700],
    ['4k7 Ω', 'Ω', 4700],
    ['2R2', 'Ω', 2.2],
    ['2R2', undefined, 2.2],
    ['R47', 'Ω', 0.47],
    ['1M5', 'Ω', 1.5e6],
    ['4m7', 'Ω', 4.7e-3],
    ['4n7', 'F', 4.7e-9],
    ['4n7F', 'F', 4.7e-9],
    ['6p8', 'F', 6.8e-12],
    ['2u2', 'H', 2.2e-6],
    ['10k0', 'Ω', 10000],
  ];
  for (const [text, unit, value] of codes) {
    it(`reads the code ${JSON.stringify(text)} as ${value} (IEC 60062 letter code, from memory)`, () => {
      expect(parseEngineering(text, unit)).toBeCloseTo(value, 15);
      expect(Math.abs(parseEngineering(text, unit) - value)).toBeLessThanOrEqual(value * 1e-15);
    });
  }

  it('parses "2.45 GHz" to exactly the double nearest 2.45e9 (decimal scaling, no multiply rounding)', () => {
    expect(parseEngineering('2.45 GHz', 'Hz')).toBe(2.45e9);
    expect(parseEngineering('2.2 GHz', 'Hz')).toBe(2.2e9);
    expect(parseEngineering('3.3 nH', 'H')).toBe(3.3e-9);
    expect(parseEngineering('4.7p', 'F')).toBe(4.7e-12);
  });

  const bad: [string, Unit | undefined, string][] = [
    ['', 'H', 'enter a value in henries (H)'],
    ['   ', undefined, 'enter a value'],
    ['abc', 'H', '"abc" is not a number in henries (H)'],
    ['NaN', undefined, '"NaN" is not a number'],
    ['Infinity', undefined, '"Infinity" is not a number'],
    ['1e999', undefined, '"1e999" is out of range'],
    ['2.2 pF', 'H', '"2.2 pF" is in farads, expected henries (H)'],
    ['3.3 nH', 'F', '"3.3 nH" is in henries, expected farads (F)'],
    ['2.45 GHz', 'Ω', '"2.45 GHz" is in hertz, expected ohms (Ω)'],
    ['5 V', '', '"5 V" is in volts, expected a plain number'],
    ['2R2', 'H', '"2R2": "R" marks the decimal point of a resistance, expected henries (H)'],
    ['50R', 'F', '"50R" is in ohms, expected farads (F)'],
    ['3.3 xH', 'H', '"3.3 xH": unknown prefix or unit "x"; expected henries (H)'],
    ['3.3 q', undefined, '"3.3 q": unknown unit "q"'],
    ['3.3 q', 'H', '"3.3 q": unknown unit "q"; expected henries (H)'],
    ['3.3 n H', 'H', '"3.3 n H": unexpected text "n H"'],
    ['3 kdB', 'dB', '"3 kdB": decibels take no prefix'],
    ['3k', 'dB', '"3k": decibels take no prefix'],
    ['2,2 nH', 'H', '"2,2 nH": use a decimal point, not a comma'],
    ['1..2', undefined, '"1..2": unknown unit ".2"'],
    ['0x10', undefined, '"0x10": unknown unit "x10"'],
    ['1e', undefined, '"1e": unknown unit "e"'],
  ];
  for (const [text, unit, message] of bad) {
    it(`rejects ${JSON.stringify(text)}${unit === undefined ? '' : ` as ${unit || 'a plain number'}`} with "${message}"`, () => {
      const err = unitErrorOf(() => parseEngineering(text, unit));
      expect(err.message).toBe(message);
      expect(err.code).toBe('invalid-value');
    });
  }

  it('rejects text that is not a string and very long text', () => {
    expect(() => parseEngineering(42 as unknown as string)).toThrow(UnitError);
    expect(unitErrorOf(() => parseEngineering('1'.repeat(1000))).message).toBe('the value is too long');
  });
});

describe('formatEngineering', () => {
  const table: [number, Unit | undefined, number | undefined, string][] = [
    [3.3e-9, 'H', undefined, '3.3 nH'],
    [2.44e9, 'Hz', undefined, '2.44 GHz'],
    [2.4835e9, 'Hz', undefined, '2.48 GHz'],
    [2.4835e9, 'Hz', 5, '2.4835 GHz'],
    [433.92e6, 'Hz', 5, '433.92 MHz'],
    [2.2e-12, 'F', undefined, '2.2 pF'],
    [1e-12, 'F', undefined, '1 pF'],
    [0.1, 'Ω', undefined, '100 mΩ'],
    [4700, 'Ω', undefined, '4.7 kΩ'],
    [50, 'Ω', undefined, '50 Ω'],
    [1e6, 'Ω', undefined, '1 MΩ'],
    [999.96, 'Ω', undefined, '1 kΩ'], // rounding carries into the next prefix
    [999.4, 'Ω', undefined, '999 Ω'],
    [0.0009996, 'H', undefined, '1 mH'],
    [1.6e-3, 'm', undefined, '1.6 mm'],
    [35e-6, 'm', undefined, '35 µm'],
    [0.0306, 'm', undefined, '30.6 mm'],
    [-3.3e-9, 'H', undefined, '-3.3 nH'],
    [12.3456, 'dB', undefined, '12.3 dB'], // decibels take no prefix
    [-0.5, 'dB', undefined, '-0.5 dB'],
    [1500, 'dB', undefined, '1500 dB'],
    [1200, '', undefined, '1.2k'],
    [1200, undefined, undefined, '1.2k'],
    [1.5, '', undefined, '1.5'],
    [0, 'H', undefined, '0 H'],
    [0, '', undefined, '0'],
    [-0, 'F', undefined, '0 F'],
    [1e-20, 'F', undefined, '1e-20 F'], // beyond the prefixes
    [3.3e15, 'Hz', undefined, '3.3e15 Hz'],
    [Number.NaN, 'H', undefined, '—'],
    [Number.POSITIVE_INFINITY, 'Hz', undefined, '—'],
    [Number.NEGATIVE_INFINITY, undefined, undefined, '—'],
    [123456, 'Hz', 1, '100 kHz'],
    [1 / 3, 'V', 15, '333.333333333333 mV'],
  ];
  for (const [value, unit, digits, text] of table) {
    it(`formatEngineering(${value}, ${JSON.stringify(unit)}${digits ? `, ${digits} digits` : ''}) is "${text}" (common practice)`, () => {
      expect(formatEngineering(value, unit, digits ? { digits } : undefined)).toBe(text);
    });
  }

  it('parses back what it formats, to the digits asked for (property, seeded)', () => {
    const units: Unit[] = ['H', 'F', 'Ω', 'Hz', 'm', 'W', 'V', 'A', 'S', ''];
    fc.assert(
      fc.property(
        fc.double({ min: 1e-15, max: 1e14, noNaN: true }),
        fc.boolean(),
        fc.constantFrom(...units),
        fc.integer({ min: 1, max: 15 }),
        (magnitude, negative, unit, digits) => {
          const value = negative ? -magnitude : magnitude;
          const text = formatEngineering(value, unit, { digits });
          const back = parseEngineering(text, unit);
          // Rounding to `digits` significant figures moves the value by at most half a unit in the last place.
          expect(Math.abs(back - value)).toBeLessThanOrEqual(Math.abs(value) * (0.5 * 10 ** (1 - digits)) * (1 + 1e-9) + 1e-300);
        },
      ),
      { seed: 4242, numRuns: 2000 },
    );
  });

  it('formats to at most the significant figures asked for (property, seeded)', () => {
    fc.assert(
      fc.property(fc.double({ min: 1e-15, max: 1e14, noNaN: true }), fc.integer({ min: 1, max: 6 }), (value, digits) => {
        const text = formatEngineering(value, 'F', { digits });
        const mantissa = text.split(' ')[0];
        expect(mantissa.replace('.', '').replace(/^0+/, '').replace(/0+$/, '').length).toBeLessThanOrEqual(digits);
      }),
      { seed: 7, numRuns: 1000 },
    );
  });
});

describe('evaluateExpression', () => {
  it('evaluates 1/(2*pi*2.44G*50): the capacitance of 50 Ω reactance at 2.44 GHz (X = 1/(ωC), common practice)', () => {
    expect(evaluateExpression('1/(2*pi*2.44G*50)', 'F')).toBeCloseTo(1 / (2 * Math.PI * 2.44e9 * 50), 25);
    expect(evaluateExpression('1 / (2 * pi * 2.44 GHz * 50 Ω)')).toBeCloseTo(1 / (2 * Math.PI * 2.44e9 * 50), 25);
  });

  it('evaluates precedence, powers, unary minus and functions', () => {
    expect(evaluateExpression('1 + 2 * 3')).toBe(7);
    expect(evaluateExpression('(1 + 2) * 3')).toBe(9);
    expect(evaluateExpression('2^3^2')).toBe(512); // right-associative
    expect(evaluateExpression('-2^2')).toBe(-4);
    expect(evaluateExpression('2^-1')).toBe(0.5);
    expect(evaluateExpression('10 - 4 - 3')).toBe(3);
    expect(evaluateExpression('8 / 4 / 2')).toBe(1);
    expect(evaluateExpression('sqrt(50*75)')).toBeCloseTo(Math.sqrt(3750), 12); // quarter-wave transformer impedance (Pozar 4th ed. Section 2.5, from memory)
    expect(evaluateExpression('pow(2, 10)')).toBe(1024);
    expect(evaluateExpression('max(1n, 2n)')).toBe(2e-9);
    expect(evaluateExpression('log10(1000) + ln(e)')).toBeCloseTo(4, 14);
    expect(evaluateExpression('4k7 + 2R2')).toBeCloseTo(4702.2, 10);
    expect(evaluateExpression('3.3n + 1n')).toBeCloseTo(4.3e-9, 22);
    expect(evaluateExpression('1e-9*2')).toBe(2e-9);
  });

  it('returns a plain value unchanged and checks its unit', () => {
    expect(evaluateExpression('3.3 nH', 'H')).toBe(3.3e-9);
    expect(evaluateExpression('-3.3n')).toBe(-3.3e-9);
    expect(unitErrorOf(() => evaluateExpression('2.2 pF', 'H')).message).toBe('"2.2 pF" is in farads, expected henries (H)');
  });

  const bad: [string, string][] = [
    ['', 'enter a value or an expression'],
    ['1/(2*pi', '"1/(2*pi": expected ")" at the end'],
    ['2 +', '"2 +": the expression ends too early'],
    ['2 * foo', '"2 * foo": unknown name "foo"'],
    ['import(1)', '"import(1)": unknown function "import"'],
    ['pow(2)', '"pow(2)": pow takes 2 arguments'],
    ['1/0', '"1/0": does not give a finite number'],
    ['sqrt(-1)', '"sqrt(-1)": does not give a finite number'],
    ['2 $ 3', '"2 $ 3": unexpected text "$ 3"'],
    ['2 * $ 3', '"2 * $ 3": unexpected "$"'],
    ['2pi * 3', '"2pi * 3": unknown unit "pi"'],
    ['(1)(2)', '"(1)(2)": unexpected "(2)"'],
  ];
  for (const [text, message] of bad) {
    it(`rejects ${JSON.stringify(text)} with "${message}"`, () => {
      expect(unitErrorOf(() => evaluateExpression(text)).message).toBe(message);
    });
  }

  it('rejects a very long expression', () => {
    expect(unitErrorOf(() => evaluateExpression(`1${'+1'.repeat(400)}`)).message).toBe('the expression is too long');
  });
});
