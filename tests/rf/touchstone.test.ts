import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import {
  parseTouchstone,
  resampleTouchstone,
  writeTouchstone,
  TouchstoneError,
  TouchstoneRangeError,
  type TouchstoneData,
} from '../../shared/rf/touchstone';

const fixture = (name: string) => readFileSync(fileURLToPath(new URL(`./fixtures/${name}`, import.meta.url)), 'utf8');

/** Complex helpers kept apart from the engine's, so the checks do not reuse what they check. */
type C = [number, number];
const cadd = (a: C, b: C): C => [a[0] + b[0], a[1] + b[1]];
const csub = (a: C, b: C): C => [a[0] - b[0], a[1] - b[1]];
const cmul = (a: C, b: C): C => [a[0] * b[0] - a[1] * b[1], a[0] * b[1] + a[1] * b[0]];
const cdiv = (a: C, b: C): C => {
  const d = b[0] * b[0] + b[1] * b[1];
  return [(a[0] * b[0] + a[1] * b[1]) / d, (a[1] * b[0] - a[0] * b[1]) / d];
};
const polar = (mag: number, deg: number): C => [mag * Math.cos((deg * Math.PI) / 180), mag * Math.sin((deg * Math.PI) / 180)];

function expectClose(actual: ArrayLike<number>, expected: ArrayLike<number>, tol = 1e-12) {
  expect(actual.length).toBe(expected.length);
  for (let i = 0; i < expected.length; i++) {
    if (Math.abs(actual[i] - expected[i]) > tol * (1 + Math.abs(expected[i]))) {
      throw new Error(`index ${i}: ${actual[i]} is not within ${tol} of ${expected[i]}`);
    }
  }
}

function errorOf(fn: () => unknown): TouchstoneError {
  try {
    fn();
  } catch (err) {
    if (err instanceof TouchstoneError) return err;
    throw err;
  }
  throw new Error('expected a TouchstoneError');
}

/** S as a 2×2 matrix (row-major) from Z via S = (Z − R·I)(Z + R·I)⁻¹, the textbook way. */
function sFromZ2(z: [C, C, C, C], r: number): [C, C, C, C] {
  const [z11, z12, z21, z22] = z;
  const R: C = [r, 0];
  // Pozar, Microwave Engineering 4th ed., Table 4.2 (S in terms of Z, equal reference impedances), from memory.
  const dz = csub(cmul(cadd(z11, R), cadd(z22, R)), cmul(z12, z21));
  const s11 = cdiv(csub(cmul(csub(z11, R), cadd(z22, R)), cmul(z12, z21)), dz);
  const s12 = cdiv(cmul([2 * r, 0], z12), dz);
  const s21 = cdiv(cmul([2 * r, 0], z21), dz);
  const s22 = cdiv(csub(cmul(cadd(z11, R), csub(z22, R)), cmul(z12, z21)), dz);
  return [s11, s12, s21, s22];
}

describe('parseTouchstone: option line', () => {
  it('defaults to GHz S MA R 50 without an option line (Touchstone v1.1 spec, from memory)', () => {
    const d = parseTouchstone('1.5 0.5 90\n2.5 0.25 180\n');
    expect(d.ports).toBe(1);
    expect(Array.from(d.frequenciesHz)).toEqual([1.5e9, 2.5e9]);
    expect(d.referenceOhms).toBe(50);
    expectClose(d.s, [...polar(0.5, 90), ...polar(0.25, 180)]);
  });

  it('fills each field left out of the option line with its default (Touchstone v1.1 spec, from memory)', () => {
    const d = parseTouchstone('# RI\n2 0.1 0.2\n');
    expect(d.frequenciesHz[0]).toBe(2e9);
    expect(Array.from(d.s)).toEqual([0.1, 0.2]);
    expect(d.referenceOhms).toBe(50);
  });

  it('reads the fields in any order and any case (Touchstone v1.1 spec: case-insensitive, from memory)', () => {
    const a = parseTouchstone('# r 75 ri s khz\n100 0.1 -0.2\n');
    const b = parseTouchstone('#KHZ S RI R 75\n100 0.1 -0.2\n');
    expect(a).toEqual(b);
    expect(a.referenceOhms).toBe(75);
    expect(a.frequenciesHz[0]).toBe(100e3);
  });

  it('scales each frequency unit exactly to hertz (common practice)', () => {
    for (const [unit, token, hz] of [
      ['Hz', '2440000000', 2.44e9],
      ['kHz', '2440000', 2.44e9],
      ['MHz', '2440', 2.44e9],
      ['GHz', '2.44', 2.44e9],
      ['GHz', '2.2', 2.2e9],
      ['MHz', '433.92', 433.92e6],
      ['GHz', '0.24e1', 2.4e9],
    ] as const) {
      const d = parseTouchstone(`# ${unit} S RI R 50\n${token} 0 0\n`);
      // Exact, not close: a sweep starting at 2.2e9 must not fall outside a file starting at "2.2" GHz.
      expect(d.frequenciesHz[0]).toBe(hz);
    }
  });

  it('only the first option line counts (Touchstone v1.1 spec, from memory)', () => {
    const d = parseTouchstone('# MHz S RI R 50\n# GHz S MA R 75\n100 0.5 0.5\n');
    expect(d.frequenciesHz[0]).toBe(100e6);
    expect(d.referenceOhms).toBe(50);
    expect(Array.from(d.s)).toEqual([0.5, 0.5]);
  });
});

