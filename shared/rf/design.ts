/**
 * The v1 design file (`.matchloom.json`), as fixed by CONTRACT.md §2: a zod schema, the TypeScript
 * types inferred from it, and `parseDesign`, which turns unchecked JSON into a `Design` or throws a
 * `DesignError` whose message names the JSON path (`elements[2].value: must be a positive number of henries`).
 *
 * All values are SI base units. Complex numbers are `[re, im]`. The chain is ordered load -> port.
 */
import { z } from 'zod';

/** A checked-input error: `path` is a JSON path such as `elements[2].value`, `message` the reason. */
export class DesignError extends Error {
  readonly code = 'invalid-design';
  constructor(
    readonly path: string,
    readonly reason: string,
  ) {
    super(path ? `${path}: ${reason}` : reason);
    this.name = 'DesignError';
  }
}

const finite = (what: string) =>
  z.number({ error: `must be a finite number (${what})` }).refine(Number.isFinite, `must be a finite number (${what})`);
const positive = (what: string) => finite(what).refine((v) => v > 0, `must be a positive number of ${what}`);
const nonNegative = (what: string) => finite(what).refine((v) => v >= 0, `must be zero or a positive number of ${what}`);

export const complexSchema = z.tuple([finite('real part'), finite('imaginary part')], {
  error: 'must be a complex number [re, im]',
});

export const toleranceSchema = z
  .object({
    relative: nonNegative('relative tolerance (0.05 = ±5 %)').optional(),
    absolute: nonNegative('the value’s unit').optional(),
    distribution: z.enum(['uniform', 'normal'], { error: 'must be "uniform" or "normal"' }).optional(),
  })
  .refine((t) => (t.relative === undefined) !== (t.absolute === undefined), {
    message: 'give exactly one of "relative" or "absolute"',
  });

export const lengthSchema = z.union(
  [
    z.object({ degrees: nonNegative('degrees'), atHz: positive('hertz') }),
    z.object({
      meters: nonNegative('metres'),
      velocityFactor: positive('(velocity factor, 0 < v ≤ 1)').refine((v) => v <= 1, 'must be at most 1'),
    }),
  ],
  { error: 'must be { "degrees", "atHz" } or { "meters", "velocityFactor" }' },
);

const common = {
  id: z.string({ error: 'must be a non-empty string' }).min(1, 'must be a non-empty string'),
  label: z.string({ error: 'must be a string' }).optional(),
  locked: z.boolean({ error: 'must be true or false' }).optional(),
  tolerance: toleranceSchema.optional(),
};

const lumped = <K extends string>(kind: K, unit: string) =>
  z.object({
    ...common,
    kind: z.literal(kind),
    value: positive(unit),
    q: positive('(quality factor)').optional(),
  });

const lineFields = {
  ...common,
  z0: positive('ohms'),
  length: lengthSchema,
  lossDbPerM: nonNegative('dB per metre').optional(),
};

export const LUMPED_KINDS = ['series-l', 'series-c', 'series-r', 'shunt-l', 'shunt-c', 'shunt-r'] as const;
export const ELEMENT_KINDS = [...LUMPED_KINDS, 'line', 'open-stub', 'short-stub', 'transformer', 'two-port'] as const;
export const LOAD_KINDS = ['impedance', 'rlc', 'measured', 'table'] as const;

const kindError = (allowed: readonly string[]) => (iss: { input?: unknown }) => {
  const input = iss.input as { kind?: unknown } | undefined;
  const kind = input && typeof input === 'object' ? input.kind : undefined;
  return kind === undefined
    ? `needs a "kind", one of ${allowed.join(', ')}`
    : `unknown kind ${JSON.stringify(kind)}; expected one of ${allowed.join(', ')}`;
};

