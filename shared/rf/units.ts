/**
 * Engineering values for the user interface: "3.3 nH", "2.45 GHz", "4k7", "2R2".
 *
 * Data is always SI base units (CONTRACT §1); prefixes are a matter of display and entry only, so
 * nothing here runs in a hot loop. "m" is milli and "M" (or "meg") is mega, as in SPICE and on
 * part labels; "u", "µ" and "μ" are micro. Resistor-style codes put the prefix where the decimal
 * point goes ("4k7" = 4.7 k, "2R2" = 2.2, "R47" = 0.47, "4n7" = 4.7 n).
 */
import { parse as mathParse, type MathNode } from 'mathjs';

export type Unit = 'H' | 'F' | 'Ω' | 'Hz' | 'm' | 'W' | 'V' | 'A' | 'dB' | 'S' | '';

/** Text that is not an engineering value, or a value in the wrong unit. */
export class UnitError extends Error {
  readonly code = 'invalid-value';
  constructor(
    readonly text: string,
    readonly reason: string,
  ) {
    super(reason);
    this.name = 'UnitError';
  }
}

const UNIT_NAMES: Record<Exclude<Unit, ''>, string> = {
  H: 'henries',
  F: 'farads',
  Ω: 'ohms',
  Hz: 'hertz',
  m: 'metres',
  W: 'watts',
  V: 'volts',
  A: 'amperes',
  dB: 'decibels',
  S: 'siemens',
};

/** Accepted spellings of each unit symbol, compared exactly unless listed in lower case in `UNIT_SPELLINGS_CI`. */
const UNIT_SPELLINGS: Record<Exclude<Unit, ''>, readonly string[]> = {
  H: ['H'],
  F: ['F'],
  Ω: ['Ω', '\u2126'],
  Hz: ['Hz', 'HZ', 'hz'],
  m: ['m'],
  W: ['W'],
  V: ['V'],
  A: ['A'],
  dB: ['dB', 'db', 'DB'],
  S: ['S'],
};
/** Spellings matched without regard to case ("ohm", "Ohms", "OHM"). */
const UNIT_SPELLINGS_CI: Partial<Record<Exclude<Unit, ''>, readonly string[]>> = { Ω: ['ohms', 'ohm'] };

const PREFIXES: Record<string, number> = {
  f: -15,
  p: -12,
  n: -9,
  u: -6,
  µ: -6,
  μ: -6,
  m: -3,
  k: 3,
  K: 3,
  M: 6,
  meg: 6,
  Meg: 6,
  MEG: 6,
  G: 9,
  T: 12,
};

/** Units that never take a prefix. */
const NO_PREFIX: ReadonlySet<Unit> = new Set<Unit>(['dB']);