describe('parseTouchstone: formats', () => {
  // One value, Γ = 0.6∠−30°, written three ways (the RI / MA / DB definitions of the Touchstone spec, from memory).
  const gamma = polar(0.6, -30);
  const cases: [string, string][] = [
    ['RI', `${gamma[0]} ${gamma[1]}`],
    ['MA', '0.6 -30'],
    ['DB', `${20 * Math.log10(0.6)} -30`],
  ];
  for (const unit of ['Hz', 'kHz', 'MHz', 'GHz'] as const) {
    for (const [format, pair] of cases) {
      it(`reads one-port S in ${format} with ${unit} (Touchstone v1.1 spec, from memory)`, () => {
        const scale = { Hz: 1, kHz: 1e3, MHz: 1e6, GHz: 1e9 }[unit];
        const d = parseTouchstone(`# ${unit} S ${format} R 50\n${2.45e9 / scale} ${pair}\n`);
        expect(d.frequenciesHz[0]).toBe(2.45e9);
        expectClose(d.s, gamma, 1e-12);
      });
    }
  }

  it('matches scikit-rf 0.15 on a two-port DB file with noise data (scikit-rf 0.15 Network, values printed by it)', () => {
    const d = parseTouchstone(fixture('bench-amp.s2p'));
    expect(d.ports).toBe(2);
    expect(Array.from(d.frequenciesHz)).toEqual([2.3e9, 2.4e9, 2.5e9]);
    // Row-major S11, S12, S21, S22 per frequency, as scikit-rf 0.15 gives n.s[k, i, j].
    expectClose(
      d.s,
      [
        -0.16748271957891375, -0.29008857970048957, 0.030496778576832587, 0.025589835655915397, -0.44698814848359353,
        5.109097915881924, 0.1409191465632227, -0.24407912160674683,
        -0.19460301613255282, -0.24464952116792393, 0.03411596377422163, 0.024786698565862297, 0.13119552307227042,
        5.010154892797386, 0.10454741520596013, -0.23481733916921926,
        -0.2109247115397943, -0.19669047555009278, 0.037650069880523836, 0.023071992496308518, 0.7574124531028061,
        4.782114023011581, 0.07130858260843988, -0.2261619299648157,
      ],
      1e-12,
    );
    expect(d.comments?.[0]).toBe('Invented two-port data for the Touchstone parser tests (no real device).');
  });

  it('matches scikit-rf 0.15 on a one-port RI file in Hz (scikit-rf 0.15 Network)', () => {
    const d = parseTouchstone(fixture('antenna-ri.s1p'));
    expect(Array.from(d.frequenciesHz)).toEqual([2.2e9, 2.45e9, 2.7e9]);
    expect(Array.from(d.s)).toEqual([0.42, -0.31, 0.05, 0.02, -0.28, 0.39]);
    expect(d.comments).toEqual(['Invented chip-antenna reflection data for the parser tests.', 'near resonance']);
  });
});

describe('parseTouchstone: Z and Y parameters', () => {
  it('converts a one-port v1 Z file (normalised to R) by hand: z = 1 + j gives S = 0.2 + 0.4j (hand computation, S = (z − 1)/(z + 1))', () => {
    const d = parseTouchstone('# MHz Z RI R 50\n100 1 1\n');
    // (1 + j − 1)/(1 + j + 1) = j/(2 + j) = j(2 − j)/5 = (1 + 2j)/5
    expectClose(d.s, [0.2, 0.4]);
  });

  it('reads v2 Z data in ohms: 50 + 50j Ω on 50 Ω gives the same S (Touchstone 2.0 spec: Z and Y not normalised, from memory)', () => {
    const d = parseTouchstone('[Version] 2.0\n# MHz Z RI R 50\n[Number of Ports] 1\n[Number of Frequencies] 1\n[Network Data]\n100 50 50\n[End]\n');
    expectClose(d.s, [0.2, 0.4]);
  });

  it('converts one-port Y: y = 1 − j (normalised) gives S = (1 − y)/(1 + y) = (−1 + 2j)/5 (hand computation)', () => {
    const d = parseTouchstone('# GHz Y MA R 50\n1 1.4142135623730951 -45\n');
    // (1 − (1 − j))/(1 + 1 − j) = j/(2 − j) = j(2 + j)/5 = (−1 + 2j)/5
    expectClose(d.s, [-0.2, 0.4], 1e-12);
  });

  it('converts a two-port Z file of a 50 Ω shunt resistor: S11 = −1/3, S21 = 2/3 (hand computation: S11 = −Z0/(2R + Z0), S21 = 2R/(2R + Z0))', () => {
    // Z of a shunt R between the ports: every entry is R. v1 values are normalised: 50/50 = 1.
    const d = parseTouchstone('# GHz Z RI R 50\n1 1 0 1 0 1 0 1 0\n');
    expectClose(d.s, [-1 / 3, 0, 2 / 3, 0, 2 / 3, 0, -1 / 3, 0]);
  });

  it('converts a two-port Y file of a 50 Ω series resistor: S11 = 1/3, S21 = 2/3 (hand computation: S11 = R/(R + 2Z0), S21 = 2Z0/(R + 2Z0))', () => {
    // Y of a series R: [[1/R, −1/R], [−1/R, 1/R]]; normalised by R_ref = 50: [[1, −1], [−1, 1]].
    const d = parseTouchstone('# GHz Y RI R 50\n1 1 0 -1 0 -1 0 1 0\n');
    expectClose(d.s, [1 / 3, 0, 2 / 3, 0, 2 / 3, 0, 1 / 3, 0]);
    // The same network in v2, in siemens.
    const v2 = parseTouchstone(
      '[Version] 2.0\n# GHz Y RI R 50\n[Number of Ports] 2\n[Two-Port Data Order] 12_21\n[Number of Frequencies] 1\n[Network Data]\n1 0.02 0 -0.02 0 -0.02 0 0.02 0\n[End]\n',
    );
    expectClose(v2.s, [1 / 3, 0, 2 / 3, 0, 2 / 3, 0, 1 / 3, 0]);
  });

  it('converts a non-reciprocal two-port Z file and keeps Z21 apart from Z12 (hand computation via Pozar 4th ed. Table 4.2, from memory)', () => {
    const z: [C, C, C, C] = [
      [30, 10],
      [5, -2],
      [120, 40],
      [60, -25],
    ]; // Z11, Z12, Z21, Z22 in ohms
    const expected = sFromZ2(z, 50);
    // v1 file: normalised, columns Z11 Z21 Z12 Z22.
    const n = (c: C) => `${c[0] / 50} ${c[1] / 50}`;
    const d = parseTouchstone(`# GHz Z RI R 50\n2 ${n(z[0])} ${n(z[2])} ${n(z[1])} ${n(z[3])}\n`);
    expectClose(d.s, expected.flat(), 1e-12);
  });

  it('rejects a Z matrix that has no S-parameters (z = −1 on one port)', () => {
    expect(errorOf(() => parseTouchstone('# GHz Z RI\n1 -1 0\n')).message).toBe('line 2: Z-parameters at 1 cannot be converted to S (singular matrix)');
  });
});

