import { describe, expect, it } from 'vitest';
import { analyze } from '../../shared/rf/index';
import { parseDesign, type Design, type DesignInput, type Element } from '../../shared/rf/design';
import { findMatches, MatchOptionError } from '../../shared/rf/match';
import { prngFrom, prngUniform } from '../../shared/rf/prng';
import { isPreferred } from '../../shared/rf/eseries';

const FC = 1e9;
function designOf(load: DesignInput['load'], extra: Partial<DesignInput> = {}): Design {
  return parseDesign({
    format: 'matchloom-design',
    version: 1,
    referenceOhms: 50,
    load,
    band: { startHz: 0.95 * FC, stopHz: 1.05 * FC, centerHz: FC },
    sweep: { startHz: 0.9 * FC, stopHz: 1.1 * FC, points: 21 },
    goal: { maxVswr: 2 },
    elements: [],
    ...extra,
  });
}

/** |Γ| at the centre of the design with its chain replaced, as the analysis core computes it. */
const centerGammaOf = (d: Design, elements: Element[]) => analyze({ ...d, elements }).centerGamma;

describe('findMatches', () => {
  it('findMatches: every candidate for 300 seeded random loads is a perfect match at the centre by analyze() (common practice: the definition of a match)', () => {
    const prng = prngFrom(20261201);
    let checked = 0;
    for (let k = 0; k < 300; k++) {
      const r = Math.exp(Math.log(0.5) + prngUniform(prng) * Math.log(4000)); // 0.5 .. 2000 Ω
      const x = (prngUniform(prng) * 2 - 1) * 1000;
      const complexPort = k % 10 === 9;
      const d = designOf({ kind: 'impedance', ohms: [r, x] }, complexPort ? { port: { impedance: [35, 15] } } : {});
      const res = findMatches(d);
      expect(res.explanation).toBeUndefined();
      expect(res.candidates.length).toBeGreaterThan(complexPort ? 1 : 6);
      for (const c of res.candidates) {
        expect(centerGammaOf(d, c.elements)).toBeLessThan(1e-9);
        checked++;
      }
    }
    expect(checked).toBeGreaterThan(3000);
  });

  it('findMatches matches table and measured (Touchstone) loads at the centre, interpolated as the analysis core does (common practice)', () => {
    // an invented series RLC, 8 Ω + 4 nH + 5 pF, sampled at 11 points
    const freqs = Array.from({ length: 11 }, (_, i) => 0.8 * FC + (0.4 * FC * i) / 10);
    const zOf = (f: number): [number, number] => [8, 2 * Math.PI * f * 4e-9 - 1 / (2 * Math.PI * f * 5e-12)];
    const table = designOf({ kind: 'table', points: freqs.map((f) => [f, ...zOf(f)] as [number, number, number]) });
    const lines = freqs.map((f) => {
      const [r, x] = zOf(f);
      const d = (r + 50) ** 2 + x * x;
      return `${f} ${((r - 50) * (r + 50) + x * x) / d} ${(2 * x * 50) / d}`;
    });
    const measured = designOf({ kind: 'measured', touchstone: `! invented\n# Hz S RI R 50\n${lines.join('\n')}\n` });
    for (const d of [table, measured]) {
      const res = findMatches(d);
      expect(res.candidates.length).toBeGreaterThan(6);
      for (const c of res.candidates) expect(centerGammaOf(d, c.elements)).toBeLessThan(1e-9);
    }
  });

  it('findMatches offers all four L-sections when both conditions hold (20 + j60 Ω to 50 Ω; common practice)', () => {
    const res = findMatches(designOf({ kind: 'impedance', ohms: [20, 60] }));
    const ls = res.candidates.filter((c) => c.family === 'l-section');
    expect(ls).toHaveLength(4);
    expect(new Set(ls.map((c) => c.topology))).toEqual(new Set(['l-shunt-series', 'l-series-shunt']));
  });

  it('findMatches offers a degenerate L-section as one element (50 + j30 Ω: a series C; common practice)', () => {
    const d = designOf({ kind: 'impedance', ohms: [50, 30] });
    const single = findMatches(d).candidates.filter((c) => c.family === 'single-element');
    expect(single).toHaveLength(1);
    expect(single[0].elements).toHaveLength(1);
    expect(single[0].elements[0].kind).toBe('series-c');
    expect(centerGammaOf(d, single[0].elements)).toBeLessThan(1e-12);
  });

  it('findMatches ranks candidates by worst in-band |Γ|, and snapped alternatives carry E-series values and their own figures (common practice)', () => {
    const d = designOf({ kind: 'rlc', topology: 'series', r: 12, l: 15e-9, c: 4e-12 });
    const res = findMatches(d);
    const worst = res.candidates.map((c) => c.worstInBand.gamma);
    expect([...worst].sort((a, b) => a - b)).toEqual(worst);
    const lumped = res.candidates.find((c) => c.family === 'l-section')!;
    expect(lumped.snapped.map((s) => s.series)).toEqual(['E12', 'E24']);
    for (const s of lumped.snapped) {
      for (const e of s.elements) if ('value' in e) expect(isPreferred(e.value, s.series)).toBe(true);
      const a = analyze({ ...d, elements: s.elements });
      expect(s.gammaAtCenter).toBeCloseTo(a.centerGamma, 12);
    }
    // ids are readable and unique
    for (const c of res.candidates) {
      const ids = c.elements.map((e) => e.id);
      expect(new Set(ids).size).toBe(ids.length);
      for (const id of ids) expect(id).toMatch(/^(C|L|TL|ST)\d+$/);
    }
  });

  it('findMatches covers pi, tee, stubs and transformers with their families (common practice)', () => {
    const res = findMatches(designOf({ kind: 'impedance', ohms: [15, -25] }), { qs: [3, 6] });
    const families = new Set(res.candidates.map((c) => c.family));
    for (const f of ['l-section', 'pi', 'tee', 'stub', 'quarter-wave', 'binomial', 'chebyshev']) expect(families.has(f as never)).toBe(true);
    expect(res.candidates.filter((c) => c.family === 'pi').every((c) => c.q === 3 || c.q === 6)).toBe(true);
    const stubs = res.candidates.filter((c) => c.family === 'stub');
    expect(stubs).toHaveLength(4);
    for (const c of stubs) for (const e of c.elements) if ('length' in e && 'degrees' in e.length) expect(e.length.degrees).toBeLessThan(180);
  });

  it('findMatches uses a direct quarter-wave transformer for a real load, √(Z0·R) (Pozar §5.4, from memory)', () => {
    const res = findMatches(designOf({ kind: 'impedance', ohms: [400, 0] }));
    const qw = res.candidates.find((c) => c.topology === 'quarter-wave')!;
    expect(qw.elements).toHaveLength(1);
    const line = qw.elements[0] as Extract<Element, { kind: 'line' }>;
    expect(line.z0).toBeCloseTo(Math.sqrt(20000), 9);
    expect(qw.theoryFractionalBandwidth).toBeGreaterThan(0);
  });

  it('findMatches skips an even Chebyshev count with a note (a ripple peak sits at the centre; Pozar §5.8, from memory)', () => {
    const res = findMatches(designOf({ kind: 'impedance', ohms: [200, 0] }), { chebyshevSections: [2, 3] });
    expect(res.notes.some((n) => /odd/.test(n))).toBe(true);
    expect(res.candidates.filter((c) => c.family === 'chebyshev').map((c) => c.topology)).toEqual(['chebyshev-3']);
  });

  it('findMatches keeps the first N chain elements and matches what they present (common practice)', () => {
    const d = designOf({ kind: 'impedance', ohms: [10, 5] }, {
      elements: [
        { id: 'C1', kind: 'shunt-c', value: 3e-12 },
        { id: 'L1', kind: 'series-l', value: 2e-9 },
      ],
    });
    const res = findMatches(d, { keep: 1 });
    expect(res.candidates.length).toBeGreaterThan(5);
    for (const c of res.candidates) {
      expect(c.elements[0]).toEqual(d.elements[0]);
      expect(c.elements.filter((e) => e.id === 'C1')).toHaveLength(1);
      expect(centerGammaOf(d, c.elements)).toBeLessThan(1e-9);
    }
    expect(() => findMatches(d, { keep: 3 })).toThrow(MatchOptionError);
  });

  it('findMatches on loads at the chart edge returns nothing and explains why (common practice: a lossless network cannot match a lossless load)', () => {
    const cases: [DesignInput['load'], Partial<DesignInput>, RegExp][] = [
      [{ kind: 'impedance', ohms: [0, 0] }, {}, /short circuit/],
      [{ kind: 'impedance', ohms: [0, 35] }, {}, /pure reactance/],
      [{ kind: 'rlc', topology: 'series', r: 0, l: 10e-9 }, {}, /pure reactance/],
      [{ kind: 'impedance', ohms: [1e-7, 30] }, {}, /almost a pure reactance/],
      // a short seen through a quarter-wave line is an open
      [{ kind: 'impedance', ohms: [0, 0] }, { elements: [{ id: 'TL1', kind: 'line', z0: 50, length: { degrees: 90, atHz: FC } }] }, /open circuit/],
    ];
    for (const [load, extra, why] of cases) {
      const d = designOf(load, extra);
      const res = findMatches(d, { keep: d.elements.length });
      expect(res.candidates).toEqual([]);
      expect(res.explanation).toMatch(why);
    }
  });

  it('findMatches on a matched load says "already matched", also after kept elements (100 Ω through a 70.7 Ω quarter wave; Pozar §5.4, from memory)', () => {
    expect(findMatches(designOf({ kind: 'impedance', ohms: [50, 0] })).explanation).toMatch(/^Already matched/);
    const d = designOf({ kind: 'impedance', ohms: [100, 0] }, { elements: [{ id: 'TL1', kind: 'line', z0: Math.sqrt(5000), length: { degrees: 90, atHz: FC } }] });
    const res = findMatches(d, { keep: 1 });
    expect(res.candidates).toEqual([]);
    expect(res.explanation).toMatch(/^Already matched/);
    // with a complex port, "matched" means Zs*
    const conj = findMatches(designOf({ kind: 'impedance', ohms: [30, -20] }, { port: { impedance: [30, 20] } }));
    expect(conj.explanation).toMatch(/^Already matched/);
  });

  it('findMatches rejects a bad option with MatchOptionError (common practice)', () => {
    const d = designOf({ kind: 'impedance', ohms: [20, 5] });
    expect(() => findMatches(d, { qs: [-1] })).toThrow(MatchOptionError);
    expect(() => findMatches(d, { chebyshevRipple: 2 })).toThrow(MatchOptionError);
    expect(() => findMatches(d, { keep: 0.5 })).toThrow(MatchOptionError);
  });
});
