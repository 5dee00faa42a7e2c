import { describe, expect, it } from 'vitest';
import { analyze } from '../../shared/rf/analyze';
import { chainZin, sweepContext } from '../../shared/rf/cascade';
import { DesignError, type Design } from '../../shared/rf/design';
import { bandFrequencies, sweepFrequencies } from '../../shared/rf/frequency';
import { resultToJson } from '../../shared/rf/result';
import { designOf } from './helpers';

const F0 = 2.44e9;

/** A series RLC of R = 50 resonant at F0, with reactance slope set by L. */
function resonantLoad(l = 10e-9): Design['load'] {
  return { kind: 'rlc', topology: 'series', r: 50, l, c: 1 / ((2 * Math.PI * F0) ** 2 * l) };
}

/** All numbers in a JSON value are finite (no NaN/Infinity can hide as strings either). */
function expectCleanJson(value: unknown) {
  const text = JSON.stringify(value);
  expect(text).not.toMatch(/NaN|Infinity/);
  const walk = (v: unknown) => {
    if (typeof v === 'number') expect(Number.isFinite(v)).toBe(true);
    else if (Array.isArray(v)) v.forEach(walk);
    else if (v && typeof v === 'object') Object.values(v).forEach(walk);
  };
  walk(JSON.parse(text));
}

describe('analyze(): sweep grid', () => {
  it('linear spacing has equal steps and exact ends; log spacing equal ratios (CONTRACT §2 sweep)', () => {
    const lin = sweepFrequencies({ startHz: 1e9, stopHz: 2e9, points: 11, spacing: 'linear' });
    expect(lin[0]).toBe(1e9);
    expect(lin[10]).toBe(2e9);
    expect(lin[3]).toBeCloseTo(1.3e9, 3);
    const log = sweepFrequencies({ startHz: 1e6, stopHz: 1e9, points: 4, spacing: 'log' });
    expect(Array.from(log).map((f) => Math.round(f))).toEqual([1e6, 1e7, 1e8, 1e9]);
    expect(Array.from(sweepFrequencies({ startHz: 5e8, stopHz: 5e8, points: 1 }))).toEqual([5e8]);
  });
});

describe('bandFrequencies', () => {
  it('is the sweep points inside the band plus both edges, ascending, without duplicates (CONTRACT §3 worstInBand)', () => {
    const d = designOf({ band: { startHz: 2.4e9, stopHz: 2.5e9 }, sweep: { startHz: 2e9, stopHz: 3e9, points: 21 } });
    expect(Array.from(bandFrequencies(d))).toEqual([2.4e9, 2.45e9, 2.5e9]);
    const d2 = designOf({ band: { startHz: 2.41e9, stopHz: 2.52e9 }, sweep: { startHz: 2e9, stopHz: 3e9, points: 21 } });
    expect(Array.from(bandFrequencies(d2))).toEqual([2.41e9, 2.45e9, 2.5e9, 2.52e9]);
  });
});

