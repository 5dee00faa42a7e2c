/**
 * Touchstone network data (.s1p, .s2p): parse, resample onto a sweep, write.
 *
 * Reads Touchstone v1.1 and the common v2.0 keywords. The option line `# <unit> <param> <format> R <z0>`
 * takes its fields in any order and case, with defaults GHz, S, MA, R 50. Z and Y data are
 * converted to S with the reference impedance (for two ports as matrices: S = (z − I)(z + I)⁻¹,
 * S = (I − y)(I + y)⁻¹, with z = Z/R and y = Y·R). In v1 files Z and Y data are already normalised
 * to R; in v2 files they are in ohms and siemens.
 *
 * Two-port data in v1 files (and in v2 files unless `[Two-Port Data Order] 12_21`) lists the columns
 * N11 N21 N12 N22: S21 comes before S12. The result stores S row-major (S11, S12, S21, S22).
 *
 * Parsing runs in one pass over the text (linear time); a size limit is the caller's job.
 */
import { formatEngineering } from './units';

export interface TouchstoneData {
  /** 1 or 2. */
  ports: number;
  /** Strictly ascending. */
  frequenciesHz: Float64Array;
  /** Per frequency ports×ports complex values, row-major (S11, S12, S21, S22), interleaved re, im. */
  s: Float64Array;
  referenceOhms: number;
  comments?: string[];
}

/** A Touchstone text that does not parse: `line` is 1-based, `reason` says what was expected. */
export class TouchstoneError extends Error {
  readonly code = 'invalid-touchstone';
  readonly reason: string;
  constructor(
    readonly line: number,
    reason: string,
  ) {
    // A message quotes bits of the file; never echo a huge token or a huge line back to the user.
    const short = reason.replace(/\S{41,}/g, (t) => `${t.slice(0, 24)}…`);
    const clipped = short.length > 300 ? `${short.slice(0, 300)}…` : short;
    super(`line ${line}: ${clipped}`);
    this.reason = clipped;
    this.name = 'TouchstoneError';
  }
}

/** A sweep that reaches outside the measured frequency range. */
export class TouchstoneRangeError extends Error {
  readonly code = 'touchstone-range';
  constructor(
    readonly sweepStartHz: number,
    readonly sweepStopHz: number,
    readonly measuredStartHz: number,
    readonly measuredStopHz: number,
  ) {
    super(
      `sweep ${formatEngineering(sweepStartHz, 'Hz')}–${formatEngineering(sweepStopHz, 'Hz')} lies outside the measured range ` +
        `${formatEngineering(measuredStartHz, 'Hz')}–${formatEngineering(measuredStopHz, 'Hz')}`,
    );
    this.name = 'TouchstoneRangeError';
  }
}

type Format = 'RI' | 'MA' | 'DB';
type Parameter = 'S' | 'Y' | 'Z';
type FreqUnit = 'Hz' | 'kHz' | 'MHz' | 'GHz';

const UNIT_EXPONENT: Record<FreqUnit, number> = { Hz: 0, kHz: 3, MHz: 6, GHz: 9 };
const UNIT_BY_UPPER: Record<string, FreqUnit> = { HZ: 'Hz', KHZ: 'kHz', MHZ: 'MHz', GHZ: 'GHz' };

interface Options {
  exponent: number;
  parameter: Parameter;
  format: Format;
  referenceOhms: number;
}

