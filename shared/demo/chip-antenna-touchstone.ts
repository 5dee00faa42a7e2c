/**
 * An invented `.s1p` "measurement" of the demo's 2.4 GHz chip antenna: the series RLC model of
 * designs.ts (R 18 Ω, L 3.9 nH, C 1.3 pF) seen from a 50 Ω port, 1.8–3.2 GHz in 10 MHz steps, with a
 * little seeded noise on Γ (σ = 0.004 per part) so it reads like bench data. The same text every time.
 */
import { writeTouchstone } from '../rf/touchstone';
import { prngFrom, prngNormal } from '../rf/prng';

export const CHIP_ANTENNA_S1P_NAME = 'chip-antenna-fr4-bench.s1p';

const R = 18;
const L = 3.9e-9;
const C = 1.3e-12;
const Z0 = 50;
const NOISE_SIGMA = 0.004;
const SEED = 2441;

const round6 = (x: number) => Math.round(x * 1e6) / 1e6;

export function chipAntennaTouchstone(): string {
  const startHz = 1.8e9;
  const stepHz = 10e6;
  const points = 141;
  const prng = prngFrom(SEED);
  const freqs = new Float64Array(points);
  const s = new Float64Array(points * 2);
  for (let i = 0; i < points; i++) {
    const f = startHz + i * stepHz;
    const w = 2 * Math.PI * f;
    // Z = R + j(ωL − 1/(ωC)); Γ = (Z − Z0)/(Z + Z0)
    const x = w * L - 1 / (w * C);
    const den = (R + Z0) ** 2 + x * x;
    const re = ((R - Z0) * (R + Z0) + x * x) / den;
    const im = (x * (R + Z0) - (R - Z0) * x) / den;
    freqs[i] = f;
    s[2 * i] = round6(re + NOISE_SIGMA * prngNormal(prng));
    s[2 * i + 1] = round6(im + NOISE_SIGMA * prngNormal(prng));
  }
  return writeTouchstone(
    { ports: 1, frequenciesHz: freqs, s, referenceOhms: Z0 },
    {
      format: 'RI',
      unit: 'GHz',
      comments: [
        'Invented demo data: 2.4 GHz ceramic chip antenna on 1.6 mm FR-4, module edge feed',
        'From a series RLC model (R 18 ohm, L 3.9 nH, C 1.3 pF) with seeded noise; not a real measurement',
      ],
    },
  );
}