describe('analyze(): bandwidth and worst in band', () => {
  it('bandwidth of a resonant series RLC matches the exact |Γ| = 1/3 crossings (Pozar 4th ed., §6.1 series resonator, from memory)', () => {
    const l = 10e-9;
    const load = resonantLoad(l);
    const c = (load as { c: number }).c;
    const a = analyze(designOf({ load, sweep: { startHz: 2e9, stopHz: 3e9, points: 20001 }, goal: { maxVswr: 2 } }));
    // |Γ| = |X|/|100 + jX| = 1/3  <=>  |X| = 100/√8; ωL − 1/(ωC) = ±X.
    const x = 100 / Math.sqrt(8);
    const root = (sign: number) => {
      const b = sign * x;
      const w = (b + Math.sqrt(b * b + (4 * l) / c)) / (2 * l);
      return w / (2 * Math.PI);
    };
    expect(a.bandwidth).not.toBeNull();
    expect(a.bandwidth!.lowHz).toBeCloseTo(root(-1), -2); // within 50 Hz on a 50 kHz grid
    expect(a.bandwidth!.highHz).toBeCloseTo(root(1), -2);
    expect(a.bandwidth!.fractional).toBeCloseTo((root(1) - root(-1)) / F0, 7);
  });

  it('crossings are linear interpolations of |Γ| between the bracketing sweep points (CONTRACT §3 bandwidth)', () => {
    const a = analyze(designOf({ load: resonantLoad(), sweep: { startHz: 2e9, stopHz: 3e9, points: 41 } }));
    const f = a.frequenciesHz;
    const g = a.gammaMagnitude;
    const m = 1 / 3;
    let k = 0;
    while (f[k + 1] <= F0 && !(g[k] > m && g[k + 1] <= m)) k++;
    const want = f[k + 1] + ((m - g[k + 1]) / (g[k] - g[k + 1])) * (f[k] - f[k + 1]);
    expect(a.bandwidth!.lowHz).toBeCloseTo(want, 3);
  });

  it('bandwidth is null where the goal fails at the centre, and reaches the sweep ends where it never fails (CONTRACT §3)', () => {
    expect(analyze(designOf({ load: { kind: 'impedance', ohms: [5, 0] } })).bandwidth).toBeNull();
    const matched = analyze(designOf({ load: { kind: 'impedance', ohms: [50, 0] } }));
    expect(matched.bandwidth).toEqual({ lowHz: 2e9, highHz: 3e9, fractional: 1e9 / F0 });
  });

  it('worstInBand includes both band edges, computed exactly there, even with no sweep point inside the band (CONTRACT §3)', () => {
    const d = designOf({ load: resonantLoad(), sweep: { startHz: 2e9, stopHz: 3e9, points: 3 } });
    const a = analyze(d);
    const edges = chainZin(sweepContext(d, Float64Array.of(2.4e9, 2.4835e9)), []);
    const gammaAt = (k: number) => Math.hypot(edges[2 * k] - 50, edges[2 * k + 1]) / Math.hypot(edges[2 * k] + 50, edges[2 * k + 1]);
    const worst = Math.max(gammaAt(0), gammaAt(1));
    expect(a.worstInBand.gammaMagnitude).toBeCloseTo(worst, 14);
    expect(a.worstInBand.vswr).toBeCloseTo((1 + worst) / (1 - worst), 12);
    expect(a.worstInBand.returnLossDb).toBeCloseTo(-20 * Math.log10(worst), 12);
  });
});