export const elementSchema = z.discriminatedUnion(
  'kind',
  [
    lumped('series-l', 'henries'),
    lumped('series-c', 'farads'),
    lumped('series-r', 'ohms'),
    lumped('shunt-l', 'henries'),
    lumped('shunt-c', 'farads'),
    lumped('shunt-r', 'ohms'),
    z.object({ ...lineFields, kind: z.literal('line') }),
    z.object({ ...lineFields, kind: z.literal('open-stub') }),
    z.object({ ...lineFields, kind: z.literal('short-stub') }),
    z.object({ ...common, kind: z.literal('transformer'), ratio: positive('(turns ratio)') }),
    z.object({
      ...common,
      kind: z.literal('two-port'),
      touchstone: z.string({ error: 'must be the text of a .s2p file' }).min(1, 'must be the text of a .s2p file'),
      flipped: z.boolean({ error: 'must be true or false' }).optional(),
      uploadId: z.string().optional(),
    }),
  ],
  { error: kindError(ELEMENT_KINDS) },
);

export const loadSchema = z.discriminatedUnion(
  'kind',
  [
    z.object({
      kind: z.literal('impedance'),
      ohms: z.tuple(
        [nonNegative('ohms (real part of a passive load)'), finite('ohms')],
        { error: 'must be a complex number [re, im]' },
      ),
    }),
    z.object({
      kind: z.literal('rlc'),
      topology: z.enum(['series', 'parallel'], { error: 'must be "series" or "parallel"' }),
      r: nonNegative('ohms'),
      l: positive('henries').optional(),
      c: positive('farads').optional(),
    }),
    z.object({
      kind: z.literal('measured'),
      touchstone: z.string({ error: 'must be the text of a .s1p file' }).min(1, 'must be the text of a .s1p file'),
      uploadId: z.string().optional(),
      fileName: z.string().optional(),
    }),
    z.object({
      kind: z.literal('table'),
      points: z
        .array(z.tuple([positive('hertz'), nonNegative('ohms'), finite('ohms')], { error: 'must be [hz, re, im]' }), {
          error: 'must be an array of [hz, re, im]',
        })
        .min(1, 'needs at least one point'),
    }),
  ],
  { error: kindError(LOAD_KINDS) },
);

export const bandSchema = z.object({
  startHz: positive('hertz'),
  stopHz: positive('hertz'),
  centerHz: positive('hertz').optional(),
});

export const sweepSchema = z.object({
  startHz: positive('hertz'),
  stopHz: positive('hertz'),
  points: z
    .number({ error: 'must be a whole number of points' })
    .int('must be a whole number of points')
    .min(1, 'must be at least 1 point')
    .max(1_000_001, 'must be at most 1,000,001 points'),
  spacing: z.enum(['linear', 'log'], { error: 'must be "linear" or "log"' }).optional(),
});

export const goalSchema = z.union(
  [
    z.object({ maxVswr: finite('VSWR').refine((v) => v > 1, 'must be a VSWR greater than 1') }),
    z.object({ minReturnLossDb: positive('decibels') }),
  ],
  { error: 'must be { "maxVswr": v } or { "minReturnLossDb": dB }' },
);