describe('parseTouchstone: two-port column order', () => {
  const row = '1 0.11 0 0.21 0 0.12 0 0.22 0';
  it('reads v1 two-port columns as N11 N21 N12 N22 (Touchstone v1.1 spec, from memory)', () => {
    const d = parseTouchstone(`# GHz S RI R 50\n${row}\n`);
    // Stored row-major: S11, S12, S21, S22.
    expect(Array.from(d.s)).toEqual([0.11, 0, 0.12, 0, 0.21, 0, 0.22, 0]);
  });

  it('reads v2 [Two-Port Data Order] 21_12 like v1, and 12_21 as N11 N12 N21 N22 (Touchstone 2.0 spec, from memory)', () => {
    const head = '[Version] 2.0\n# GHz S RI R 50\n[Number of Ports] 2\n';
    const tail = '[Number of Frequencies] 1\n[Network Data]\n' + row + '\n[End]\n';
    const legacy = parseTouchstone(`${head}[Two-Port Data Order] 21_12\n${tail}`);
    expect(Array.from(legacy.s)).toEqual([0.11, 0, 0.12, 0, 0.21, 0, 0.22, 0]);
    const rowMajor = parseTouchstone(`${head}[Two-Port Data Order] 12_21\n${tail}`);
    // Here the second column is S12, so the row 0.11 0.21 0.12 0.22 means S12 = 0.21.
    expect(Array.from(rowMajor.s)).toEqual([0.11, 0, 0.21, 0, 0.12, 0, 0.22, 0]);
  });

  it('writes two-port data back in the v1 order (Touchstone v1.1 spec, from memory)', () => {
    const d = parseTouchstone(`# GHz S RI R 50\n${row}\n`);
    expect(writeTouchstone(d, { format: 'RI', unit: 'GHz' })).toBe(`# GHz S RI R 50\n${row}\n`);
  });

  it('reads [Matrix Format] Lower and Upper, mirroring the other triangle (Touchstone 2.0 spec, from memory)', () => {
    const make = (fmt: string, data: string) =>
      `[Version] 2.0\n# GHz S RI R 50\n[Number of Ports] 2\n[Two-Port Data Order] 12_21\n[Number of Frequencies] 1\n[Matrix Format] ${fmt}\n[Network Data]\n${data}\n[End]\n`;
    const lower = parseTouchstone(make('Lower', '1 0.11 0.01 0.21 0.02 0.22 0.03'));
    expect(Array.from(lower.s)).toEqual([0.11, 0.01, 0.21, 0.02, 0.21, 0.02, 0.22, 0.03]);
    const upper = parseTouchstone(make('Upper', '1 0.11 0.01 0.12 0.02 0.22 0.03'));
    expect(Array.from(upper.s)).toEqual([0.11, 0.01, 0.12, 0.02, 0.12, 0.02, 0.22, 0.03]);
  });
});