const NUMBER = /^[+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?/;
const RKM = /^([+-]?)(\d*)(meg|MEG|Meg|[fpnuµμmkKMGTRr])(\d+)$/;

function scale(mantissa: string, exponent: number): number {
  // Decimal scaling through the parser keeps "2.45" + G exactly the double nearest 2.45e9.
  const m = /^([^eE]*)(?:[eE]([+-]?\d+))?$/.exec(mantissa);
  if (!m) return Number.NaN;
  const exp = Number(m[2] ?? 0) + exponent;
  return Number(`${m[1]}e${exp}`);
}

/** Finds the unit spelled at the end of `suffix`, returning it and what stands before it. */
function splitUnit(suffix: string): { unit: Exclude<Unit, ''>; rest: string } | null {
  let best: { unit: Exclude<Unit, ''>; rest: string; len: number } | null = null;
  for (const unit of Object.keys(UNIT_SPELLINGS) as Exclude<Unit, ''>[]) {
    for (const sp of UNIT_SPELLINGS[unit]) {
      if (suffix.endsWith(sp) && (!best || sp.length > best.len)) best = { unit, rest: suffix.slice(0, -sp.length), len: sp.length };
    }
    for (const sp of UNIT_SPELLINGS_CI[unit] ?? []) {
      if (suffix.toLowerCase().endsWith(sp) && (!best || sp.length > best.len))
        best = { unit, rest: suffix.slice(0, -sp.length), len: sp.length };
    }
  }
  return best ? { unit: best.unit, rest: best.rest } : null;
}

function describe(unit: Unit): string {
  return unit === '' ? 'a plain number' : `${UNIT_NAMES[unit]} (${unit})`;
}

function checkUnit(text: string, found: Exclude<Unit, ''> | null, expected: Unit | undefined): void {
  if (found === null || expected === undefined) return;
  if (expected === '' || found !== expected) {
    throw new UnitError(text, `"${text}" is in ${UNIT_NAMES[found]}, expected ${describe(expected)}`);
  }
}

function prefixExponent(text: string, prefix: string, unit: Unit | undefined): number {
  if (prefix === '') return 0;
  const exp = PREFIXES[prefix];
  if (exp === undefined) {
    throw new UnitError(text, `"${text}": unknown prefix or unit "${prefix}"${unit ? `; expected ${describe(unit)}` : ''}`);
  }
  if (unit !== undefined && NO_PREFIX.has(unit)) throw new UnitError(text, `"${text}": ${UNIT_NAMES.dB} take no prefix`);
  return exp;
}

/**
 * Parses an engineering value into SI base units. `unit` is the unit the field expects: a unit
 * written in the text must match it (the text may also leave it out). Without `unit`, any unit
 * is accepted and dropped.
 */
export function parseEngineering(text: string, unit?: Unit): number {
  if (typeof text !== 'string') throw new UnitError(String(text), 'expected a value as text');
  const src = text.trim();
  if (src === '') throw new UnitError(text, `enter a value${unit ? ` in ${describe(unit)}` : ''}`);
  if (src.length > 200) throw new UnitError(text.slice(0, 40), 'the value is too long');

  // Resistor-style code, optionally followed by a unit: "4k7", "2R2", "R47", "4n7H", "4k7 Ω".
  const compact = src.replace(/\s+/g, '');
  const split = splitUnit(compact);
  for (const candidate of split ? [compact, split.rest] : [compact]) {
    const rkm = RKM.exec(candidate);
    if (!rkm || (rkm[2] === '' && rkm[3] !== 'R' && rkm[3] !== 'r')) continue;
    const foundUnit = candidate === compact ? null : split!.unit;
    const letter = rkm[3];
    const isR = letter === 'R' || letter === 'r';
    if (isR && ((foundUnit !== null && foundUnit !== 'Ω') || (unit !== undefined && unit !== 'Ω'))) {
      throw new UnitError(text, `"${text}": "R" marks the decimal point of a resistance, expected ${describe(unit ?? 'Ω')}`);
    }
    checkUnit(text, foundUnit, unit);
    const exp = isR ? 0 : prefixExponent(text, letter, unit);
    const value = scale(`${rkm[1]}${rkm[2] || '0'}.${rkm[4]}`, exp);
    return finiteOrThrow(text, value);
  }

  const num = NUMBER.exec(src);
  if (!num) throw new UnitError(text, `"${text}" is not a number${unit ? ` in ${describe(unit)}` : ''}`);
  const suffix = src.slice(num[0].length).trim();
  let exp = 0;
  if (suffix !== '') {
    if (/\s/.test(suffix)) throw new UnitError(text, `"${text}": unexpected text "${suffix}"`);
    const asPrefix = PREFIXES[suffix];
    // A lone "m" in a metre field is the unit; elsewhere a lone prefix is a prefix ("3.3n", "1.2k").
    if (asPrefix !== undefined && !(unit === 'm' && suffix === 'm')) {
      exp = prefixExponent(text, suffix, unit);
    } else if (suffix === 'R' || suffix === 'r') {
      checkUnit(text, 'Ω', unit);
    } else {
      const found = splitUnit(suffix);
      if (!found) throw new UnitError(text, `"${text}": unknown unit "${suffix}"${unit !== undefined ? `; expected ${describe(unit)}` : ''}`);
      checkUnit(text, found.unit, unit);
      exp = prefixExponent(text, found.rest, found.unit);
    }
  }
  return finiteOrThrow(text, scale(num[0], exp));
}

function finiteOrThrow(text: string, value: number): number {
  if (!Number.isFinite(value)) throw new UnitError(text, `"${text}" is out of range`);
  return value;
}

const FORMAT_PREFIXES: readonly [number, string][] = [
  [-15, 'f'],
  [-12, 'p'],
  [-9, 'n'],
  [-6, 'µ'],
  [-3, 'm'],
  [0, ''],
  [3, 'k'],
  [6, 'M'],
  [9, 'G'],
  [12, 'T'],
];

/** `x.toPrecision(digits)` without trailing zeros or exponent (for |x| in [1, 1000)). */
function trimmed(x: number, digits: number): string {
  let s = x.toPrecision(digits);
  if (s.includes('e')) return String(Number(s));
  if (s.includes('.')) s = s.replace(/0+$/, '').replace(/\.$/, '');
  return s;
}

/**
 * Formats SI base units with a prefix and `digits` significant figures (default 3, trailing
 * zeros dropped): 3.3e-9 H -> "3.3 nH", 2.44e9 Hz -> "2.44 GHz". Non-finite values give "—".
 */
export function formatEngineering(value: number, unit: Unit = '', opts: { digits?: number } = {}): string {
  const digits = Math.min(15, Math.max(1, Math.round(opts.digits ?? 3)));
  const join = (num: string, prefix: string) => (unit === '' ? `${num}${prefix ? ` ${prefix}` : ''}` : `${num} ${prefix}${unit}`);
  if (typeof value !== 'number' || !Number.isFinite(value)) return '—';
  if (value === 0) return join('0', '');
  if (NO_PREFIX.has(unit)) return join(trimmed(value, digits), '');

  const abs = Math.abs(value);
  let exp3 = Math.floor(Math.log10(abs) / 3) * 3;
  // Rounding can carry into the next prefix (999.95 -> "1000" -> "1 k"), and log10 can be a hair off.
  for (let pass = 0; pass < 3; pass++) {
    const mant = Number((abs / 10 ** exp3).toPrecision(digits));
    if (mant >= 1000) exp3 += 3;
    else if (mant < 1) exp3 -= 3;
    else break;
  }
  const entry = FORMAT_PREFIXES.find(([e]) => e === exp3);
  if (!entry) {
    // Beyond the prefixes: plain exponent notation, still with the unit.
    const [m, e] = value.toExponential(digits - 1).split('e');
    return join(`${trimmed(Number(m), digits)}e${Number(e)}`, '');
  }
  const mant = Number((abs / 10 ** exp3).toPrecision(digits));
  return join(`${value < 0 ? '-' : ''}${trimmed(mant, digits)}`, entry[1]);
}

const EXPRESSION_FUNCTIONS = new Set(['sqrt', 'log', 'log10', 'exp', 'sin', 'cos', 'tan', 'asin', 'acos', 'atan', 'abs', 'pow', 'min', 'max']);
const EXPRESSION_CONSTANTS = new Set(['pi', 'e']);
/** A number with an attached prefix and/or unit ("2.44G", "50Ω", "4k7", "3.3nH"), to be replaced before mathjs sees it. */
const VALUE_TOKEN = /(?<![\w.])(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?(?:[A-Za-zµμΩ\u2126]+\d*)?(?![\w.])/g;

/**
 * Evaluates a simple arithmetic expression of engineering values, such as "1/(2*pi*2.44G*50)".
 * Values may carry prefixes and units ("2.44 GHz" needs no space removed: "2.44GHz"); units inside
 * an expression are not checked against each other, only dropped. When the whole text is a single
 * value, `unit` is checked as in `parseEngineering`.
 */
export function evaluateExpression(text: string, unit?: Unit): number {
  if (typeof text !== 'string' || text.trim() === '') throw new UnitError(String(text), 'enter a value or an expression');
  if (text.length > 500) throw new UnitError(text.slice(0, 40), 'the expression is too long');
  try {
    return parseEngineering(text, unit);
  } catch (err) {
    if (!(err instanceof UnitError)) throw err;
    if (!/[-+*/^()]/.test(text.trim().replace(/^[+-]/, '').replace(/[eE][+-]/g, ''))) throw err;
  }
  // Join a number to a unit written after a space ("2.44 GHz" -> "2.44GHz") so it is one value.
  const joined = text.replace(/(\d)\s+(?=(?:meg|[fpnuµμmkKMGT])?(?:Hz|H|F|Ω|\u2126|ohms?|W|V|A|S)(?![A-Za-z]))/g, '$1');
  let failure: string | null = null;
  const replaced = joined.replace(VALUE_TOKEN, (token) => {
    try {
      return `(${parseEngineering(token).toString()})`;
    } catch (err) {
      failure ??= err instanceof Error ? err.message : String(err);
      return token;
    }
  });
  if (failure) throw new UnitError(text, failure);
  let node: MathNode;
  try {
    node = mathParse(replaced);
  } catch {
    throw new UnitError(text, `"${text}" is not a valid expression`);
  }
  node.traverse((n) => {
    if (failure) return;
    const t = n.type;
    if (t === 'FunctionNode') {
      const name = (n as unknown as { fn: { name?: string } }).fn.name ?? '';
      if (!EXPRESSION_FUNCTIONS.has(name)) failure = `unknown function "${name}"`;
    } else if (t === 'SymbolNode') {
      const name = (n as unknown as { name: string }).name;
      const parent = isFunctionName(node, n);
      if (!parent && !EXPRESSION_CONSTANTS.has(name)) failure = `unknown name "${name}"`;
    } else if (t === 'OperatorNode') {
      const op = (n as unknown as { fn: string }).fn;
      if (!['add', 'subtract', 'multiply', 'divide', 'unaryMinus', 'unaryPlus', 'pow'].includes(op)) failure = `operator "${(n as unknown as { op: string }).op}" is not allowed`;
    } else if (t !== 'ConstantNode' && t !== 'ParenthesisNode') {
      failure = 'only numbers, + - * / ^, parentheses, pi, e and simple functions are allowed';
    }
  });
  if (failure) throw new UnitError(text, `"${text}": ${failure}`);
  let value: unknown;
  try {
    value = node.compile().evaluate({});
  } catch (err) {
    throw new UnitError(text, `"${text}" could not be evaluated${err instanceof Error ? `: ${err.message}` : ''}`);
  }
  if (typeof value !== 'number' || !Number.isFinite(value)) throw new UnitError(text, `"${text}" does not give a finite number`);
  return value;
}

/** True when `symbol` is the name of a function call in `root` (sqrt in "sqrt(2)"). */
function isFunctionName(root: MathNode, symbol: MathNode): boolean {
  let found = false;
  root.traverse((n) => {
    if (n.type === 'FunctionNode' && (n as unknown as { fn: MathNode }).fn === symbol) found = true;
  });
  return found;
}