/** A decimal number, written so that no backtracking is possible (linear on any input). */
const NUMBER_TOKEN = /^[+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?$/;

function parseNumber(token: string, line: number): number {
  if (!NUMBER_TOKEN.test(token)) {
    const shown = token.length > 24 ? `${token.slice(0, 24)}…` : token;
    throw new TouchstoneError(line, `expected a number, found "${shown}"`);
  }
  const v = Number(token);
  if (!Number.isFinite(v)) throw new TouchstoneError(line, `number out of range: "${token.slice(0, 24)}"`);
  return v;
}

/** `token × 10^exponent`, correctly rounded (so "2.44" GHz is exactly the double nearest 2.44e9). */
function parseScaled(token: string, exponent: number, line: number): number {
  const v = parseNumber(token, line);
  if (exponent === 0) return v;
  const e = token.search(/[eE]/);
  const scaled = e < 0 ? Number(`${token}e${exponent}`) : Number(`${token.slice(0, e)}e${Number(token.slice(e + 1)) + exponent}`);
  if (!Number.isFinite(scaled)) throw new TouchstoneError(line, `frequency out of range: "${token.slice(0, 24)}"`);
  return scaled;
}

function parseOptionLine(body: string, line: number): Options {
  const opts: Options = { exponent: 9, parameter: 'S', format: 'MA', referenceOhms: 50 };
  const tokens = body.split(/\s+/).filter(Boolean);
  for (let i = 0; i < tokens.length; i++) {
    const tok = tokens[i];
    const up = tok.toUpperCase();
    if (up in UNIT_BY_UPPER) opts.exponent = UNIT_EXPONENT[UNIT_BY_UPPER[up]];
    else if (up === 'S' || up === 'Y' || up === 'Z') opts.parameter = up;
    else if (up === 'G' || up === 'H') throw new TouchstoneError(line, `parameter "${tok}" is not supported (expected S, Y or Z)`);
    else if (up === 'RI' || up === 'MA' || up === 'DB') opts.format = up;
    else if (up === 'R') {
      const next = tokens[i + 1];
      if (next === undefined) throw new TouchstoneError(line, 'expected a reference resistance after "R"');
      const r = parseNumber(next, line);
      if (!(r > 0)) throw new TouchstoneError(line, `reference resistance must be positive, found ${next}`);
      opts.referenceOhms = r;
      i++;
    } else if (/HZ$/.test(up)) throw new TouchstoneError(line, `unknown frequency unit "${tok}" (expected Hz, kHz, MHz or GHz)`);
    else if (/^[A-Z]{2}$/.test(up)) throw new TouchstoneError(line, `unknown format "${tok}" (expected RI, MA or DB)`);
    else if (/^[A-Z]$/.test(up)) throw new TouchstoneError(line, `unknown parameter "${tok}" (expected S, Y or Z)`);
    else throw new TouchstoneError(line, `unknown option "${tok}" (expected a unit, S/Y/Z, RI/MA/DB or R <ohms>)`);
  }
  return opts;
}

/** 2×2 complex matrix inverse of m = [a, b; c, d] (interleaved, row-major); null when singular. */
function invert2(m: readonly number[]): number[] | null {
  const [ar, ai, br, bi, cr, ci, dr, di] = m;
  const detR = ar * dr - ai * di - (br * cr - bi * ci);
  const detI = ar * di + ai * dr - (br * ci + bi * cr);
  const den = detR * detR + detI * detI;
  if (!(den > 1e-300)) return null;
  const ir = detR / den;
  const ii = -detI / den;
  const mul = (xr: number, xi: number): [number, number] => [xr * ir - xi * ii, xr * ii + xi * ir];
  return [...mul(dr, di), ...mul(-br, -bi), ...mul(-cr, -ci), ...mul(ar, ai)];
}

function mul2(a: readonly number[], b: readonly number[]): number[] {
  const out = new Array<number>(8);
  for (let r = 0; r < 2; r++) {
    for (let c = 0; c < 2; c++) {
      let re = 0;
      let im = 0;
      for (let k = 0; k < 2; k++) {
        const xr = a[(r * 2 + k) * 2];
        const xi = a[(r * 2 + k) * 2 + 1];
        const yr = b[(k * 2 + c) * 2];
        const yi = b[(k * 2 + c) * 2 + 1];
        re += xr * yr - xi * yi;
        im += xr * yi + xi * yr;
      }
      out[(r * 2 + c) * 2] = re;
      out[(r * 2 + c) * 2 + 1] = im;
    }
  }
  return out;
}

/**
 * Converts one frequency's normalised Z or Y matrix (row-major, interleaved) to S in place.
 * Z: S = (z − I)(z + I)⁻¹. Y: S = (I − y)(I + y)⁻¹. Returns false when z + I (or I + y) is singular.
 */
function toScattering(m: number[], ports: number, parameter: 'Z' | 'Y'): boolean {
  // Numerator N = z − I (Z) or I − y (Y); denominator D = z + I or I + y.
  const isZ = parameter === 'Z';
  if (ports === 1) {
    const [r, i] = m;
    const nr = isZ ? r - 1 : 1 - r;
    const ni = isZ ? i : -i;
    const dr = r + 1;
    const di = i;
    const den = dr * dr + di * di;
    if (!(den > 1e-300)) return false;
    m[0] = (nr * dr + ni * di) / den;
    m[1] = (ni * dr - nr * di) / den;
    return true;
  }
  const diagonal = (k: number) => (k === 0 || k === 6 ? 1 : 0);
  const numerator = m.map((v, k) => (isZ ? v - diagonal(k) : diagonal(k) - v));
  const denominator = m.map((v, k) => v + diagonal(k));
  const inv = invert2(denominator);
  if (!inv) return false;
  // N and D⁻¹ are functions of the same matrix and commute, so the product order does not matter.
  const s = mul2(numerator, inv);
  for (let k = 0; k < 8; k++) m[k] = s[k];
  return true;
}

/** Characters that separate numbers (as `\s` in a regular expression). */
const WHITESPACE = /\s+/;

/** How many whitespace-separated tokens a trimmed line holds, without allocating them. */
function countTokens(body: string): number {
  let count = 0;
  let inToken = false;
  for (let i = 0; i < body.length; i++) {
    const c = body.charCodeAt(i);
    const space = c === 32 || (c >= 9 && c <= 13) || (c > 127 && /\s/.test(body[i]));
    if (space) inToken = false;
    else if (!inToken) {
      inToken = true;
      count++;
    }
  }
  return count;
}

/** A Float64Array that grows by doubling. */
class GrowableArray {
  private buf = new Float64Array(1024);
  length = 0;
  push(v: number): void {
    if (this.length === this.buf.length) {
      const next = new Float64Array(this.buf.length * 2);
      next.set(this.buf);
      this.buf = next;
    }
    this.buf[this.length++] = v;
  }
  last(): number {
    return this.buf[this.length - 1];
  }
  toArray(): Float64Array {
    return this.buf.slice(0, this.length);
  }
}

/** Column position (in complex values) of each row-major entry, for the file's two-port order. */
const ORDER_21_12 = [0, 2, 1, 3]; // file: N11 N21 N12 N22 -> row-major S11 S12 S21 S22
const ORDER_12_21 = [0, 1, 2, 3];

interface State {
  opts: Options | null;
  ports: number | null;
  version2: boolean;
  order: number[];
  matrix: 'full' | 'lower' | 'upper';
  declaredFrequencies: number | null;
  declaredFrequenciesLine: number;
  section: 'preamble' | 'network' | 'noise' | 'information' | 'end';
  referenceFromKeyword: number | null;
  pendingReference: { needed: number; values: number[]; line: number } | null;
  noiseStarted: boolean;
}

const KNOWN_KEYWORDS = new Set([
  'version',
  'number of ports',
  'two-port data order',
  'number of frequencies',
  'number of noise frequencies',
  'reference',
  'matrix format',
  'mixed-mode order',
  'network data',
  'noise data',
  'begin information',
  'end information',
  'end',
]);

function valuesPerRecord(ports: number, matrix: State['matrix']): number {
  const complexCount = matrix === 'full' || ports === 1 ? ports * ports : (ports * (ports + 1)) / 2;
  return 1 + 2 * complexCount;
}

function recordDescription(ports: number, matrix: State['matrix']): string {
  const n = valuesPerRecord(ports, matrix);
  const c = (n - 1) / 2;
  return `expected ${n} numbers (frequency and ${c} complex value${c === 1 ? '' : 's'})`;
}

/**
 * Parses Touchstone text. The port count comes from `opts.ports` (e.g. from the file name), else
 * from `[Number of Ports]`, else from the first data line (3 numbers: one port, 9: two ports).
 * Throws `TouchstoneError` naming the line and what was expected.
 */
export function parseTouchstone(text: string, opts: { ports?: number } = {}): TouchstoneData {
  if (opts.ports !== undefined && opts.ports !== 1 && opts.ports !== 2) {
    throw new RangeError(`parseTouchstone: ports must be 1 or 2, got ${String(opts.ports)}`);
  }
  if (typeof text !== 'string') throw new TouchstoneError(1, 'expected the text of a Touchstone file');
  if (text.trim() === '') throw new TouchstoneError(1, 'the file is empty');

  const st: State = {
    opts: null,
    ports: opts.ports ?? null,
    version2: false,
    order: ORDER_21_12,
    matrix: 'full',
    declaredFrequencies: null,
    declaredFrequenciesLine: 0,
    section: 'preamble',
    referenceFromKeyword: null,
    pendingReference: null,
    noiseStarted: false,
  };
  const comments: string[] = [];
  const freqs = new GrowableArray();
  const values = new GrowableArray();
  const scratchNums = new Float64Array(8);
  const m = new Array<number>(8).fill(0);

  // The record being gathered (a frequency and its values, possibly wrapped over several lines).
  const record: string[] = [];
  let recordLine = 0;
  let recordLastLine = 0;
  let lastLine = 0;

  const finishRecord = () => {
    const o = st.opts ?? { exponent: 9, parameter: 'S' as const, format: 'MA' as const, referenceOhms: 50 };
    st.opts = o;
    const ports = st.ports!;
    const f = parseScaled(record[0], o.exponent, recordLine);
    if (f < 0) throw new TouchstoneError(recordLine, `frequencies must not be negative, found ${record[0]}`);
    if (freqs.length && !(f > freqs.last())) throw new TouchstoneError(recordLine, 'frequencies must increase');
    // Complex values in file order, as re, im pairs.
    const pairs = (record.length - 1) / 2;
    for (let k = 0; k < pairs; k++) {
      const a = parseNumber(record[1 + 2 * k], recordLine);
      const b = parseNumber(record[2 + 2 * k], recordLine);
      if (o.format === 'RI') {
        scratchNums[2 * k] = a;
        scratchNums[2 * k + 1] = b;
      } else {
        const mag = o.format === 'MA' ? a : 10 ** (a / 20);
        const rad = (b * Math.PI) / 180;
        scratchNums[2 * k] = mag * Math.cos(rad);
        scratchNums[2 * k + 1] = mag * Math.sin(rad);
      }
    }
    const n = 2 * ports * ports;
    if (ports === 1) {
      m[0] = scratchNums[0];
      m[1] = scratchNums[1];
    } else if (st.matrix === 'full') {
      for (let rm = 0; rm < 4; rm++) {
        const c = st.order[rm];
        m[rm * 2] = scratchNums[2 * c];
        m[rm * 2 + 1] = scratchNums[2 * c + 1];
      }
    } else {
      // Lower: N11 N21 N22; upper: N11 N12 N22. The matrix is reciprocal (N12 = N21).
      m[0] = scratchNums[0];
      m[1] = scratchNums[1];
      m[2] = m[4] = scratchNums[2];
      m[3] = m[5] = scratchNums[3];
      m[6] = scratchNums[4];
      m[7] = scratchNums[5];
    }
    if (o.parameter !== 'S') {
      const r = o.referenceOhms;
      // v2 data are in ohms / siemens; v1 data are already normalised to R.
      if (st.version2) for (let k = 0; k < n; k++) m[k] = o.parameter === 'Z' ? m[k] / r : m[k] * r;
      if (!toScattering(m, ports, o.parameter)) {
        throw new TouchstoneError(recordLine, `${o.parameter}-parameters at ${record[0]} cannot be converted to S (singular matrix)`);
      }
    }
    for (let k = 0; k < n; k++) {
      if (!Number.isFinite(m[k])) throw new TouchstoneError(recordLine, 'value out of range');
    }
    freqs.push(f);
    for (let k = 0; k < n; k++) values.push(m[k]);
    record.length = 0;
  };

  const recordSpan = () => (recordLastLine > recordLine ? ` (lines ${recordLine}–${recordLastLine})` : '');

  const lines = (text.charCodeAt(0) === 0xfeff ? text.slice(1) : text).split(/\r\n|\r|\n/);
  for (let li = 0; li < lines.length; li++) {
    const lineNo = li + 1;
    let raw = lines[li];
    if (raw.trim() !== '') lastLine = lineNo;
    const bang = raw.indexOf('!');
    if (bang >= 0) {
      const c = raw.slice(bang + 1).trim();
      if (c) comments.push(c);
      raw = raw.slice(0, bang);
    }
    const body = raw.trim();
    if (body === '') continue;
    if (st.section === 'end') continue;

    if (body[0] === '[') {
      if (record.length) throw new TouchstoneError(recordLine, `${recordDescription(st.ports!, st.matrix)}, found ${record.length}${recordSpan()}`);
      const close = body.indexOf(']');
      if (close < 0) throw new TouchstoneError(lineNo, 'expected "]" to close the keyword');
      const key = body.slice(1, close).trim().toLowerCase().replace(/\s+/g, ' ');
      const arg = body.slice(close + 1).trim();
      handleKeyword(st, key, arg, lineNo, freqs.length);
      continue;
    }
    if (st.section === 'information') continue;

    if (body[0] === '#') {
      // Only the first option line counts (Touchstone v1.1); later ones are ignored.
      if (st.opts === null && freqs.length === 0) st.opts = parseOptionLine(body.slice(1), lineNo);
      continue;
    }

    // Count first, so that a huge line with far too many numbers fails without being split.
    const count = countTokens(body);
    if (st.ports !== null && st.section !== 'noise' && !st.noiseStarted && !st.pendingReference) {
      const need = valuesPerRecord(st.ports, st.matrix);
      if (record.length === 0 && count > need) throw new TouchstoneError(lineNo, `${recordDescription(st.ports, st.matrix)}, found ${count}`);
    } else if (st.ports === null && count !== 3 && count !== 9 && !st.pendingReference && st.section !== 'noise') {
      throw new TouchstoneError(
        lineNo,
        `expected 3 numbers (one-port: frequency and 1 complex value) or 9 (two-port: frequency and 4 complex values), found ${count}; only one- and two-port data are supported`,
      );
    }
    const tokens = body.split(WHITESPACE);
    if (st.pendingReference) {
      const pr = st.pendingReference;
      for (const t of tokens) pr.values.push(parseNumber(t, lineNo));
      if (pr.values.length >= pr.needed) finishReference(st, lineNo);
      continue;
    }
    if (st.section === 'noise' || st.noiseStarted) {
      for (const t of tokens) parseNumber(t, lineNo);
      continue;
    }

    if (record.length === 0) {
      // A new record starts here.
      if (st.ports === null) {
        if (tokens.length === 3) st.ports = 1;
        else if (tokens.length === 9) st.ports = 2;
        else
          throw new TouchstoneError(
            lineNo,
            `expected 3 numbers (one-port: frequency and 1 complex value) or 9 (two-port: frequency and 4 complex values), found ${tokens.length}; only one- and two-port data are supported`,
          );
      }
      // In a v1 two-port file, noise parameters follow the network data and start at a frequency
      // no higher than the last one; each noise line holds 5 numbers.
      if (!st.version2 && st.ports === 2 && freqs.length > 0 && tokens.length === 5) {
        const f = parseScaled(tokens[0], (st.opts ?? { exponent: 9 }).exponent, lineNo);
        if (f <= freqs.last()) {
          st.noiseStarted = true;
          for (const t of tokens) parseNumber(t, lineNo);
          continue;
        }
      }
      recordLine = lineNo;
    }
    const ports = st.ports!;
    const need = valuesPerRecord(ports, st.matrix);
    if (record.length + tokens.length > need) {
      if (record.length === 0) throw new TouchstoneError(recordLine, `${recordDescription(ports, st.matrix)}, found ${tokens.length}`);
      const span = recordLastLine > recordLine ? ` (lines ${recordLine}–${recordLastLine})` : '';
      throw new TouchstoneError(recordLine, `${recordDescription(ports, st.matrix)}, found ${record.length}${span}`);
    }
    recordLastLine = lineNo;
    for (const t of tokens) record.push(t);
    if (record.length === need) finishRecord();
  }

  if (st.pendingReference) throw new TouchstoneError(st.pendingReference.line, `[Reference] expected ${st.pendingReference.needed} values, found ${st.pendingReference.values.length}`);
  if (record.length) throw new TouchstoneError(recordLine, `${recordDescription(st.ports!, st.matrix)}, found ${record.length}${recordSpan()} before the end of the file`);
  if (freqs.length === 0) throw new TouchstoneError(lastLine, 'no network data found (expected lines of a frequency followed by its complex values)');
  if (st.declaredFrequencies !== null && st.declaredFrequencies !== freqs.length) {
    throw new TouchstoneError(st.declaredFrequenciesLine, `[Number of Frequencies] is ${st.declaredFrequencies} but the file holds ${freqs.length}`);
  }
  const opt = st.opts!;
  const data: TouchstoneData = {
    ports: st.ports!,
    frequenciesHz: freqs.toArray(),
    s: values.toArray(),
    referenceOhms: st.referenceFromKeyword ?? opt.referenceOhms,
  };
  if (comments.length) data.comments = comments;
  return data;
}

function finishReference(st: State, lineNo: number): void {
  const pr = st.pendingReference!;
  st.pendingReference = null;
  if (pr.values.length > pr.needed) throw new TouchstoneError(lineNo, `[Reference] expected ${pr.needed} values, found ${pr.values.length}`);
  for (const v of pr.values) if (!(v > 0)) throw new TouchstoneError(pr.line, `reference impedance must be positive, found ${v}`);
  if (pr.values.some((v) => v !== pr.values[0])) {
    throw new TouchstoneError(pr.line, `ports with different reference impedances (${pr.values.join(', ')} Ω) are not supported`);
  }
  st.referenceFromKeyword = pr.values[0];
}

function handleKeyword(st: State, key: string, arg: string, lineNo: number, recordsSoFar: number): void {
  if (!KNOWN_KEYWORDS.has(key)) return; // vendor keywords carry nothing we use
  if (st.section === 'information' && key !== 'end information') return;
  switch (key) {
    case 'version': {
      if (!/^2(\.\d+)?$/.test(arg) && !/^1(\.\d+)?$/.test(arg)) throw new TouchstoneError(lineNo, `unsupported [Version] "${arg}" (expected 1.x or 2.x)`);
      st.version2 = arg.startsWith('2');
      return;
    }
    case 'number of ports': {
      if (!/^\d+$/.test(arg)) throw new TouchstoneError(lineNo, `[Number of Ports] expects a whole number, found "${arg}"`);
      const n = Number(arg);
      if (n !== 1 && n !== 2) throw new TouchstoneError(lineNo, `only one- and two-port data are supported, found ${n} ports`);
      if (st.ports !== null && st.ports !== n) throw new TouchstoneError(lineNo, `[Number of Ports] is ${n} but ${st.ports} port${st.ports === 1 ? ' was' : 's were'} expected`);
      st.ports = n;
      return;
    }
    case 'two-port data order': {
      if (arg === '12_21') st.order = ORDER_12_21;
      else if (arg === '21_12') st.order = ORDER_21_12;
      else throw new TouchstoneError(lineNo, `[Two-Port Data Order] expects 12_21 or 21_12, found "${arg}"`);
      return;
    }
    case 'number of frequencies': {
      if (!/^\d+$/.test(arg) || Number(arg) < 1) throw new TouchstoneError(lineNo, `[Number of Frequencies] expects a positive whole number, found "${arg}"`);
      st.declaredFrequencies = Number(arg);
      st.declaredFrequenciesLine = lineNo;
      return;
    }
    case 'number of noise frequencies':
      return;
    case 'reference': {
      const needed = st.ports ?? 1;
      st.pendingReference = { needed, values: [], line: lineNo };
      if (arg) {
        for (const t of arg.split(/\s+/)) st.pendingReference.values.push(parseNumber(t, lineNo));
        if (st.pendingReference.values.length >= needed) finishReference(st, lineNo);
      }
      return;
    }
    case 'matrix format': {
      const f = arg.toLowerCase();
      if (f !== 'full' && f !== 'lower' && f !== 'upper') throw new TouchstoneError(lineNo, `[Matrix Format] expects Full, Lower or Upper, found "${arg}"`);
      st.matrix = f;
      return;
    }
    case 'mixed-mode order':
      throw new TouchstoneError(lineNo, 'mixed-mode data are not supported');
    case 'network data':
      st.section = 'network';
      return;
    case 'noise data':
      if (recordsSoFar === 0) throw new TouchstoneError(lineNo, 'no network data before [Noise Data]');
      st.section = 'noise';
      return;
    case 'begin information':
      st.section = 'information';
      return;
    case 'end information':
      st.section = 'preamble';
      return;
    case 'end':
      st.section = 'end';
      return;
  }
}

/**
 * Interpolates the network data onto `freqs` (any order), linearly in the real and imaginary parts.
 * Returns per frequency ports×ports complex values (row-major, interleaved re, im). Throws
 * `TouchstoneRangeError` when any frequency lies outside the measured range (a relative slack of
 * 1e-9 at the ends absorbs rounding in computed sweeps).
 */
export function resampleTouchstone(data: TouchstoneData, freqs: Float64Array): Float64Array {
  const fs = data.frequenciesHz;
  const n = fs.length;
  const width = 2 * data.ports * data.ports;
  if (n === 0) throw new RangeError('resampleTouchstone: the data hold no frequencies');
  if (data.s.length !== n * width) throw new RangeError(`resampleTouchstone: expected ${n * width} values in s, found ${data.s.length}`);
  const out = new Float64Array(freqs.length * width);
  if (freqs.length === 0) return out;

  let lo = Infinity;
  let hi = -Infinity;
  for (let i = 0; i < freqs.length; i++) {
    const f = freqs[i];
    if (Number.isNaN(f)) throw new RangeError('resampleTouchstone: a sweep frequency is NaN');
    if (f < lo) lo = f;
    if (f > hi) hi = f;
  }
  const first = fs[0];
  const last = fs[n - 1];
  const slack = 1e-9 * Math.max(Math.abs(first), Math.abs(last));
  if (lo < first - slack || hi > last + slack) throw new TouchstoneRangeError(lo, hi, first, last);

  const s = data.s;
  let k = 0; // interval index, kept between calls so sorted sweeps cost O(n + m)
  for (let i = 0; i < freqs.length; i++) {
    const f = Math.min(last, Math.max(first, freqs[i]));
    if (n === 1) {
      out.set(s.subarray(0, width), i * width);
      continue;
    }
    if (f < fs[k] || f > fs[k + 1]) {
      // Binary search for fs[k] <= f <= fs[k + 1].
      let a = 0;
      let b = n - 1;
      while (b - a > 1) {
        const mid = (a + b) >> 1;
        if (fs[mid] <= f) a = mid;
        else b = mid;
      }
      k = a;
    }
    const t = (f - fs[k]) / (fs[k + 1] - fs[k]);
    const base0 = k * width;
    const base1 = base0 + width;
    // (1 − t)·a + t·b is exact at both ends, so measured points come back unchanged.
    for (let j = 0; j < width; j++) out[i * width + j] = (1 - t) * s[base0 + j] + t * s[base1 + j];
  }
  return out;
}

/** Shortest decimal text of `x × 10^-shift`, exact in decimal (so the parser gets `x` back). */
function shiftDecimal(x: number, shift: number): string {
  if (shift === 0 || x === 0) return String(x);
  const [mant, expPart] = x.toExponential().split('e');
  const exp = Number(expPart) - shift;
  const negative = mant.startsWith('-');
  const digits = mant.replace('-', '').replace('.', '');
  // value = 0.d1d2d3… × 10^(exp + 1)
  const point = exp + 1;
  let body: string;
  if (point <= 0) body = `0.${'0'.repeat(-point)}${digits}`;
  else if (point >= digits.length) body = digits + '0'.repeat(point - digits.length);
  else body = `${digits.slice(0, point)}.${digits.slice(point)}`;
  if (body.length > 24) body = `${mant.replace('-', '')}e${exp}`;
  return negative ? `-${body}` : body;
}

function formatPair(re: number, im: number, format: Format): string {
  if (format === 'RI') return `${String(re)} ${String(im)}`;
  const mag = Math.hypot(re, im);
  const ang = (Math.atan2(im, re) * 180) / Math.PI;
  // A zero magnitude has no decibel value: -1000 dB (a magnitude of 1e-50) stands for it.
  if (format === 'DB') return `${String(mag > 0 ? 20 * Math.log10(mag) : -1000)} ${String(ang)}`;
  return `${String(mag)} ${String(ang)}`;
}

/**
 * Writes Touchstone v1.1 text (`# <unit> S <format> R <z0>`, two-port columns N11 N21 N12 N22).
 * Comments come from `opts.comments`, else from `data.comments`. RI output parses back to the
 * same numbers exactly; MA and DB go through trigonometry and round by a few ulps.
 */
export function writeTouchstone(
  data: TouchstoneData,
  opts: { format?: 'RI' | 'MA' | 'DB'; unit?: 'Hz' | 'kHz' | 'MHz' | 'GHz'; comments?: string[] } = {},
): string {
  const format = opts.format ?? 'RI';
  const unit = opts.unit ?? 'GHz';
  const { ports, frequenciesHz: fs, s } = data;
  if (ports !== 1 && ports !== 2) throw new RangeError(`writeTouchstone: ports must be 1 or 2, got ${ports}`);
  const width = 2 * ports * ports;
  if (s.length !== fs.length * width) throw new RangeError(`writeTouchstone: expected ${fs.length * width} values in s, found ${s.length}`);
  const out: string[] = [];
  for (const c of opts.comments ?? data.comments ?? []) {
    for (const line of c.split(/\r\n|\r|\n/)) out.push(`! ${line}`);
  }
  out.push(`# ${unit} S ${format} R ${String(data.referenceOhms)}`);
  const order = ports === 1 ? [0] : ORDER_21_12;
  for (let i = 0; i < fs.length; i++) {
    const parts = [shiftDecimal(fs[i], UNIT_EXPONENT[unit])];
    for (const rm of order) {
      // ORDER_21_12 maps row-major -> file column; it is its own inverse.
      const base = i * width + rm * 2;
      parts.push(formatPair(s[base], s[base + 1], format));
    }
    out.push(parts.join(' '));
  }
  return `${out.join('\n')}\n`;
}