describe('parseTouchstone: layout', () => {
  it('collects full-line and trailing comments, and ignores blank lines (Touchstone v1.1 spec, from memory)', () => {
    const d = parseTouchstone('! first\n\n   \n# MHz S RI R 50 ! trailing on the option line\n100 0.1 0.2 ! after data\n!\n200 0.3 0.4\n');
    expect(d.comments).toEqual(['first', 'trailing on the option line', 'after data']);
    expect(d.frequenciesHz.length).toBe(2);
  });

  it('has no comments field when the file has none', () => {
    expect(parseTouchstone('# GHz S RI\n1 0 0\n').comments).toBeUndefined();
  });

  it('reads Windows and old-Mac line ends', () => {
    const d = parseTouchstone('# GHz S RI\r\n1 0.1 0.2\r\n2 0.3 0.4\r3 0.5 0.6');
    expect(Array.from(d.frequenciesHz)).toEqual([1e9, 2e9, 3e9]);
  });

  it('reads two-port data wrapped over several lines (Touchstone 2.0 spec: a frequency point starts on a new line and may wrap, from memory)', () => {
    const text = '# GHz S RI R 50\n1 0.11 0\n  0.21 0 0.12 0\n  0.22 0\n2 0.11 0 0.21 0 0.12 0 0.22 0\n';
    // The port count must come from the caller (the file name) or [Number of Ports]: a first line of
    // three numbers alone reads as one-port data.
    expect(errorOf(() => parseTouchstone(text)).message).toBe('line 3: expected 3 numbers (frequency and 1 complex value), found 4');
    const d = parseTouchstone(text, { ports: 2 });
    expect(Array.from(d.frequenciesHz)).toEqual([1e9, 2e9]);
    expect(Array.from(d.s.subarray(0, 8))).toEqual([0.11, 0, 0.12, 0, 0.21, 0, 0.22, 0]);
    expect(Array.from(d.s.subarray(8))).toEqual([0.11, 0, 0.12, 0, 0.21, 0, 0.22, 0]);
  });

  it('reads tabs and runs of spaces between numbers', () => {
    const d = parseTouchstone('#\tMHz\tS\tRI\n100\t\t0.5   -0.5\n');
    expect(Array.from(d.s)).toEqual([0.5, -0.5]);
  });

  it('accepts a 0 Hz (DC) point', () => {
    expect(parseTouchstone('# Hz S RI\n0 1 0\n10 0.9 0\n').frequenciesHz[0]).toBe(0);
  });
});

describe('parseTouchstone: noise data', () => {
  it('ignores v1 two-port noise data that starts where the frequency decreases (Touchstone v1.1 spec, from memory)', () => {
    const d = parseTouchstone(fixture('bench-amp.s2p'));
    expect(d.frequenciesHz.length).toBe(3);
    expect(d.s.length).toBe(3 * 8);
  });

  it('ignores noise data that starts at the last network frequency', () => {
    const d = parseTouchstone('# GHz S MA R 50\n1 0.5 0 0.9 10 0.1 20 0.4 30\n2 0.5 0 0.9 10 0.1 20 0.4 30\n2 1.2 0.5 20 0.3\n3 1.4 0.4 25 0.3\n');
    expect(Array.from(d.frequenciesHz)).toEqual([1e9, 2e9]);
  });

  it('still checks that noise lines hold numbers', () => {
    expect(errorOf(() => parseTouchstone('# GHz S MA\n2 0.5 0 0.9 10 0.1 20 0.4 30\n1 1.2 x 20 0.3\n')).message).toBe(
      'line 3: expected a number, found "x"',
    );
  });

  it('ignores a v2 [Noise Data] block (Touchstone 2.0 spec, from memory)', () => {
    const d = parseTouchstone(
      '[Version] 2.0\n# GHz S MA R 50\n[Number of Ports] 2\n[Two-Port Data Order] 21_12\n[Number of Frequencies] 2\n[Number of Noise Frequencies] 2\n' +
        '[Network Data]\n1 0.5 0 0.9 10 0.1 20 0.4 30\n2 0.5 0 0.9 10 0.1 20 0.4 30\n[Noise Data]\n1 1.2 0.5 20 0.3\n2 1.4 0.4 25 0.3\n[End]\n',
    );
    expect(d.frequenciesHz.length).toBe(2);
  });

  it('does not take one-port data with a frequency decrease for noise', () => {
    expect(errorOf(() => parseTouchstone('# GHz S MA\n2 0.5 0\n1 0.4 0\n')).message).toBe('line 3: frequencies must increase');
  });
});

