import { describe, expect, it } from 'vitest';
import * as Y from 'yjs';
import { createDesignDoc, insertElement, orderedElementIds } from '../../shared/collab/schema';
import { chipAntennaDesign } from '../../shared/demo/designs';
import { ELEMENT_KINDS, elementSchema, parseDesign, type Design } from '../../shared/rf/design';
import { parseTouchstone } from '../../shared/rf/touchstone';
import { defaultElement, roundToFigures } from '../../client/features/workspace/chain/element-defaults';
import { allocateElementName, nextElementLabel } from '../../client/features/workspace/chain/element-ids';
import { PALETTE_KINDS } from '../../client/features/workspace/chain/element-catalog';
import { chainLayout, dropIndex } from '../../client/features/workspace/chain/chain-layout';
import { elementDescription, elementValueLabel } from '../../client/features/workspace/chain/element-summary';

const ctx: Pick<Design, 'band' | 'referenceOhms' | 'sweep'> = {
  band: { startHz: 2.4e9, stopHz: 2.4835e9, centerHz: 2.44e9 },
  referenceOhms: 50,
  sweep: { startHz: 2e9, stopHz: 3e9, points: 201 },
};

describe('defaultElement', () => {
  it('gives every kind of the contract a valid element', () => {
    for (const kind of ELEMENT_KINDS) {
      const e = defaultElement(kind, 'X1', ctx);
      expect(elementSchema.safeParse(e).success, kind).toBe(true);
      expect(e.kind).toBe(kind);
    }
  });

  it('sizes L and C for a reactance equal to the reference impedance at the centre (X = ωL, X = 1/ωC; common practice)', () => {
    // 50 / (2π · 2.44 GHz) = 3.261 nH -> 3.3 nH; 1 / (2π · 2.44 GHz · 50) = 1.3045 pF -> 1.3 pF
    expect(defaultElement('series-l', 'L1', ctx)).toEqual({ id: 'L1', kind: 'series-l', value: 3.3e-9 });
    expect(defaultElement('shunt-c', 'C1', ctx)).toEqual({ id: 'C1', kind: 'shunt-c', value: 1.3e-12 });
  });

  it('makes lines and stubs an eighth of a wavelength at the centre in the reference impedance', () => {
    expect(defaultElement('open-stub', 'ST1', ctx)).toMatchObject({ z0: 50, length: { degrees: 45, atHz: 2.44e9 } });
  });

  it('starts a two-port as a through connection over the sweep', () => {
    const e = defaultElement('two-port', 'N1', ctx);
    if (e.kind !== 'two-port') throw new Error('kind');
    const data = parseTouchstone(e.touchstone, { ports: 2 });
    expect(data.frequenciesHz[0]).toBe(2e9);
    expect(data.frequenciesHz[data.frequenciesHz.length - 1]).toBe(3e9);
    // row-major S11, S12, S21, S22: S12 = S21 = 1, S11 = S22 = 0
    expect(Array.from(data.s.slice(0, 8))).toEqual([0, 0, 1, 0, 1, 0, 0, 0]);
  });

  it('rounds to two significant figures', () => {
    expect(roundToFigures(3.26159e-9)).toBe(3.3e-9);
    expect(roundToFigures(0)).toBe(0);
  });

  it('the palette offers every kind once', () => {
    expect([...PALETTE_KINDS].sort()).toEqual([...ELEMENT_KINDS].sort());
  });
});

describe('nextElementLabel', () => {
  it('starts at 1 for each prefix', () => {
    expect(nextElementLabel('series-l', [])).toBe('L1');
    expect(nextElementLabel('shunt-c', ['L1'])).toBe('C1');
    expect(nextElementLabel('line', [])).toBe('TL1');
    expect(nextElementLabel('short-stub', [])).toBe('ST1');
    expect(nextElementLabel('transformer', [])).toBe('T1');
  });

  it('goes past the highest number in use, counting suffixed ids, and never repeats one', () => {
    expect(nextElementLabel('series-l', ['L1', 'L2'])).toBe('L3');
    expect(nextElementLabel('shunt-l', ['L1', 'L5'])).toBe('L6');
    expect(nextElementLabel('series-c', ['C1', 'CX', 'C10a'])).toBe('C2');
    expect(nextElementLabel('line', ['TL1', 'L1'])).toBe('TL2');
    expect(nextElementLabel('series-l', ['L1-k3f9', 'L1'])).toBe('L2');
    expect(nextElementLabel('series-l', ['L4-ab2c'])).toBe('L5');
  });
});