describe('analyze(): power and stress', () => {
  it('powerToLoad equals 1 − |Γ|² for a lossless chain (CONTRACT §3; common practice)', () => {
    const a = analyze(
      designOf({
        load: { kind: 'rlc', topology: 'parallel', r: 200, c: 1e-12 },
        port: { impedance: [50, 20] },
        elements: [
          { id: 'a', kind: 'series-l', value: 3e-9 },
          { id: 'b', kind: 'shunt-c', value: 1e-12 },
          { id: 'c', kind: 'line', z0: 70, length: { degrees: 40, atHz: F0 } },
          { id: 'd', kind: 'transformer', ratio: 0.8 },
        ],
      }),
    );
    for (let i = 0; i < a.frequenciesHz.length; i++) expect(a.powerToLoad[i]).toBeCloseTo(1 - a.gammaMagnitude[i] ** 2, 12);
  });

  it('powerToLoad is less with loss: a 10 Ω series R before a 50 Ω load delivers 4·50·50/110² (common practice)', () => {
    const a = analyze(designOf({ elements: [{ id: 'r', kind: 'series-r', value: 10 }] }));
    expect(a.powerToLoad[0]).toBeCloseTo((4 * 50 * 50) / 110 ** 2, 14);
    expect(1 - a.gammaMagnitude[0] ** 2).toBeGreaterThan(a.powerToLoad[0]);
  });

  it('stressAtCenter: 10 W into a matched 50 Ω chain is 31.6 V and 0.632 A peak (CONTRACT §3 example; P = V²/(2R))', () => {
    const c = 0.5e-12;
    const l = 0.2e-9;
    const matched = analyze(
      designOf({ drive: { powerW: 10 }, elements: [{ id: 'line', kind: 'line', z0: 50, length: { degrees: 77, atHz: F0 } }] }),
    );
    expect(matched.stressAtCenter![0].voltagePeak).toBeCloseTo(Math.sqrt(1000), 10);
    expect(matched.stressAtCenter![0].currentPeak).toBeCloseTo(Math.sqrt(0.4), 10);
    const a = analyze(
      designOf({
        drive: { powerW: 10 },
        elements: [
          { id: 'l', kind: 'series-l', value: l },
          { id: 'c', kind: 'shunt-c', value: c },
        ],
      }),
    );
    const s = Object.fromEntries(a.stressAtCenter!.map((x) => [x.id, x]));
    const w = 2 * Math.PI * F0;
    // A series part carries the load current; the shunt C sees the port voltage: V = ωL·I, I = ωC·V.
    expect(s.l.voltagePeak).toBeCloseTo(w * l * s.l.currentPeak, 12);
    expect(s.c.currentPeak).toBeCloseTo(w * c * s.c.voltagePeak, 12);
    // Power balance: ½·|I_load|²·50 is the delivered power, P·(1 − |Γ|²) for this lossless chain.
    const g2 = a.centerGamma ** 2;
    expect(0.5 * s.l.currentPeak ** 2 * 50).toBeCloseTo(10 * (1 - g2), 10);
  });

  it('stressAtCenter is null without a drive (engine convention)', () => {
    expect(analyze(designOf({ elements: [{ id: 'l', kind: 'series-l', value: 1e-9 }] })).stressAtCenter).toBeNull();
  });

  it('stagesAtCenter lists the load then each element, matching chainZin of each prefix', () => {
    const d = designOf({
      load: { kind: 'impedance', ohms: [12, -30] },
      elements: [
        { id: 'x', kind: 'series-l', value: 2e-9 },
        { id: 'y', kind: 'shunt-c', value: 1.5e-12 },
        { id: 'z', kind: 'short-stub', z0: 50, length: { degrees: 60, atHz: F0 } },
      ],
    });
    const a = analyze(d);
    expect(a.stagesAtCenter.map((s) => s.after)).toEqual(['load', 'x', 'y', 'z']);
    expect(a.stagesAtCenter[0].z).toEqual([12, -30]);
    const ctx = sweepContext(d, Float64Array.of(F0));
    for (let k = 1; k <= 3; k++) {
      const z = chainZin(ctx, d.elements.slice(0, k));
      expect(a.stagesAtCenter[k].z[0]).toBeCloseTo(z[0], 9);
      expect(a.stagesAtCenter[k].z[1]).toBeCloseTo(z[1], 9);
    }
  });
});

