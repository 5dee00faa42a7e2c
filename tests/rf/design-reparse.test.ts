// reparseDesign (the workspace's per-update check while a value is tuned) against parseDesign.
// No published source: the rule under test is "same result and same error as parseDesign" (common practice).
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { DesignError, parseDesign, reparseDesign, type Design, type ParsedDesign } from '../../shared/rf/design';
import { seededRandom } from './helpers';
import { randomChain, randomLoad } from './random-chains';

type Json = Record<string, unknown>;

function baseInput(seed: number): Json {
  const rnd = seededRandom(seed);
  return JSON.parse(
    JSON.stringify({
      format: 'matchloom-design',
      version: 1,
      name: 'reparse',
      referenceOhms: 50,
      load: randomLoad(rnd),
      band: { startHz: 2.4e9, stopHz: 2.5e9 },
      sweep: { startHz: 2e9, stopHz: 3e9, points: 11 },
      goal: { maxVswr: 2 },
      elements: randomChain(rnd, { maxLength: 6 }).map((e, i) => ({ ...e, id: `E${i}` })),
    }),
  ) as Json;
}

/** parseDesign's outcome: the design or the error's message (which names the JSON path). */
function outcome(f: () => Design): { design: Design } | { error: string } {
  try {
    return { design: f() };
  } catch (e) {
    if (!(e instanceof DesignError)) throw e;
    return { error: e.message };
  }
}

/** One edit of the kinds a document update makes (some leave the design invalid). */
const editArb = fc.oneof(
  fc.record({ op: fc.constant('value' as const), at: fc.nat(), v: fc.oneof(fc.double({ min: -1e-9, max: 1e-7, noNaN: true }), fc.constant(0)) }),
  fc.record({ op: fc.constant('text' as const), at: fc.nat() }),
  fc.record({ op: fc.constant('id' as const), at: fc.nat(), other: fc.nat() }),
  fc.record({ op: fc.constant('extra' as const), at: fc.nat() }),
  fc.record({ op: fc.constant('drop' as const), at: fc.nat() }),
  fc.record({ op: fc.constant('copy' as const), at: fc.nat() }),
  fc.record({ op: fc.constant('swap' as const), at: fc.nat() }),
  fc.record({ op: fc.constant('band' as const), stop: fc.double({ min: 2e9, max: 3e9, noNaN: true }) }),
  fc.record({ op: fc.constant('name' as const), name: fc.string({ maxLength: 5 }) }),
  fc.record({ op: fc.constant('drive' as const), w: fc.double({ min: -1, max: 10, noNaN: true }) }),
);
type Edit = typeof editArb extends fc.Arbitrary<infer T> ? T : never;

function applyEdit(input: Json, edit: Edit): Json {
  const next = JSON.parse(JSON.stringify(input)) as Json;
  const els = next.elements as Json[];
  const pick = (n: number) => (els.length ? els[n % els.length] : null);
  switch (edit.op) {
    case 'value': {
      const e = pick(edit.at);
      if (e) {
        const field = Object.keys(e).find((k) => typeof e[k] === 'number') ?? 'value';
        e[field] = edit.v;
      }
      break;
    }
    case 'text': {
      const e = pick(edit.at);
      if (e) e.value = '3.3n';
      break;
    }
    case 'id': {
      const e = pick(edit.at);
      const o = pick(edit.other);
      if (e && o) e.id = o.id;
      break;
    }
    case 'extra': {
      const e = pick(edit.at);
      if (e) e.colour = 'red';
      break;
    }
    case 'drop':
      if (els.length) els.splice(edit.at % els.length, 1);
      break;
    case 'copy': {
      const e = pick(edit.at);
      if (e) els.push({ ...e, id: `X${els.length}` });
      break;
    }
    case 'swap':
      if (els.length > 1) {
        const i = edit.at % els.length;
        const j = (i + 1) % els.length;
        [els[i], els[j]] = [els[j], els[i]];
      }
      break;
    case 'band':
      (next.band as Json).stopHz = edit.stop;
      break;
    case 'name':
      next.name = edit.name;
      break;
    case 'drive':
      next.drive = { powerW: edit.w };
      break;
  }
  return next;
}

describe('reparseDesign', () => {
  it('gives the design or the error parseDesign gives, over random edit sequences (property, 300 runs)', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 1_000_000 }), fc.array(editArb, { minLength: 1, maxLength: 12 }), (seed, edits) => {
        let input = baseInput(seed);
        let prev: ParsedDesign | null = { input, design: parseDesign(input) };
        for (const edit of edits) {
          input = applyEdit(input, edit);
          const expected = outcome(() => parseDesign(input));
          const got = outcome(() => reparseDesign(prev, input));
          expect(got).toEqual(expected);
          // like the workspace: the last good reading is the one reused
          if ('design' in got) prev = { input, design: got.design };
        }
      }),
      { numRuns: 300, seed: 20261202 },
    );
  });

  it('keeps the unchanged elements’ objects and checks the changed one (a tuned value)', () => {
    const input = baseInput(7);
    const prev = { input, design: parseDesign(input) };
    const next = applyEdit(input, { op: 'value', at: 1, v: 4.7e-9 });
    const design = reparseDesign(prev, next);
    expect(design).toEqual(parseDesign(next));
    expect(design).not.toBe(prev.design);
    design.elements.forEach((e, i) => (i === 1 ? expect(e).not.toBe(prev.design.elements[i]) : expect(e).toBe(prev.design.elements[i])));
    // an unchanged input gives the previous design itself
    expect(reparseDesign(prev, JSON.parse(JSON.stringify(input)))).toBe(prev.design);
  });

  it('names the element’s path when a tuned value goes bad, as parseDesign does', () => {
    const input = baseInput(11);
    const prev = { input, design: parseDesign(input) };
    const next = applyEdit(input, { op: 'text', at: 2 });
    expect(() => reparseDesign(prev, next)).toThrow(/elements\[2\]/);
    expect(outcome(() => reparseDesign(prev, next))).toEqual(outcome(() => parseDesign(next)));
  });
});
