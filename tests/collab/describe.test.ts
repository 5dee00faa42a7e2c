// Room log wording: describeDesignChanges + changeSentence on documents built with the schema module.
// Values are invented; the wording is ours (common practice for reference designators: L, C, R, TL).
import { describe, expect, it } from 'vitest';
import type * as Y from 'yjs';
import {
  changeSentence,
  describeDesignChanges,
  designSnapshot,
  elementDesignators,
  frequencyRange,
  mergeChanges,
  type DesignChange,
} from '../../shared/collab/describe';
import {
  createDesignDoc,
  insertElement,
  moveElement,
  removeElement,
  replaceElements,
  setDesignField,
  setElementField,
} from '../../shared/collab/schema';
import type { Element } from '../../shared/rf/design';
import { designWith } from './helpers/world';

const chain: Element[] = [
  { id: 'a', kind: 'series-l', value: 3.3e-9 },
  { id: 'b', kind: 'shunt-c', value: 0.9e-12 },
  { id: 'c', kind: 'shunt-c', value: 1.2e-12 },
  { id: 'd', kind: 'line', z0: 50, length: { degrees: 90, atHz: 2.44e9 } },
];

/** The sentences for one edit made on a fresh document holding `chain`. */
function sentences(edit: (doc: Y.Doc) => void, elements: Element[] = chain): string[] {
  const doc = createDesignDoc(designWith(elements));
  const before = designSnapshot(doc)!;
  edit(doc);
  const after = designSnapshot(doc)!;
  doc.destroy();
  return describeDesignChanges(before, after).map(changeSentence);
}

describe('elementDesignators', () => {
  it('numbers each letter from the load end and prefers a label', () => {
    const names = elementDesignators([...chain, { id: 'e', kind: 'series-c', value: 1e-12, label: 'Cblock' }, { id: 'f', kind: 'open-stub', z0: 50, length: { degrees: 45, atHz: 1e9 } }]);
    expect([...names.values()]).toEqual(['L1', 'C1', 'C2', 'TL1', 'Cblock', 'TL2']);
  });
});

