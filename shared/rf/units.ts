/**
 * Engineering values for the user interface: "3.3 nH", "2.45 GHz", "4k7", "2R2".
 *
 * Data is always SI base units (CONTRACT §1); prefixes are a matter of display and entry only, so
 * nothing here runs in a hot loop. "m" is milli and "M" (or "meg") is mega, as in SPICE and on
 * part labels; "u", "µ" and "μ" are micro. Resistor-style codes put the prefix where the decimal
 * point goes ("4k7" = 4.7 k, "2R2" = 2.2, "R47" = 0.47, "4n7" = 4.7 n).
 */
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
  const src = text.trim().replace(/\u2212/g, '-');
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

  if (/\d,\d/.test(src)) throw new UnitError(text, `"${text}": use a decimal point, not a comma`);
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
      // Nobody in RF means millihertz: "433 mhz" and "433 mHz" are read as megahertz.
      exp = found.unit === 'Hz' && found.rest === 'm' ? 6 : prefixExponent(text, found.rest, found.unit);
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
  const join = (num: string, prefix: string) => (unit === '' ? `${num}${prefix}` : `${num} ${prefix}${unit}`);
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
  // Sub-hertz values get no prefix: "m" before Hz is read as mega (see parseEngineering).
  if (!entry || (unit === 'Hz' && exp3 < 0)) {
    // Beyond the prefixes: plain exponent notation, still with the unit.
    const [m, e] = value.toExponential(digits - 1).split('e');
    return join(`${trimmed(Number(m), digits)}e${Number(e)}`, '');
  }
  const mant = Number((abs / 10 ** exp3).toPrecision(digits));
  return join(`${value < 0 ? '-' : ''}${trimmed(mant, digits)}`, entry[1]);
}

const FUNCTIONS: Record<string, { arity: number; fn: (...args: number[]) => number }> = {
  sqrt: { arity: 1, fn: Math.sqrt },
  ln: { arity: 1, fn: Math.log },
  log: { arity: 1, fn: Math.log },
  log10: { arity: 1, fn: Math.log10 },
  exp: { arity: 1, fn: Math.exp },
  sin: { arity: 1, fn: Math.sin },
  cos: { arity: 1, fn: Math.cos },
  tan: { arity: 1, fn: Math.tan },
  atan: { arity: 1, fn: Math.atan },
  abs: { arity: 1, fn: Math.abs },
  pow: { arity: 2, fn: Math.pow },
  min: { arity: 2, fn: Math.min },
  max: { arity: 2, fn: Math.max },
};
const CONSTANTS: Record<string, number> = { pi: Math.PI, π: Math.PI, e: Math.E };

/** A number with an optional attached prefix/unit or resistor code: "2.44G", "50Ω", "4k7", "3.3nH", "1e-9". */
const VALUE_AT = /(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?(?:[A-Za-zµμΩ\u2126]+\d*)?/y;
const NAME_AT = /[A-Za-zπ_][A-Za-z0-9_]*/y;

/**
 * Evaluates a simple arithmetic expression of engineering values, such as "1/(2*pi*2.44G*50)":
 * numbers (with prefixes, units or resistor codes attached: "2.44G", "2.44 GHz", "4k7"), + − * / ^,
 * parentheses, pi, e and sqrt, ln/log, log10, exp, sin, cos, tan, atan, abs, pow, min, max.
 * Units inside an expression are dropped, not checked against each other; when the whole text is a
 * single value, `unit` is checked as in `parseEngineering`. A small recursive-descent parser (no
 * general expression library), so nothing else can be reached from the text.
 */
export function evaluateExpression(text: string, unit?: Unit): number {
  if (typeof text !== 'string' || text.trim() === '') throw new UnitError(String(text), 'enter a value or an expression');
  if (text.length > 500) throw new UnitError(text.slice(0, 40), 'the expression is too long');
  try {
    return parseEngineering(text, unit);
  } catch (err) {
    if (!(err instanceof UnitError)) throw err;
    const rest = text.trim().replace(/^[+-]/, '').replace(/\d[eE][+-]/g, '');
    if (!/[-+*/^()]/.test(rest)) throw err;
  }
  // Join a number to a unit written after a space ("2.44 GHz" -> "2.44GHz") so it reads as one value.
  const src = text
    .replace(/\u2212/g, '-')
    .replace(/(\d)\s+(?=(?:meg|[fpnuµμmkKMGT])?(?:Hz|H|F|Ω|\u2126|ohms?|W|V|A|S|dB)(?![A-Za-z]))/g, '$1');
  let pos = 0;
  const fail = (why: string): never => {
    throw new UnitError(text, `"${text.trim()}": ${why}`);
  };
  const skip = () => {
    while (pos < src.length && /\s/.test(src[pos])) pos++;
  };
  const peek = () => {
    skip();
    return src[pos];
  };
  const expect = (ch: string) => {
    if (peek() !== ch) fail(pos >= src.length ? `expected "${ch}" at the end` : `expected "${ch}" at "${src.slice(pos, pos + 10)}"`);
    pos++;
  };
  const primary = (): number => {
    const ch = peek();
    if (ch === undefined) return fail('the expression ends too early');
    if (ch === '(') {
      pos++;
      const v = sum();
      expect(')');
      return v;
    }
    VALUE_AT.lastIndex = pos;
    const num = VALUE_AT.exec(src);
    if (num) {
      pos += num[0].length;
      try {
        return parseEngineering(num[0]);
      } catch (err) {
        return fail(err instanceof UnitError ? err.reason.replace(/^"[^"]*":?\s*/, '') || `bad value "${num[0]}"` : `bad value "${num[0]}"`);
      }
    }
    NAME_AT.lastIndex = pos;
    const name = NAME_AT.exec(src);
    if (name) {
      pos += name[0].length;
      const id = name[0];
      if (peek() === '(') {
        const f = FUNCTIONS[id];
        if (!f) return fail(`unknown function "${id}"`);
        pos++;
        const args = [sum()];
        while (peek() === ',') {
          pos++;
          args.push(sum());
        }
        expect(')');
        if (args.length !== f.arity) fail(`${id} takes ${f.arity} argument${f.arity === 1 ? '' : 's'}`);
        return f.fn(...args);
      }
      if (id in CONSTANTS) return CONSTANTS[id];
      return fail(`unknown name "${id}"`);
    }
    return fail(`unexpected "${ch}"`);
  };
  const unary = (): number => {
    const ch = peek();
    if (ch === '-' || ch === '+') {
      pos++;
      const v = unary();
      return ch === '-' ? -v : v;
    }
    return power();
  };
  const power = (): number => {
    const base = primary();
    if (peek() === '^') {
      pos++;
      return base ** unary();
    }
    return base;
  };
  const product = (): number => {
    let v = unary();
    for (let ch = peek(); ch === '*' || ch === '/'; ch = peek()) {
      pos++;
      const r = unary();
      v = ch === '*' ? v * r : v / r;
    }
    return v;
  };
  const sum = (): number => {
    let v = product();
    for (let ch = peek(); ch === '+' || ch === '-'; ch = peek()) {
      pos++;
      const r = product();
      v = ch === '+' ? v + r : v - r;
    }
    return v;
  };
  const value = sum();
  if (peek() !== undefined) fail(`unexpected "${src.slice(pos, pos + 10)}"`);
  if (!Number.isFinite(value)) fail('does not give a finite number');
  return value;
}