describe('allocateElementName', () => {
  it('gives the label and an id made of the label and a short suffix', () => {
    const { id, label } = allocateElementName('series-l', []);
    expect(label).toBe('L1');
    expect(id).toMatch(/^L1-[a-z2-9]{4}$/);
  });

  it('two tuners adding the same kind at once get the same label but different ids, and both inserts survive the merge', () => {
    const design = parseDesign(chipAntennaDesign());
    const a = createDesignDoc({ ...design, elements: [] });
    const b = new Y.Doc();
    Y.applyUpdate(b, Y.encodeStateAsUpdate(a));
    // each side allocates from the same state, as two tuners acting at the same instant do
    const na = allocateElementName('series-l', []);
    const nb = allocateElementName('series-l', []);
    expect(na.label).toBe(nb.label);
    expect(na.id).not.toBe(nb.id);
    insertElement(a, { ...defaultElement('series-l', na.id, design), label: na.label });
    insertElement(b, { ...defaultElement('series-l', nb.id, design), label: nb.label });
    Y.applyUpdate(a, Y.encodeStateAsUpdate(b));
    Y.applyUpdate(b, Y.encodeStateAsUpdate(a));
    expect(orderedElementIds(a).sort()).toEqual([na.id, nb.id].sort());
    expect(orderedElementIds(b)).toEqual(orderedElementIds(a));
  });

  it('with ids alone the same id from two sides would leave one element: the risk the suffix removes', () => {
    const design = parseDesign(chipAntennaDesign());
    const a = createDesignDoc({ ...design, elements: [] });
    const b = new Y.Doc();
    Y.applyUpdate(b, Y.encodeStateAsUpdate(a));
    insertElement(a, defaultElement('series-l', 'L1', design));
    insertElement(b, defaultElement('series-l', 'L1', design));
    Y.applyUpdate(a, Y.encodeStateAsUpdate(b));
    expect(orderedElementIds(a)).toEqual(['L1']);
    // and locally an existing id is refused outright
    expect(() => insertElement(a, defaultElement('series-l', 'L1', design))).toThrow(/already exists/);
  });

  it('never reuses a number whose id carries a suffix', () => {
    const seq = [0, 0, 0, 0, 0.5, 0.5, 0.5, 0.5];
    let i = 0;
    const random = () => seq[i++ % seq.length]!;
    const { id } = allocateElementName('series-l', ['L1-aaaa'], random);
    expect(id).toBe('L2-aaaa');
  });
});

describe('chainLayout and dropIndex', () => {
  it('puts the first element (next to the load) rightmost', () => {
    const l = chainLayout(3);
    expect(l.cellX(0)).toBeGreaterThan(l.cellX(1));
    expect(l.cellX(2)).toBeLessThan(l.cellX(1));
    expect(l.loadX).toBeGreaterThan(l.cellX(0));
  });

  it('turns a drop position back into the chain index moveElement takes', () => {
    const l = chainLayout(3);
    expect(dropIndex(l.cellX(0), 3)).toBe(0);
    expect(dropIndex(l.cellX(2), 3)).toBe(2);
    expect(dropIndex(l.cellX(1) + 10, 3)).toBe(1);
    expect(dropIndex(-500, 3)).toBe(2);
    expect(dropIndex(99999, 3)).toBe(0);
    expect(dropIndex(0, 1)).toBe(0);
  });
});

describe('element labels', () => {
  it('show the value with its unit', () => {
    expect(elementValueLabel({ id: 'L1', kind: 'series-l', value: 3.3e-9 })).toBe('3.3 nH');
    expect(elementValueLabel({ id: 'TL1', kind: 'line', z0: 50, length: { degrees: 45, atHz: 2.44e9 } })).toBe('50 Ω · 45°');
    expect(elementValueLabel({ id: 'T1', kind: 'transformer', ratio: 1.5 })).toBe('1 : 1.5');
  });
  it('describe an element for lists and screen readers', () => {
    expect(elementDescription({ id: 'C1', kind: 'shunt-c', value: 1.2e-12, q: 40, tolerance: { relative: 0.05 }, locked: true })).toBe(
      'C1, shunt C, 1.2 pF, Q 40, ±5 %, locked',
    );
  });
});