describe('parseTouchstone: v2 keywords', () => {
  it('takes [Reference] on the keyword line or on the lines after it (Touchstone 2.0 spec, from memory)', () => {
    const common = '[Version] 2.0\n# GHz S RI\n[Number of Ports] 2\n[Two-Port Data Order] 12_21\n[Number of Frequencies] 1\n';
    const data = '[Network Data]\n1 0 0 0 0 0 0 0 0\n[End]\n';
    expect(parseTouchstone(`${common}[Reference] 75 75\n${data}`).referenceOhms).toBe(75);
    expect(parseTouchstone(`${common}[Reference]\n75\n75\n${data}`).referenceOhms).toBe(75);
  });

  it('rejects ports with different references', () => {
    const text = '[Version] 2.0\n# GHz S RI\n[Number of Ports] 2\n[Two-Port Data Order] 12_21\n[Reference] 50 75\n[Network Data]\n1 0 0 0 0 0 0 0 0\n';
    expect(errorOf(() => parseTouchstone(text)).message).toBe('line 5: ports with different reference impedances (50, 75 Ω) are not supported');
  });

  it('skips a [Begin Information] block and stops at [End] (Touchstone 2.0 spec, from memory)', () => {
    const d = parseTouchstone(
      '[Version] 2.0\n# GHz S RI\n[Number of Ports] 1\n[Begin Information]\n[Manufacturer] nobody\n12 34 56 78\n[End Information]\n' +
        '[Number of Frequencies] 1\n[Network Data]\n1 0.5 0.5\n[End]\n2 not data at all\n',
    );
    expect(Array.from(d.s)).toEqual([0.5, 0.5]);
  });

  it('checks [Number of Frequencies] against the data', () => {
    const text = '[Version] 2.0\n# GHz S RI\n[Number of Ports] 1\n[Number of Frequencies] 3\n[Network Data]\n1 0 0\n2 0 0\n[End]\n';
    expect(errorOf(() => parseTouchstone(text)).message).toBe('line 4: [Number of Frequencies] is 3 but the file holds 2');
  });

  it('takes the port count from [Number of Ports] before the column count', () => {
    // Nine numbers on one line could be a two-port point; [Number of Ports] 1 makes it an error instead.
    const text = '[Version] 2.0\n# GHz S RI\n[Number of Ports] 1\n[Network Data]\n1 0 0 0 0 0 0 0 0\n';
    expect(errorOf(() => parseTouchstone(text)).message).toBe('line 5: expected 3 numbers (frequency and 1 complex value), found 9');
  });

  it('rejects more than two ports by keyword, by options and by column count', () => {
    expect(errorOf(() => parseTouchstone('[Version] 2.0\n# GHz S RI\n[Number of Ports] 4\n')).message).toBe(
      'line 3: only one- and two-port data are supported, found 4 ports',
    );
    expect(() => parseTouchstone('1 0 0', { ports: 3 })).toThrow(/ports must be 1 or 2/);
    expect(errorOf(() => parseTouchstone('# GHz S RI\n1 0 0 0 0 0 0 0 0 0 0 0 0 0 0 0 0 0 0\n')).message).toMatch(
      /^line 2: expected 3 numbers \(one-port: frequency and 1 complex value\) or 9 \(two-port: frequency and 4 complex values\), found 19; only one- and two-port data are supported$/,
    );
  });

  it('takes the port count from opts before [Number of Ports] and the columns', () => {
    expect(errorOf(() => parseTouchstone('[Version] 2.0\n# GHz S RI\n[Number of Ports] 2\n', { ports: 1 })).message).toBe(
      'line 3: [Number of Ports] is 2 but 1 port was expected',
    );
    expect(errorOf(() => parseTouchstone('# GHz S RI\n1 0 0\n', { ports: 2 })).message).toBe(
      'line 2: expected 9 numbers (frequency and 4 complex values), found 3 before the end of the file',
    );
  });

  it('rejects mixed-mode data and a bad [Two-Port Data Order]', () => {
    expect(errorOf(() => parseTouchstone('[Version] 2.0\n[Mixed-Mode Order] D2,1 C2,1\n')).message).toBe('line 2: mixed-mode data are not supported');
    expect(errorOf(() => parseTouchstone('[Version] 2.0\n[Number of Ports] 2\n[Two-Port Data Order] 11_22\n')).message).toBe(
      'line 3: [Two-Port Data Order] expects 12_21 or 21_12, found "11_22"',
    );
  });
});

describe('parseTouchstone: errors name the line and what was expected', () => {
  const cases: [string, string, string][] = [
    ['an empty file', '', 'line 1: the file is empty'],
    ['only white space', '  \n\t\n', 'line 1: the file is empty'],
    ['comments but no data', '! nothing\n# GHz S RI\n! still nothing\n', 'line 3: no network data found (expected lines of a frequency followed by its complex values)'],
    ['an unknown format', '! a\n! b\n# GHz S XY R 50\n1 0 0\n', 'line 3: unknown format "XY" (expected RI, MA or DB)'],
    ['an unknown unit', '# THZ S RI\n1 0 0\n', 'line 1: unknown frequency unit "THZ" (expected Hz, kHz, MHz or GHz)'],
    ['an unsupported parameter', '# GHz H RI\n1 0 0\n', 'line 1: parameter "H" is not supported (expected S, Y or Z)'],
    ['an unknown parameter', '# GHz Q RI\n1 0 0\n', 'line 1: unknown parameter "Q" (expected S, Y or Z)'],
    ['R without a value', '# GHz S RI R\n1 0 0\n', 'line 1: expected a reference resistance after "R"'],
    ['a negative R', '# GHz S RI R -50\n1 0 0\n', 'line 1: reference resistance must be positive, found -50'],
    ['a short two-port line', '# GHz S RI\n! 2\n! 3\n! 4\n! 5\n1 0 0 0 0 0 0 0 0\n2 0 0 0 0\n3 0 0 0 0 0 0 0 0\n', 'line 7: expected 9 numbers (frequency and 4 complex values), found 5'],
    ['a long one-port line', '# GHz S RI\n1 0 0\n2 0 0 0\n', 'line 3: expected 3 numbers (frequency and 1 complex value), found 4'],
    ['a wrapped point that runs short', '# GHz S RI\n1 0 0 0 0 0 0 0 0\n2 0 0 0\n0 0 0\n3 0 0 0 0 0 0 0 0\n', 'line 3: expected 9 numbers (frequency and 4 complex values), found 7 (lines 3–4)'],
    ['a truncated last point', '# GHz S RI\n1 0 0 0 0 0 0 0 0\n2 0 0\n', 'line 3: expected 9 numbers (frequency and 4 complex values), found 3 before the end of the file'],
    ['a repeated frequency', '# GHz S RI\n1 0 0\n1 0 0\n', 'line 3: frequencies must increase'],
    ['a decreasing frequency', '# GHz S RI\n1 0 0\n2 0 0\n! x\n1.5 0 0\n', 'line 5: frequencies must increase'],
    ['a negative frequency', '# GHz S RI\n-1 0 0\n', 'line 2: frequencies must not be negative, found -1'],
    ['NaN', '# GHz S RI\n1 NaN 0\n', 'line 2: expected a number, found "NaN"'],
    ['Infinity', '# GHz S RI\n1 Infinity 0\n', 'line 2: expected a number, found "Infinity"'],
    ['a number too large', '# GHz S RI\n1 1e999 0\n', 'line 2: number out of range: "1e999"'],
    ['a decibel value too large', '# GHz S DB\n1 1e308 0\n', 'line 2: value out of range'],
    ['hexadecimal', '# GHz S RI\n1 0x10 0\n', 'line 2: expected a number, found "0x10"'],
    ['a comma decimal', '# GHz S RI\n1 0,5 0\n', 'line 2: expected a number, found "0,5"'],
    ['words', '# GHz S RI\nfreq s11re s11im\n', 'line 2: expected a number, found "freq"'],
    ['an unclosed keyword', '[Version 2.0\n', 'line 1: expected "]" to close the keyword'],
    ['a bad version', '[Version] 3.7\n', 'line 1: unsupported [Version] "3.7" (expected 1.x or 2.x)'],
    ['a keyword inside a wrapped point', '# GHz S RI\n1 0 0 0 0 0 0 0 0\n2 0 0 0 0\n[End]\n', 'line 3: expected 9 numbers (frequency and 4 complex values), found 5'],
  ];
  for (const [what, text, message] of cases) {
    it(`rejects ${what}: "${message}"`, () => {
      const err = errorOf(() => parseTouchstone(text));
      expect(err.message).toBe(message);
      expect(err.code).toBe('invalid-touchstone');
      expect(err.line).toBe(Number(/^line (\d+)/.exec(message)![1]));
      expect(err.reason).toBe(message.replace(/^line \d+: /, ''));
    });
  }

  it('shortens a very long bad token in the message', () => {
    const err = errorOf(() => parseTouchstone(`# GHz S RI\n1 ${'x'.repeat(1000)} 0\n`));
    expect(err.message).toBe(`line 2: expected a number, found "${'x'.repeat(24)}…"`);
  });
});