export const designSchema = z
  .object({
    format: z.literal('matchloom-design', { error: 'must be "matchloom-design"' }),
    version: z.literal(1, { error: 'must be 1 (this reader knows version 1)' }),
    name: z.string({ error: 'must be a string' }).default('Untitled design'),
    referenceOhms: positive('ohms').default(50),
    port: z
      .object({
        impedance: z.tuple([positive('ohms (real part)'), finite('ohms')], { error: 'must be a complex number [re, im]' }),
      })
      .optional(),
    load: loadSchema,
    band: bandSchema,
    sweep: sweepSchema,
    goal: goalSchema,
    elements: z.array(elementSchema, { error: 'must be an array of elements' }).default([]),
    drive: z.object({ powerW: nonNegative('watts') }).optional(),
    substrate: z
      .object({
        epsilonR: finite('relative permittivity').refine((v) => v >= 1, 'must be at least 1'),
        heightM: positive('metres'),
        copperM: nonNegative('metres').optional(),
      })
      .optional(),
  })
  .superRefine((d, ctx) => {
    if (d.band.stopHz < d.band.startHz) ctx.addIssue({ code: 'custom', path: ['band', 'stopHz'], message: 'must not be below band.startHz' });
    const c = d.band.centerHz;
    if (c !== undefined && (c < d.band.startHz || c > d.band.stopHz))
      ctx.addIssue({ code: 'custom', path: ['band', 'centerHz'], message: 'must lie between band.startHz and band.stopHz' });
    if (d.sweep.stopHz < d.sweep.startHz) ctx.addIssue({ code: 'custom', path: ['sweep', 'stopHz'], message: 'must not be below sweep.startHz' });
    if (d.sweep.points > 1 && d.sweep.stopHz === d.sweep.startHz)
      ctx.addIssue({ code: 'custom', path: ['sweep', 'stopHz'], message: 'must be above sweep.startHz when there is more than one point' });
    if (d.load.kind === 'rlc' && d.load.topology === 'parallel' && d.load.r === 0)
      ctx.addIssue({ code: 'custom', path: ['load', 'r'], message: 'must be a positive number of ohms for a parallel RLC (omit nothing: use a large R for none)' });
    if (d.load.kind === 'table') {
      const pts = d.load.points;
      for (let i = 1; i < pts.length; i++)
        if (!(pts[i][0] > pts[i - 1][0])) {
          ctx.addIssue({ code: 'custom', path: ['load', 'points', i, 0], message: 'frequencies must increase' });
          break;
        }
    }
    const seen = new Set<string>();
    d.elements.forEach((e, i) => {
      if (seen.has(e.id)) ctx.addIssue({ code: 'custom', path: ['elements', i, 'id'], message: `duplicate element id ${JSON.stringify(e.id)}` });
      seen.add(e.id);
    });
  });

export type Complex = [number, number];
export type Design = z.output<typeof designSchema>;
export type DesignInput = z.input<typeof designSchema>;
export type Element = z.output<typeof elementSchema>;
export type ElementKind = Element['kind'];
export type LumpedElement = Extract<Element, { kind: (typeof LUMPED_KINDS)[number] }>;
export type LineElement = Extract<Element, { kind: 'line' | 'open-stub' | 'short-stub' }>;
export type Length = z.output<typeof lengthSchema>;
export type Tolerance = z.output<typeof toleranceSchema>;
export type Load = z.output<typeof loadSchema>;
export type Band = z.output<typeof bandSchema>;
export type Sweep = z.output<typeof sweepSchema>;
export type Goal = z.output<typeof goalSchema>;

export function isLumped(e: Element): e is LumpedElement {
  return (LUMPED_KINDS as readonly string[]).includes(e.kind);
}
export function isLine(e: Element): e is LineElement {
  return e.kind === 'line' || e.kind === 'open-stub' || e.kind === 'short-stub';
}

/** `['elements', 2, 'value']` -> `elements[2].value` */
export function formatJsonPath(path: readonly PropertyKey[]): string {
  let out = '';
  for (const p of path) {
    if (typeof p === 'number') out += `[${p}]`;
    else out += out ? `.${String(p)}` : String(p);
  }
  return out;
}

/** The first issue of a failed parse as a `DesignError`. */
export function designErrorFromZod(error: z.ZodError, prefix: readonly PropertyKey[] = []): DesignError {
  const issue = error.issues[0];
  const path = [...prefix, ...(issue?.path ?? [])];
  let message = issue?.message ?? 'is not valid';
  if (issue?.code === 'invalid_type' && /received undefined/i.test(message)) message = 'is required';
  return new DesignError(formatJsonPath(path), message);
}