describe('describeDesignChanges + changeSentence', () => {
  it('an element value change names the element and both values in engineering units', () => {
    expect(sentences((d) => setElementField(d, 'c', 'value', 1.5e-12))).toEqual(['changed C2 from 1.2 pF to 1.5 pF']);
    expect(sentences((d) => setElementField(d, 'a', 'value', 4.7e-9))).toEqual(['changed L1 from 3.3 nH to 4.7 nH']);
  });

  it('other element fields read as "the <field> of <element>"', () => {
    expect(sentences((d) => setElementField(d, 'b', 'q', 60))).toEqual(['set the Q of C1 to 60']);
    expect(sentences((d) => setElementField(d, 'd', 'z0', 75))).toEqual(['changed the Z0 of TL1 from 50 Ω to 75 Ω']);
    expect(sentences((d) => setElementField(d, 'd', 'length', { degrees: 45, atHz: 2.44e9 }))).toEqual([
      'changed the length of TL1 from 90° at 2.44 GHz to 45° at 2.44 GHz',
    ]);
    expect(sentences((d) => setElementField(d, 'c', 'tolerance', { relative: 0.05 }))).toEqual(['set the tolerance of C2 to ±5 %']);
    expect(sentences((d) => setElementField(d, 'c', 'locked', true))).toEqual(['locked C2']);
    expect(sentences((d) => setElementField(d, 'c', 'label', 'Cmatch'))).toEqual(['renamed C2 to Cmatch']);
    expect(sentences((d) => setElementField(d, 'b', 'kind', 'series-c'))).toEqual(['changed C1 from shunt C to series C']);
  });

  it('adding, removing and moving elements', () => {
    expect(sentences((d) => insertElement(d, { id: 'n', kind: 'shunt-c', value: 2.2e-12 }))).toEqual(['added shunt C C3 (2.2 pF)']);
    expect(sentences((d) => removeElement(d, 'a'))).toEqual(['removed series L L1 (3.3 nH)']);
    expect(sentences((d) => moveElement(d, 'a', 2))).toEqual(['moved L1 to position 3 of 4 (from the load)']);
  });

  it('top-level fields', () => {
    expect(sentences((d) => setDesignField(d, 'band', { startHz: 2.3e9, stopHz: 2.5e9 }))).toEqual(['changed the band from 2.4–2.483 GHz to 2.3–2.5 GHz']);
    expect(sentences((d) => setDesignField(d, 'load', { kind: 'impedance', ohms: [25, -12] }))).toEqual(['changed the load from 18+j8 Ω to 25−j12 Ω']);
    expect(sentences((d) => setDesignField(d, 'goal', { minReturnLossDb: 15 }))).toEqual(['changed the goal from VSWR ≤ 2 to return loss ≥ 15 dB']);
    expect(sentences((d) => setDesignField(d, 'name', 'Whip, second pass'))).toEqual(['renamed the design from “Collab test design” to “Whip, second pass”']);
    expect(sentences((d) => setDesignField(d, 'drive', { powerW: 0.5 }))).toEqual(['set the drive power to 500 mW']);
    expect(sentences((d) => setDesignField(d, 'substrate', { epsilonR: 4.4, heightM: 1.6e-3 }))).toEqual(['set the substrate to εr 4.4, 1.6 mm thick']);
  });

  it('a whole new chain reads as one replacement; an empty one as cleared', () => {
    const next: Element[] = [
      { id: 'x', kind: 'series-c', value: 18.7e-12 },
      { id: 'y', kind: 'shunt-c', value: 13e-12 },
    ];
    expect(sentences((d) => replaceElements(d, next))).toEqual(['replaced the chain: series C C1 (18.7 pF), shunt C C2 (13 pF)']);
    expect(sentences((d) => replaceElements(d, []))).toEqual(['cleared the chain']);
  });

  it('many changes at once become one summary', () => {
    const s = sentences((d) => {
      for (const id of ['a', 'b', 'c']) setElementField(d, id, 'q', 40);
      for (const id of ['a', 'b', 'c']) setElementField(d, id, 'locked', true);
      setDesignField(d, 'referenceOhms', 75);
    });
    expect(s).toEqual(['made 7 changes to the design']);
  });

  it('nothing for an edit that changes nothing, and no throw on nonsense values', () => {
    expect(sentences((d) => setElementField(d, 'c', 'value', 1.2e-12))).toEqual([]);
    expect(sentences((d) => setElementField(d, 'c', 'value', 'lots'))).toEqual(['changed C2 from 1.2 pF to —']);
  });
});

describe('mergeChanges', () => {
  it('keeps the first "from" and the last "to"; back to the start reads as "back to"', () => {
    const doc = createDesignDoc(designWith(chain));
    const s0 = designSnapshot(doc)!;
    setElementField(doc, 'c', 'value', 1.3e-12);
    const s1 = designSnapshot(doc)!;
    setElementField(doc, 'c', 'value', 1.5e-12);
    const s2 = designSnapshot(doc)!;
    setElementField(doc, 'c', 'value', 1.2e-12);
    const s3 = designSnapshot(doc)!;
    const [c1] = describeDesignChanges(s0, s1);
    const [c2] = describeDesignChanges(s1, s2);
    const [c3] = describeDesignChanges(s2, s3);
    const m12 = mergeChanges(c1, c2)!;
    expect(changeSentence(m12)).toBe('changed C2 from 1.2 pF to 1.5 pF');
    expect(changeSentence(mergeChanges(m12, c3)!)).toBe('set C2 back to 1.2 pF');
    const other: DesignChange = { type: 'design-field', key: 'design:goal', field: 'goal', from: 1, to: 2 };
    expect(mergeChanges(c1, other)).toBeNull();
    doc.destroy();
  });
});

describe('frequencyRange', () => {
  it('shares the unit when both ends have the same prefix, to four digits', () => {
    expect(frequencyRange(433.05e6, 434.79e6)).toBe('433.1–434.8 MHz');
    expect(frequencyRange(900e6, 1.1e9)).toBe('900 MHz–1.1 GHz');
  });
});