describe('parseTouchstone: pathological input', () => {
  it('parses 200 000 one-port lines', () => {
    const lines = ['# Hz S RI R 50'];
    for (let i = 0; i < 200_000; i++) lines.push(`${1e6 + i * 1000} ${(i % 7) / 10} ${-(i % 5) / 10}`);
    const d = parseTouchstone(lines.join('\n'));
    expect(d.frequenciesHz.length).toBe(200_000);
    expect(d.frequenciesHz[199_999]).toBe(1e6 + 199_999 * 1000);
    expect(d.s[2 * 199_999]).toBe((199_999 % 7) / 10);
  });

  it('fails on a 5 MB single line of numbers, naming the line', () => {
    const line = Array.from({ length: 800_000 }, (_, i) => String(i + 1)).join(' ');
    expect(line.length).toBeGreaterThan(5e6);
    expect(errorOf(() => parseTouchstone(`# GHz S RI\n${line}`)).message).toMatch(/^line 2: expected 3 numbers .* found 800000; only one- and two-port data are supported$/);
  });

  it('fails on a 5 MB token of digits and on a 5 MB run of signs without backtracking', () => {
    const digits = '1'.repeat(5_000_000);
    expect(errorOf(() => parseTouchstone(`1 ${digits}x 0\n`)).message).toMatch(/^line 1: expected a number, found "1{24}…"$/);
    expect(errorOf(() => parseTouchstone(`1 ${'+'.repeat(5_000_000)} 0\n`)).message).toMatch(/^line 1: expected a number/);
    expect(errorOf(() => parseTouchstone(`1 1.${'1'.repeat(5_000_000)}e 0\n`)).message).toMatch(/^line 1: expected a number/);
  });

  it('reads a 5 MB comment line and 200 000 blank lines', () => {
    const d = parseTouchstone(`!${'c'.repeat(5_000_000)}\n${'\n'.repeat(200_000)}# GHz S RI\n1 0 0\n`);
    expect(d.comments?.[0].length).toBe(5_000_000);
    expect(d.frequenciesHz.length).toBe(1);
  });

  it('reads points wrapped one number a line, then fails at the first frequency that does not increase', () => {
    // Lines 3–11 make the point at 2 GHz; line 12 starts a point at 0 Hz.
    const text = `# GHz S RI\n1 0 0 0 0 0 0 0 0\n2\n${'0\n'.repeat(200_000)}`;
    expect(errorOf(() => parseTouchstone(text)).message).toBe('line 12: frequencies must increase');
  });
});

