import { describe, expect, it } from 'vitest';
import { ELEMENT_KINDS, elementSchema, type Design } from '../../shared/rf/design';
import { parseTouchstone } from '../../shared/rf/touchstone';
import { defaultElement, roundToFigures } from '../../client/features/workspace/chain/element-defaults';
import { allocateElementId } from '../../client/features/workspace/chain/element-ids';
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

describe('allocateElementId', () => {
  it('starts at 1 for each prefix', () => {
    expect(allocateElementId('series-l', [])).toBe('L1');
    expect(allocateElementId('shunt-c', ['L1'])).toBe('C1');
    expect(allocateElementId('line', [])).toBe('TL1');
    expect(allocateElementId('short-stub', [])).toBe('ST1');
    expect(allocateElementId('transformer', [])).toBe('T1');
  });

  it('goes past the highest number in use and never repeats one', () => {
    expect(allocateElementId('series-l', ['L1', 'L2'])).toBe('L3');
    expect(allocateElementId('shunt-l', ['L1', 'L5'])).toBe('L6');
    expect(allocateElementId('series-c', ['C1', 'CX', 'C10a'])).toBe('C2');
    expect(allocateElementId('line', ['TL1', 'L1'])).toBe('TL2');
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
