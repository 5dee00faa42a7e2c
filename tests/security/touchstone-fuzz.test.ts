// The Touchstone parser against hostile text (uploads and measured loads reach it straight from users):
// random bytes, token soup, huge and tiny numbers, records wrapped over many lines, keyword abuse. Only its
// own TouchstoneError may escape, its message stays short enough to show and log, and a 2 MB worst case
// finishes (timed and printed, not asserted: speed targets live in benchmarks).
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { parseTouchstone, TouchstoneError, type TouchstoneData } from '../../shared/rf/touchstone';

/** The longest error message a user should see for any input (a line number and a short reason). */
const MAX_MESSAGE = 400;

function outcome(text: string, ports?: 1 | 2): TouchstoneData | TouchstoneError {
  try {
    return parseTouchstone(text, ports === undefined ? {} : { ports });
  } catch (e) {
    if (e instanceof TouchstoneError) return e;
    throw new Error(`parseTouchstone threw ${(e as Error)?.name}: ${(e as Error)?.message} for ${JSON.stringify(text.slice(0, 200))}`, { cause: e });
  }
}

/** Returns data with finite numbers and ascending frequencies, or a TouchstoneError with a short message and a line in range. */
function checkOutcome(text: string, ports?: 1 | 2): void {
  const r = outcome(text, ports);
  if (r instanceof TouchstoneError) {
    expect(r.message.length, `message too long for ${JSON.stringify(text.slice(0, 80))}`).toBeLessThanOrEqual(MAX_MESSAGE);
    expect(r.line).toBeGreaterThanOrEqual(1);
    expect(r.line).toBeLessThanOrEqual(Math.max(1, text.split(/\r\n|\r|\n/).length));
    return;
  }
  expect([1, 2]).toContain(r.ports);
  expect(r.s.length).toBe(r.frequenciesHz.length * 2 * r.ports * r.ports);
  for (const v of r.s) expect(Number.isFinite(v)).toBe(true);
  for (let i = 1; i < r.frequenciesHz.length; i++) expect(r.frequenciesHz[i]).toBeGreaterThan(r.frequenciesHz[i - 1]);
  expect(r.referenceOhms).toBeGreaterThan(0);
}

const tokenSoup = fc.constantFrom(
  '#', '!', '[', ']', 'GHz', 'MHz', 'kHz', 'Hz', 'THz', 'S', 'Y', 'Z', 'G', 'H', 'RI', 'MA', 'DB', 'R', '50', '0', '-0',
  '1', '2.4', '1e9', '1e308', '1e309', '-1e308', '5e-324', '1e-400', '.', '..', '-', '+', 'e', 'E', '1e', '1.2.3', 'NaN',
  'Infinity', '0x10', '٣', '１', '[Version] 2.0', '[Version] 3.0', '[Version] 2.0.1', '[Number of Ports] 2',
  '[Number of Ports] 3', '[Number of Ports] 99999999999999999999', '[Two-Port Data Order] 12_21', '[Number of Frequencies] 1',
  '[Number of Frequencies] 0', '[Reference]', '[Reference] 50 75', '[Reference] -1', '[Matrix Format] Lower',
  '[Matrix Format] Upper', '[Mixed-Mode Order]', '[Network Data]', '[Noise Data]', '[Begin Information]',
  '[End Information]', '[End]', '\t', ' ', '\u00a0', '\u2028', '\r', '\n', '\r\n', '\ufeff', '\u0000',
);