describe('parseTouchstone: any input', () => {
  it('either returns consistent data or throws a TouchstoneError, for lines built from Touchstone fragments (property, seeded)', () => {
    const fragment = fc.constantFrom(
      '# GHz S RI R 50', '# MHz S MA', '# Hz Z DB R 75', '# kHz Y RI', '# GHz S XY', '[Version] 2.0', '[Number of Ports] 1',
      '[Number of Ports] 2', '[Two-Port Data Order] 12_21', '[Number of Frequencies] 2', '[Network Data]', '[Noise Data]',
      '[End]', '[Reference] 50', '[Matrix Format] Lower', '! comment', '', '1 0.5 0', '2 0.5 90', '3 -3 45',
      '1 0.1 0 0.9 0 0.9 0 0.1 0', '2 0.1 0 0.9 0 0.9 0 0.1 0', '1.5 1 0.5 20 0.3', '0 0', 'x', 'NaN', '1e400 0 0', '-1 0 0',
    );
    fc.assert(
      fc.property(fc.array(fragment, { maxLength: 14 }), fc.constantFrom(undefined, 1, 2), (lines, ports) => {
        let d: TouchstoneData;
        try {
          d = parseTouchstone(lines.join('\n'), ports === undefined ? {} : { ports });
        } catch (err) {
          expect(err).toBeInstanceOf(TouchstoneError);
          expect((err as TouchstoneError).message).toMatch(/^line \d+: \S/);
          return;
        }
        expect([1, 2]).toContain(d.ports);
        if (ports !== undefined) expect(d.ports).toBe(ports);
        expect(d.frequenciesHz.length).toBeGreaterThan(0);
        expect(d.s.length).toBe(d.frequenciesHz.length * 2 * d.ports * d.ports);
        for (let i = 1; i < d.frequenciesHz.length; i++) expect(d.frequenciesHz[i]).toBeGreaterThan(d.frequenciesHz[i - 1]);
        for (const v of d.s) expect(Number.isFinite(v)).toBe(true);
        expect(d.referenceOhms).toBeGreaterThan(0);
      }),
      { seed: 11, numRuns: 3000 },
    );
  });

  it('either returns data or throws a TouchstoneError for arbitrary text (property, seeded)', () => {
    fc.assert(
      fc.property(fc.string({ maxLength: 200, unit: fc.constantFrom('1', '2', '.', 'e', '-', ' ', '\n', '!', '#', '[', ']', 'R', 'S', 'G', 'H', 'z', '\t', '\r') }), (text) => {
        try {
          parseTouchstone(text);
        } catch (err) {
          expect(err).toBeInstanceOf(TouchstoneError);
        }
      }),
      { seed: 12, numRuns: 3000 },
    );
  });

  it('ignores a byte-order mark at the start', () => {
    expect(Array.from(parseTouchstone('\ufeff# GHz S RI\n1 0.5 0\n').s)).toEqual([0.5, 0]);
  });

  it('ignores keywords it does not use', () => {
    expect(parseTouchstone('[Version] 2.0\n# GHz S RI\n[Number of Ports] 1\n[Vendor Thing] 42\n[Network Data]\n1 0.5 0\n[End]\n').frequenciesHz.length).toBe(1);
  });
});

describe('resampleTouchstone', () => {
  const data: TouchstoneData = {
    ports: 1,
    frequenciesHz: Float64Array.from([2.2e9, 2.45e9, 2.7e9]),
    s: Float64Array.from([0.42, -0.31, 0.05, 0.02, -0.28, 0.39]),
    referenceOhms: 50,
  };

  it('returns the measured values at the measured frequencies', () => {
    expectClose(resampleTouchstone(data, data.frequenciesHz), data.s, 0);
  });

  it('interpolates linearly in re and im between points (CONTRACT §2: linear in the real and imaginary parts)', () => {
    const out = resampleTouchstone(data, Float64Array.from([2.325e9, 2.6e9]));
    // Midway between points 0 and 1; 60 % of the way from point 1 to point 2.
    expectClose(out, [(0.42 + 0.05) / 2, (-0.31 + 0.02) / 2, 0.05 + 0.6 * (-0.28 - 0.05), 0.02 + 0.6 * (0.39 - 0.02)], 1e-12);
  });

  it('takes frequencies in any order', () => {
    const out = resampleTouchstone(data, Float64Array.from([2.7e9, 2.2e9, 2.45e9]));
    expectClose(out, [-0.28, 0.39, 0.42, -0.31, 0.05, 0.02], 0);
  });

  it('resamples two-port data entry by entry', () => {
    const two: TouchstoneData = {
      ports: 2,
      frequenciesHz: Float64Array.from([1e9, 2e9]),
      s: Float64Array.from([0, 0, 1, 1, 2, 2, 3, 3, 10, 0, 11, 1, 12, 2, 13, 3]),
      referenceOhms: 50,
    };
    expectClose(resampleTouchstone(two, Float64Array.from([1.5e9])), [5, 0, 6, 1, 7, 2, 8, 3], 1e-15);
  });

  it('accepts sweep ends a rounding error outside the measured range', () => {
    const out = resampleTouchstone(data, Float64Array.from([2.2e9 * (1 - 1e-12), 2.7e9 * (1 + 1e-12)]));
    expectClose(out, [0.42, -0.31, -0.28, 0.39], 0);
  });

  it('names both ranges in engineering units when the sweep reaches outside', () => {
    const sweep = Float64Array.from({ length: 11 }, (_, i) => 2e9 + i * 1e8);
    let err: unknown;
    try {
      resampleTouchstone(data, sweep);
    } catch (e) {
      err = e;
    }
    expect(err).toBeInstanceOf(TouchstoneRangeError);
    expect(err).toBeInstanceOf(Error);
    expect((err as TouchstoneRangeError).message).toBe('sweep 2 GHz–3 GHz lies outside the measured range 2.2 GHz–2.7 GHz');
    expect((err as TouchstoneRangeError).code).toBe('touchstone-range');
    expect(() => resampleTouchstone(data, Float64Array.from([2.3e9, 2.75e9]))).toThrow(
      'sweep 2.3 GHz–2.75 GHz lies outside the measured range 2.2 GHz–2.7 GHz',
    );
    expect(() => resampleTouchstone(data, Float64Array.from([433.92e6]))).toThrow(
      'sweep 434 MHz–434 MHz lies outside the measured range 2.2 GHz–2.7 GHz',
    );
  });

  it('works with a single measured point only at that frequency', () => {
    const one = { ...data, frequenciesHz: Float64Array.from([1e9]), s: Float64Array.from([0.5, 0.5]) };
    expect(Array.from(resampleTouchstone(one, Float64Array.from([1e9, 1e9])))).toEqual([0.5, 0.5, 0.5, 0.5]);
    expect(() => resampleTouchstone(one, Float64Array.from([1.1e9]))).toThrow(TouchstoneRangeError);
  });

  it('returns an empty array for an empty sweep and rejects NaN frequencies', () => {
    expect(resampleTouchstone(data, new Float64Array(0)).length).toBe(0);
    expect(() => resampleTouchstone(data, Float64Array.from([Number.NaN]))).toThrow(/NaN/);
  });
});

