// analyze() and chainZin() against scikit-rf (open reference library) on seeded random chains:
// lumped parts (with and without finite Q), lossless and lossy lines in both length forms, open and
// shorted stubs, ideal transformers, and measured two-ports written as Touchstone text.
import { describe, expect, it } from 'vitest';
import { analyze } from '../../shared/rf/analyze';
import { chainZin, sweepContext } from '../../shared/rf/cascade';
import { type Element } from '../../shared/rf/design';
import { writeTouchstone } from '../../shared/rf/touchstone';
import { designOf, maxRelativeError, seededRandom, skrfAvailable, skrfChains, type SkrfCase } from './helpers';
import { randomChain, randomLoad } from './random-chains';

const HAVE_SKRF = skrfAvailable();
if (!HAVE_SKRF)
  console.warn(
    '\n\n*** SKIPPING the scikit-rf reference tests: /usr/bin/python3 cannot import skrf. Install python3-scikit-rf (CI does). ***\n\n',
  );

const TOL = 1e-9; // both sides are exact double-precision evaluations of the same network

describe.skipIf(!HAVE_SKRF)('analyze() against scikit-rf (scikit-rf 0.15 Network cascade)', () => {
  const rnd = seededRandom(20261201);
  const designs = Array.from({ length: 80 }, (_, k) => {
    const log = rnd() < 0.5;
    const start = 0.2e9 + rnd() * 1e9;
    return designOf({
      load: randomLoad(rnd),
      sweep: { startHz: start, stopHz: start * (2 + rnd() * 8), points: 21, spacing: log ? 'log' : 'linear' },
      band: { startHz: start * 1.2, stopHz: start * 1.5 },
      elements: randomChain(rnd, { maxLength: k < 10 ? 2 : 8 }),
    });
  });
  const results = HAVE_SKRF
    ? skrfChains(
        designs.map((d) => {
          const a = analyze(d);
          return { freqs: Array.from(a.frequenciesHz), z0: d.referenceOhms, load: d.load, elements: d.elements };
        }),
      )
    : [];

  it('Zin of 80 seeded random chains agrees to 1e-9 relative (scikit-rf: (chain ** load).z)', () => {
    let worst = 0;
    designs.forEach((d, k) => {
      const a = analyze(d);
      const e = maxRelativeError(a.zin, results[k].zin);
      if (e > worst) worst = e;
      expect(e, `case ${k}: ${JSON.stringify(d.elements)}`).toBeLessThan(TOL);
    });
    expect(worst).toBeLessThan(TOL);
  });

  it('chainZin (the fast path) gives the same Zin (scikit-rf)', () => {
    designs.forEach((d, k) => {
      const ctx = sweepContext(d);
      expect(maxRelativeError(chainZin(ctx, d.elements), results[k].zin), `case ${k}`).toBeLessThan(TOL);
    });
  });

  it('chain S-parameters S11, S21, S12, S22 agree to 1e-9 (scikit-rf: chain.s on 50 Ω)', () => {
    designs.forEach((d, k) => {
      const a = analyze(d);
      for (const key of ['s11', 's21', 's12', 's22'] as const)
        expect(maxRelativeError(a.s[key], results[k][key]), `case ${k} ${key}`).toBeLessThan(TOL);
    });
  });
});

describe.skipIf(!HAVE_SKRF)('measured two-ports against scikit-rf', () => {
  // A device chain D is written as an .s2p (from scikit-rf's S on 75 Ω); the design [X, two-port(D), Y]
  // must match scikit-rf's [X, ...D, Y]; flipped, it must match [X, ...reverse(D), Y].
  const rnd = seededRandom(7);
  const freqs = Array.from({ length: 31 }, (_, i) => 1e9 + i * 0.05e9);
  const device: Element[] = [
    { id: 'd0', kind: 'series-l', value: 4.7e-9, q: 40 },
    { id: 'd1', kind: 'shunt-c', value: 1.2e-12 },
    { id: 'd2', kind: 'line', z0: 35, length: { meters: 0.021, velocityFactor: 0.7 }, lossDbPerM: 3 },
    { id: 'd3', kind: 'series-c', value: 3.3e-12 },
  ];
  const before = randomChain(rnd, { maxLength: 3, kinds: ['series-l', 'shunt-c', 'line'] });
  const after = randomChain(rnd, { maxLength: 3, kinds: ['shunt-l', 'series-c', 'open-stub'] }).map((e, i) => ({ ...e, id: `y${i}` }));
  const load = { kind: 'rlc' as const, topology: 'series' as const, r: 20, l: 2e-9 };
  const cases: SkrfCase[] = HAVE_SKRF
    ? [
        { freqs, z0: 50, load, elements: device, sZ0: 75 } as SkrfCase,
        { freqs, z0: 50, load, elements: [...before, ...device, ...after] },
        { freqs, z0: 50, load, elements: [...before, ...[...device].reverse(), ...after] },
      ]
    : [];
  const [dev, straight, mirrored] = HAVE_SKRF ? skrfChains(cases) : [];

  const s2p = () => {
    const s = new Float64Array(8 * freqs.length);
    freqs.forEach((_, i) => {
      const o = 8 * i;
      [dev.s11[i], dev.s12[i], dev.s21[i], dev.s22[i]].forEach(([re, im], k) => {
        s[o + 2 * k] = re;
        s[o + 2 * k + 1] = im;
      });
    });
    return writeTouchstone({ ports: 2, frequenciesHz: Float64Array.from(freqs), s, referenceOhms: 75 }, { format: 'RI', unit: 'Hz' });
  };

  for (const flipped of [false, true]) {
    it(`a two-port ${flipped ? 'flipped (port 2 toward the port)' : 'with port 1 toward the port'} cascades like its parts (scikit-rf)`, () => {
      const design = designOf({
        load,
        sweep: { startHz: freqs[0], stopHz: freqs[freqs.length - 1], points: freqs.length },
        band: { startHz: 1.5e9, stopHz: 2e9 },
        elements: [...before, { id: 'tp', kind: 'two-port', touchstone: s2p(), flipped }, ...after],
      });
      const a = analyze(design);
      const want = flipped ? mirrored : straight;
      // The .s2p text carries every digit (RI, shortest round-trip decimals), so agreement stays near double precision.
      expect(maxRelativeError(a.zin, want.zin)).toBeLessThan(TOL);
      for (const key of ['s11', 's21', 's12', 's22'] as const) expect(maxRelativeError(a.s[key], want[key]), key).toBeLessThan(TOL);
    });
  }
});