describe('parseTouchstone on hostile text', () => {
  it('random bytes (decoded as UTF-8 and as Latin-1): data or a TouchstoneError', () => {
    fc.assert(
      fc.property(fc.uint8Array({ maxLength: 400 }), fc.constantFrom<1 | 2 | undefined>(undefined, 1, 2), (bytes, ports) => {
        const b = Buffer.from(bytes);
        checkOutcome(b.toString('utf8'), ports);
        checkOutcome(b.toString('latin1'), ports);
      }),
      { seed: 901, numRuns: 1500 },
    );
  });

  it('token soup joined by spaces and line breaks: data or a TouchstoneError', () => {
    fc.assert(
      fc.property(
        fc.array(fc.tuple(tokenSoup, fc.constantFrom(' ', '\n', '\t', '\r\n', '  ')), { maxLength: 60 }),
        fc.constantFrom<1 | 2 | undefined>(undefined, 1, 2),
        (parts, ports) => checkOutcome(parts.map(([a, b]) => a + b).join(''), ports),
      ),
      { seed: 902, numRuns: 3000 },
    );
  });

  it('well-formed headers over random numeric records (huge, tiny, signed, wrapped): data or a TouchstoneError', () => {
    const num = fc.oneof(
      fc.double({ noNaN: true, noDefaultInfinity: true }).map(String),
      fc.constantFrom('1e308', '1e309', '-1e309', '9'.repeat(400), '0.' + '0'.repeat(400) + '1', '1e-320', '-0', '1e+308'),
      fc.integer({ min: -1000, max: 1000 }).map(String),
    );
    const header = fc.constantFrom('# GHz S RI R 50', '# MHz Z MA R 1e-300', '# Hz Y DB R 1e308', '# kHz S DB', '[Version] 2.0\n# GHz Z RI R 50\n[Number of Ports] 2\n[Network Data]', '');
    fc.assert(
      fc.property(header, fc.array(fc.array(num, { minLength: 1, maxLength: 9 }), { maxLength: 12 }), fc.constantFrom(' ', '\n'), (h, records, sep) => {
        checkOutcome(`${h}\n${records.map((r) => r.join(sep)).join('\n')}\n`);
      }),
      { seed: 903, numRuns: 1500 },
    );
  });

});

describe('parseTouchstone on 2 MB worst cases', () => {
  const MB2 = 2 * 1024 * 1024;
  const fill = (unit: string) => unit.repeat(Math.ceil(MB2 / unit.length)).slice(0, MB2);
  const cases: [string, string, (1 | 2)?][] = [
    ['one line of 2 MB digits', `1 0 ${'9'.repeat(MB2)}\n`],
    ['one line of 2 MB of numbers', fill('1 ')],
    ['one-port records, 2 MB', `# GHz S RI R 50\n${Array.from({ length: 120_000 }, (_, i) => `${i + 1} 0.5 -0.25`).join('\n')}\n`],
    ['two-port records wrapped one number per line', `# GHz S RI R 50\n${Array.from({ length: 60_000 }, (_, i) => [i + 1, 0.1, 0, 0.9, 0, 0.9, 0, 0.1, 0].join('\n')).join('\n')}\n`, 2],
    ['2 MB of comments', fill('! a comment line\n')],
    ['2 MB of option lines', `${fill('# GHz S RI R 50\n')}1 0 0\n`],
    ['2 MB of vendor keywords', `${fill('[Vendor Thing] x\n')}1 0 0\n`],
    ['2 MB of whitespace', fill(' \t\r\n')],
    ['2 MB of blank lines then a record', `${'\n'.repeat(MB2)}1 0 0\n`],
    ['2 MB of "[" with no "]"', fill('[')],
    ['2 MB of "1e"', fill('1e ')],
    ['2 MB of non-ASCII spaces', fill('\u00a0\u3000')],
    ['2 MB inside an information block', `[Version] 2.0\n[Number of Ports] 1\n[Begin Information]\n${fill('1 2 3 4 5\n')}`],
    ['2 MB of noise data', `[Version] 2.0\n# GHz S RI R 50\n[Number of Ports] 2\n[Network Data]\n1 0 0 0 0 0 0 0 0\n[Noise Data]\n${fill('1 2 3 4 5\n')}`],
  ];
  it.each(cases)('%s: returns or throws a TouchstoneError', (name, text, ports) => {
    const t0 = performance.now();
    const r = outcome(text, ports);
    const ms = performance.now() - t0;
    process.stdout.write(`touchstone worst case "${name}" (${(text.length / 1048576).toFixed(1)} M chars): ${ms.toFixed(0)} ms, ${r instanceof TouchstoneError ? `TouchstoneError: ${r.message.slice(0, 80)}` : `${r.frequenciesHz.length} points`}\n`);
    if (r instanceof TouchstoneError) expect(r.message.length).toBeLessThanOrEqual(MAX_MESSAGE);
    else expect(r.frequenciesHz.length).toBeGreaterThan(0);
  });
});