describe('analyze(): edge loads never give NaN (engine conventions, README)', () => {
  const chain = [
    { id: 'a', kind: 'series-c' as const, value: 1e-12 },
    { id: 'b', kind: 'shunt-l' as const, value: 5e-9 },
  ];
  const loads: [string, Design['load']][] = [
    ['a short', { kind: 'impedance', ohms: [0, 0] }],
    ['a pure reactance', { kind: 'impedance', ohms: [0, 50] }],
    ['a matched load', { kind: 'impedance', ohms: [50, 0] }],
    ['a near-open', { kind: 'impedance', ohms: [1e300, 0] }],
    ['a measured open (Γ = 1 exactly)', { kind: 'measured', touchstone: '# Hz S RI R 50\n1e9 1 0\n5e9 1 0\n' }],
    ['a lossless parallel LC at resonance (an open)', { kind: 'rlc', topology: 'parallel', r: 1e308, l: 1e-9, c: 1 / ((2 * Math.PI * F0) ** 2 * 1e-9) }],
  ];
  for (const [name, load] of loads)
    for (const elements of [[], chain]) {
      it(`${name} with ${elements.length ? 'a chain' : 'no chain'} gives clean JSON`, () => {
        const r = resultToJson(analyze(designOf({ load, elements, drive: { powerW: 1 } })));
        expectCleanJson(r);
      });
    }

  it('a pure reactance reflects everything: |Γ| = 1, VSWR and mismatch loss null, return loss 0 (CONTRACT §1)', () => {
    const j = resultToJson(analyze(designOf({ load: { kind: 'impedance', ohms: [0, 50] } })));
    expect(j.vswr.every((v) => v === null)).toBe(true);
    expect(j.mismatchLossDb.every((v) => v === null)).toBe(true);
    expect(j.returnLossDb.every((v) => v !== null && Math.abs(v) < 1e-12)).toBe(true);
    expect(j.worstInBand.vswr).toBeNull();
    expect(j.bandwidth).toBeNull();
  });

  it('a matched load: |Γ| = 0, VSWR 1, return loss 300 dB by convention, limit null (no reactance)', () => {
    const j = resultToJson(analyze(designOf({})));
    expect(j.vswr[0]).toBe(1);
    expect(j.returnLossDb[0]).toBeCloseTo(300, 9);
    expect(j.limit).toBeNull();
  });

  it('a zero-length shorted stub shorts the chain: Zin ≈ 0, Γ ≈ −1, finite S', () => {
    const r = resultToJson(analyze(designOf({ elements: [{ id: 's', kind: 'short-stub', z0: 50, length: { degrees: 0, atHz: F0 } }] })));
    expectCleanJson(r);
    expect(r.gamma[0][0]).toBeCloseTo(-1, 12);
    expect(Math.hypot(...r.s.s21[0])).toBeLessThan(1e-50);
  });
});

describe('analyze(): measured and table loads', () => {
  const s1p = (rows: [number, number, number][], ref = 50) =>
    [`! invented test data`, `# Hz S RI R ${ref}`, ...rows.map(([f, re, im]) => `${f} ${re} ${im}`)].join('\n');

  it('a measured .s1p load is interpolated linearly in re/im of Γ on the file’s reference (CONTRACT §2)', () => {
    const text = s1p(
      [
        [1e9, 0.5, 0.1],
        [2e9, 0.1, -0.4],
        [3e9, -0.3, 0.2],
      ],
      75,
    );
    const d = designOf({ load: { kind: 'measured', touchstone: text }, sweep: { startHz: 1e9, stopHz: 3e9, points: 5 } });
    const a = analyze(d);
    // At 1.5 GHz, Γ = (0.3, −0.15) on 75 Ω -> Z = 75(1 + Γ)/(1 − Γ).
    const [gr, gi] = [0.3, -0.15];
    const dr = 1 - gr, di = -gi, nr = 1 + gr, ni = gi, den = dr * dr + di * di;
    expect(a.zin[2]).toBeCloseTo((75 * (nr * dr + ni * di)) / den, 12);
    expect(a.zin[3]).toBeCloseTo((75 * (ni * dr - nr * di)) / den, 12);
  });

  it('a sweep outside the measured range is a DesignError at load.touchstone naming the range (CONTRACT §2)', () => {
    const text = s1p([
      [2e9, 0.5, 0.1],
      [2.5e9, 0.1, -0.4],
    ]);
    let err: unknown;
    try {
      analyze(designOf({ load: { kind: 'measured', touchstone: text } }));
    } catch (e) {
      err = e;
    }
    expect(err).toBeInstanceOf(DesignError);
    expect((err as DesignError).path).toBe('load.touchstone');
    expect((err as DesignError).message).toMatch(/^load\.touchstone: .*measured range.*2(\.0+)? ?GHz.*2\.5 ?GHz/);
  });

  it('a Touchstone text that does not parse is a DesignError naming the path and the line (CONTRACT §3)', () => {
    const bad = '# Hz S RI R 50\n1e9 0.1 0.2\n2e9 oops 0.3\n';
    expect(() => analyze(designOf({ load: { kind: 'measured', touchstone: bad } }))).toThrow(/^load\.touchstone: line 3: /);
    const bad2 = '# Hz S RI R 50\n1e9 0 0 1 0 1 0 0 0\n3e9 0 0 1 0 x 0 0 0\n';
    const d = designOf({ elements: [{ id: 'x', kind: 'series-l', value: 1e-9 }, { id: 'tp', kind: 'two-port', touchstone: bad2 }] });
    expect(() => analyze(d)).toThrow(/^elements\[1\]\.touchstone: line 3: /);
  });

  it('a table load interpolates Γ linearly and refuses frequencies outside it at load.points (CONTRACT §2)', () => {
    const d = designOf({
      load: { kind: 'table', points: [[1e9, 50, 0], [3e9, 150, 0]] },
      sweep: { startHz: 1e9, stopHz: 3e9, points: 3 },
    });
    const a = analyze(d);
    // Γ goes 0 -> 0.5; at the middle Γ = 0.25 -> Z = 50·1.25/0.75.
    expect(a.zin[2]).toBeCloseTo((50 * 1.25) / 0.75, 12);
    expect(() => analyze({ ...d, sweep: { ...d.sweep, stopHz: 3.1e9 } })).toThrow(/^load\.points: .*outside the table/);
  });
});