describe('writeTouchstone', () => {
  const data: TouchstoneData = {
    ports: 1,
    frequenciesHz: Float64Array.from([433.92e6, 2.44e9]),
    s: Float64Array.from([0, -0.5, 0.1, 0]),
    referenceOhms: 50,
    comments: ['from the data'],
  };

  it('writes the option line, comments and one point per line', () => {
    expect(writeTouchstone(data, { format: 'MA', unit: 'MHz' })).toBe('! from the data\n# MHz S MA R 50\n433.92 0.5 -90\n2440 0.1 0\n');
    expect(writeTouchstone(data, { unit: 'Hz', comments: ['line one\nline two'] })).toBe(
      '! line one\n! line two\n# Hz S RI R 50\n433920000 0 -0.5\n2440000000 0.1 0\n',
    );
  });

  it('writes a zero magnitude in DB as -1000 dB, which reads back as 1e-50', () => {
    const zero = { ...data, s: Float64Array.from([0, 0, 0.1, 0]) };
    const text = writeTouchstone(zero, { format: 'DB' });
    expect(text.split('\n')[2]).toBe('0.43392 -1000 0');
    expect(parseTouchstone(text).s[0]).toBeCloseTo(0, 40);
  });

  it('round-trips through the parser for every format and unit (property, seeded)', () => {
    const arbData = fc
      .record({
        ports: fc.constantFrom(1, 2),
        count: fc.integer({ min: 1, max: 12 }),
        start: fc.double({ min: 0, max: 1e11, noNaN: true }).map((v) => v + 0),
        steps: fc.array(fc.double({ min: 1e-3, max: 1e9, noNaN: true }), { minLength: 12, maxLength: 12 }),
        values: fc.array(fc.double({ min: -2, max: 2, noNaN: true }).map((v) => v + 0), { minLength: 96, maxLength: 96 }),
        referenceOhms: fc.constantFrom(50, 75, 12.5, 100),
      })
      .map(({ ports, count, start, steps, values, referenceOhms }) => {
        const freqs: number[] = [];
        let f = start;
        for (let i = 0; i < count; i++) {
          freqs.push(f);
          f += steps[i];
        }
        const width = 2 * ports * ports;
        return { ports, frequenciesHz: Float64Array.from(freqs), s: Float64Array.from(values.slice(0, count * width)), referenceOhms } as TouchstoneData;
      })
      .filter((d) => d.frequenciesHz.every((f, i) => i === 0 || f > d.frequenciesHz[i - 1]));
    fc.assert(
      fc.property(arbData, fc.constantFrom('RI', 'MA', 'DB') as fc.Arbitrary<'RI' | 'MA' | 'DB'>, fc.constantFrom('Hz', 'kHz', 'MHz', 'GHz') as fc.Arbitrary<'Hz' | 'kHz' | 'MHz' | 'GHz'>, (d, format, unit) => {
        const back = parseTouchstone(writeTouchstone(d, { format, unit }), { ports: d.ports });
        expect(back.ports).toBe(d.ports);
        expect(back.referenceOhms).toBe(d.referenceOhms);
        // Frequencies are written as exact decimal shifts, so they come back bit for bit.
        expect(Array.from(back.frequenciesHz)).toEqual(Array.from(d.frequenciesHz));
        if (format === 'RI') expect(Array.from(back.s)).toEqual(Array.from(d.s));
        else {
          for (let i = 0; i < d.s.length; i++) {
            // Magnitude and angle go through trigonometry: a few ulps of the magnitude.
            const k = i - (i % 2);
            const mag = Math.hypot(d.s[k], d.s[k + 1]);
            if (Math.abs(back.s[i] - d.s[i]) > 1e-13 * (1 + mag)) throw new Error(`${format} value ${i}: ${back.s[i]} vs ${d.s[i]}`);
          }
        }
      }),
      { seed: 20261201, numRuns: 300 },
    );
  });

  it('rejects data whose array sizes do not match', () => {
    expect(() => writeTouchstone({ ...data, s: new Float64Array(3) })).toThrow(/expected 4 values/);
    expect(() => writeTouchstone({ ...data, ports: 3 })).toThrow(/ports must be 1 or 2/);
  });
});
