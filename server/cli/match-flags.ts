/**
 * Option parsing shared by the match, refine and yield command lines: `--name value` or
 * `--name=value`, each name declared with a parser; anything else (an unknown option, a value that
 * does not parse, a second design path) is an error the caller reports as one line with exit 2.
 */

export type FlagParser<T> = (text: string, name: string) => T;

export class FlagError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'FlagError';
  }
}

export const wholeNumber =
  (min: number, max = Number.MAX_SAFE_INTEGER): FlagParser<number> =>
  (text, name) => {
    const v = Number(text);
    if (!/^[+-]?\d+$/.test(text.trim()) || !Number.isSafeInteger(v) || v < min || v > max)
      throw new FlagError(`--${name}: must be a whole number from ${min} to ${max}, got ${JSON.stringify(text)}`);
    return v;
  };

export const positiveNumber: FlagParser<number> = (text, name) => {
  const v = Number(text);
  if (!text.trim() || !Number.isFinite(v) || !(v > 0)) throw new FlagError(`--${name}: must be a positive number, got ${JSON.stringify(text)}`);
  return v;
};

export const listOf =
  <T>(item: FlagParser<T>): FlagParser<T[]> =>
  (text, name) =>
    text.split(',').map((t) => item(t.trim(), name));

export const oneOf =
  <T extends string>(values: readonly T[]): FlagParser<T> =>
  (text, name) => {
    if (!(values as readonly string[]).includes(text)) throw new FlagError(`--${name}: must be one of ${values.join(', ')}, got ${JSON.stringify(text)}`);
    return text as T;
  };

export interface ParsedArgs<T> {
  /** The positional arguments (the design path or "-"), for readDesignArg. */
  readonly rest: string[];
  readonly flags: Partial<T>;
}

/** Parse `argv` against the declared flags; boolean flags (declared `true`) take no value. */
export function flagsParsed<T extends Record<string, unknown>>(argv: readonly string[], spec: { [K in keyof T]: FlagParser<T[K]> | true }): ParsedArgs<T> {
  const rest: string[] = [];
  const flags: Partial<T> = {};
  for (let k = 0; k < argv.length; k++) {
    const a = argv[k];
    if (a === '--') continue;
    if (!a.startsWith('--')) {
      rest.push(a);
      continue;
    }
    const eq = a.indexOf('=');
    const name = eq >= 0 ? a.slice(2, eq) : a.slice(2);
    if (!Object.prototype.hasOwnProperty.call(spec, name)) throw new FlagError(`unknown option --${name} (known: ${Object.keys(spec).map((n) => `--${n}`).join(', ')})`);
    const parser = spec[name as keyof T];
    if (parser === true) {
      if (eq >= 0) throw new FlagError(`--${name} takes no value`);
      (flags as Record<string, unknown>)[name] = true;
      continue;
    }
    let value: string | undefined;
    if (eq >= 0) value = a.slice(eq + 1);
    else if (k + 1 < argv.length) value = argv[++k];
    if (value === undefined) throw new FlagError(`--${name} needs a value`);
    (flags as Record<string, unknown>)[name] = parser(value, name);
  }
  if (rest.length > 1) throw new FlagError(`one design file expected, got ${rest.length}: ${rest.join(' ')}`);
  return { rest, flags };
}
