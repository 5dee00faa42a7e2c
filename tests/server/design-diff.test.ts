import { describe, expect, it } from 'vitest';
import { designDiff, fieldChanges, jsonEqual } from '../../shared/api/design-diff';
import { parseDesign, type Design, type DesignInput } from '../../shared/rf/design';
import { whipE12Design, whipFirstCutDesign, whipLowCostDesign } from '../../shared/demo/designs';

const design = (input: DesignInput): Design => parseDesign(input);

function withElements(elements: DesignInput['elements']): Design {
  return design({ ...whipE12Design(), elements });
}

describe('jsonEqual', () => {
  it('jsonEqual ignores object key order and undefined fields, compares arrays element by element', () => {
    expect(jsonEqual({ a: 1, b: [1, 2] }, { b: [1, 2], a: 1 })).toBe(true);
    expect(jsonEqual({ a: 1, c: undefined }, { a: 1 })).toBe(true);
    expect(jsonEqual([1, 2], [2, 1])).toBe(false);
    expect(jsonEqual({ a: 1 }, { a: 1, b: 2 })).toBe(false);
    expect(jsonEqual(null, {})).toBe(false);
  });
});

describe('fieldChanges', () => {
  it('fieldChanges flattens nested objects to dotted paths (kind first, then alphabetical) and keeps arrays whole', () => {
    expect(
      fieldChanges(
        { band: { startHz: 1, stopHz: 2 }, load: { kind: 'impedance', ohms: [50, 0] } },
        { band: { startHz: 1, stopHz: 3 }, load: { kind: 'impedance', ohms: [25, 5] } },
      ),
    ).toEqual([
      { path: 'band.stopHz', old: 2, new: 3 },
      { path: 'load.ohms', old: [50, 0], new: [25, 5] },
    ]);
  });

  it('fieldChanges leaves out `old` for a field only in b and `new` for a field only in a', () => {
    expect(fieldChanges({ tolerance: { relative: 0.05 } }, { q: 40 })).toEqual([
      { path: 'q', new: 40 },
      { path: 'tolerance', old: { relative: 0.05 } },
    ]);
    expect(fieldChanges({ q: 40 }, { tolerance: { relative: 0.05 } })).toEqual([
      { path: 'q', old: 40 },
      { path: 'tolerance', new: { relative: 0.05 } },
    ]);
  });
});

describe('designDiff', () => {
  it('designDiff(d, d) is identical and empty', () => {
    const d = design(whipE12Design());
    expect(designDiff(d, d)).toEqual({
      fields: [],
      added: [],
      removed: [],
      changed: [],
      moved: [],
      identical: true,
    });
  });

  it('designDiff of the whip "first cut" and "E12 values" snapshots names the changed values, Q and tolerances', () => {
    const diff = designDiff(design(whipFirstCutDesign()), design(whipE12Design()));
    expect(diff.identical).toBe(false);
    expect(diff.fields).toEqual([]);
    expect(diff.added).toEqual([]);
    expect(diff.removed).toEqual([]);
    expect(diff.moved).toEqual([]);
    expect(diff.changed).toEqual([
      {
        id: 'c-series',
        kind: 'series-c',
        changes: [
          { path: 'q', new: 400 },
          { path: 'tolerance', new: { relative: 0.05 } },
          { path: 'value', old: 18.67e-12, new: 18e-12 },
        ],
      },
      {
        id: 'c-shunt',
        kind: 'shunt-c',
        changes: [
          { path: 'q', new: 400 },
          { path: 'tolerance', new: { relative: 0.05 } },
          { path: 'value', old: 13.05e-12, new: 12e-12 },
        ],
      },
    ]);
  });

  it('designDiff of a room and its low-cost branch shows the name and the cheaper parts', () => {
    const diff = designDiff(design(whipE12Design()), design(whipLowCostDesign()));
    expect(diff.fields).toEqual([
      { path: 'name', old: '433 MHz whip antenna', new: '433 MHz whip — low-cost branch' },
    ]);
    expect(diff.changed.map((c) => c.changes.map((x) => x.path))).toEqual([
      ['q', 'tolerance.relative'],
      ['q', 'tolerance.relative'],
    ]);
  });

  it('designDiff finds added and removed elements with their chain positions', () => {
    const a = withElements([
      { id: 'c1', kind: 'series-c', value: 1e-12 },
      { id: 'l1', kind: 'shunt-l', value: 2e-9 },
    ]);
    const b = withElements([
      { id: 'c1', kind: 'series-c', value: 1e-12 },
      { id: 't1', kind: 'transformer', ratio: 2 },
    ]);
    const diff = designDiff(a, b);
    expect(diff.removed).toEqual([
      { id: 'l1', index: 1, element: { id: 'l1', kind: 'shunt-l', value: 2e-9 } },
    ]);
    expect(diff.added).toEqual([
      { id: 't1', index: 1, element: { id: 't1', kind: 'transformer', ratio: 2 } },
    ]);
    expect(diff.changed).toEqual([]);
    expect(diff.moved).toEqual([]);
  });

  it('designDiff reports a kind change of one id as field changes, including the kind', () => {
    const diff = designDiff(
      withElements([{ id: 'x', kind: 'series-c', value: 1e-12 }]),
      withElements([{ id: 'x', kind: 'series-l', value: 3e-9 }]),
    );
    expect(diff.changed).toEqual([
      {
        id: 'x',
        kind: 'series-l',
        changes: [
          { path: 'kind', old: 'series-c', new: 'series-l' },
          { path: 'value', old: 1e-12, new: 3e-9 },
        ],
      },
    ]);
  });

  it('designDiff calls only the element that left its place "moved", not those shifted by it', () => {
    const els = ['a', 'b', 'c', 'd'].map((id) => ({ id, kind: 'series-r' as const, value: 1 }));
    const diff = designDiff(withElements(els), withElements([els[1], els[2], els[3], els[0]]));
    expect(diff.moved).toEqual([{ id: 'a', fromIndex: 0, toIndex: 3 }]);
    // An insertion ahead of the others shifts their indices but moves nothing.
    const inserted = designDiff(
      withElements(els),
      withElements([{ id: 'n', kind: 'series-r', value: 2 }, ...els]),
    );
    expect(inserted.moved).toEqual([]);
    expect(inserted.added.map((e) => e.index)).toEqual([0]);
  });

  it('designDiff compares loads of different kinds field by field', () => {
    const a = design(whipE12Design());
    const b = design({ ...whipE12Design(), load: { kind: 'impedance', ohms: [12, 41] } });
    expect(designDiff(a, b).fields).toEqual([
      { path: 'load.kind', old: 'rlc', new: 'impedance' },
      { path: 'load.c', old: 9e-12 },
      { path: 'load.l', old: 30e-9 },
      { path: 'load.ohms', new: [12, 41] },
      { path: 'load.r', old: 12 },
      { path: 'load.topology', old: 'series' },
    ]);
  });
});