/** Check unchecked JSON against the v1 schema; throws `DesignError` naming the JSON path. */
export function parseDesign(json: unknown): Design {
  if (json === null || typeof json !== 'object' || Array.isArray(json))
    throw new DesignError('', 'a design file must be a JSON object');
  const result = designSchema.safeParse(json);
  if (!result.success) throw designErrorFromZod(result.error);
  return result.data;
}

/** A design file as read (`input`, unchecked JSON) and as checked by `parseDesign` (`design`). */
export interface ParsedDesign {
  input: Record<string, unknown>;
  design: Design;
}

/**
 * `parseDesign(input)`, reusing `prev` (an earlier input and its checked design) when only some
 * elements changed: every other field reads the same as in `prev.input` and the elements keep their
 * ids and order. Only the changed elements are then checked (against `elementSchema`, which is what
 * the whole-design check applies to each of them; the design-wide rules read only the fields and
 * ids that did not change), and the unchanged ones keep `prev.design`'s objects. Anything else, or a
 * changed element that does not check, goes through `parseDesign`, so the result and the error are
 * always the ones `parseDesign` gives. For a value being tuned (one number in one element changed per
 * step) this checks one element instead of the whole design.
 */
export function reparseDesign(prev: ParsedDesign | null, input: unknown): Design {
  const full = () => parseDesign(input);
  if (!prev || input === null || typeof input !== 'object' || Array.isArray(input)) return full();
  const next = input as Record<string, unknown>;
  const keys = Object.keys(next);
  if (keys.length !== Object.keys(prev.input).length) return full();
  for (const k of keys) {
    if (!(k in prev.input)) return full();
    if (k === 'elements') continue;
    if (next[k] !== prev.input[k] && JSON.stringify(next[k]) !== JSON.stringify(prev.input[k])) return full();
  }
  const before = prev.input.elements;
  const after = next.elements;
  if (!Array.isArray(before) || !Array.isArray(after) || before.length !== after.length) return full();
  if (before.length !== prev.design.elements.length) return full();
  let changed = false;
  const elements = new Array<Element>(after.length);
  for (let i = 0; i < after.length; i++) {
    const a = after[i] as Record<string, unknown> | null;
    const b = before[i] as Record<string, unknown> | null;
    if (a === null || typeof a !== 'object' || b === null || typeof b !== 'object' || a.id !== b.id) return full();
    if (a === b || JSON.stringify(a) === JSON.stringify(b)) {
      elements[i] = prev.design.elements[i];
      continue;
    }
    const checked = elementSchema.safeParse(a);
    if (!checked.success) return full();
    elements[i] = checked.data;
    changed = true;
  }
  return changed ? { ...prev.design, elements } : prev.design;
}

/** Same as `parseDesign`, but returns the error instead of throwing. */
export function safeParseDesign(json: unknown): { ok: true; design: Design } | { ok: false; error: DesignError } {
  try {
    return { ok: true, design: parseDesign(json) };
  } catch (e) {
    if (e instanceof DesignError) return { ok: false, error: e };
    throw e;
  }
}

/** The centre frequency: `band.centerHz`, or the arithmetic middle of the band when omitted. */
export function bandCenterHz(band: Band): number {
  return band.centerHz ?? (band.startHz + band.stopHz) / 2;
}

/** The goal as a maximum |Γ|: VSWR s -> (s − 1)/(s + 1); return loss RL -> 10^(−RL/20). */
export function goalMaxGamma(goal: Goal): number {
  if ('maxVswr' in goal) return (goal.maxVswr - 1) / (goal.maxVswr + 1);
  return Math.pow(10, -goal.minReturnLossDb / 20);
}

/** Parse JSON text and the design in one step, with a clear error for text that is not JSON. */
export function parseDesignText(text: string): Design {
  let json: unknown;
  try {
    json = JSON.parse(text);
  } catch (e) {
    throw new DesignError('', `not valid JSON (${(e as Error).message})`);
  }
  return parseDesign(json);
}