describe('resultToJson', () => {
  it('has exactly the fields of CONTRACT §3 with [re, im] pairs', () => {
    const j = resultToJson(analyze(designOf({ load: resonantLoad(), drive: { powerW: 2 }, elements: [{ id: 'q', kind: 'series-l', value: 1e-9 }] })));
    expect(Object.keys(j).sort()).toEqual(
      ['frequenciesHz', 'zin', 'gamma', 'vswr', 'returnLossDb', 'mismatchLossDb', 'powerToLoad', 's', 'stagesAtCenter', 'bandwidth', 'worstInBand', 'limit', 'stressAtCenter'].sort(),
    );
    expect(Object.keys(j.s).sort()).toEqual(['s11', 's12', 's21', 's22']);
    expect(j.zin[0]).toHaveLength(2);
    expect(j.frequenciesHz).toHaveLength(101);
    expect(Object.keys(j.worstInBand).sort()).toEqual(['returnLossDb', 'vswr']);
    expect(Object.keys(j.stressAtCenter![0]).sort()).toEqual(['currentPeak', 'id', 'voltagePeak']);
    expectCleanJson(j);
  });
});

describe('checks on chains built in code', () => {
  it('chainZin refuses a negative or non-finite value with a DesignError naming the element (never NaN)', () => {
    const d = designOf({});
    const ctx = sweepContext(d);
    expect(() => chainZin(ctx, [{ id: 'a', kind: 'series-l', value: 1e-9 }, { id: 'b', kind: 'shunt-c', value: -1e-12 }])).toThrow(
      /^elements\[1\]\.value: must be a positive number of farads/,
    );
    expect(() => chainZin(ctx, [{ id: 'a', kind: 'line', z0: 50, length: { degrees: NaN, atHz: 1e9 } }])).toThrow(/^elements\[0\]\.length\.degrees: /);
    expect(() => chainZin(ctx, [{ id: 't', kind: 'transformer', ratio: 0 }])).toThrow(/^elements\[0\]\.ratio: /);
  });

  it('a measured two-port that does not cover the sweep is a DesignError at elements[i].touchstone naming the range', () => {
    const s2p = '# Hz S RI R 50\n2.1e9 0.1 0 0.9 0 0.9 0 0.1 0\n2.9e9 0.1 0 0.9 0 0.9 0 0.1 0\n';
    expect(() => analyze(designOf({ elements: [{ id: 'tp', kind: 'two-port', touchstone: s2p }] }))).toThrow(
      /^elements\[0\]\.touchstone: .*outside the measured range/,
    );
  });
});
