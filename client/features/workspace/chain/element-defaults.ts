/**
 * A new element from the palette gets values that do something visible at the centre frequency:
 * an L or C whose reactance equals the reference impedance, lines and stubs an eighth of a
 * wavelength (45°) long at the centre, a resistor small in series and large in shunt.
 */
import { bandCenterHz, type Design, type Element, type ElementKind } from '../../../../shared/rf/design';
import { writeTouchstone } from '../../../../shared/rf/touchstone';

/** Two significant figures: a value one would find on a part reel (3.26 nH -> 3.3 nH). */
export function roundToFigures(value: number, figures = 2): number {
  if (!Number.isFinite(value) || value === 0) return value;
  return Number(value.toPrecision(figures));
}

type DesignContext = Pick<Design, 'band' | 'referenceOhms' | 'sweep'>;

/** A through connection (S21 = S12 = 1) over the sweep, so a new two-port changes nothing until a file is opened. */
export function throughTwoPortTouchstone(startHz: number, stopHz: number, referenceOhms: number): string {
  const freqs = startHz < stopHz ? [startHz, stopHz] : [startHz];
  const s = new Float64Array(freqs.length * 8);
  for (let i = 0; i < freqs.length; i++) {
    // row-major S11, S12, S21, S22 as (re, im) pairs
    s[i * 8 + 2] = 1;
    s[i * 8 + 4] = 1;
  }
  return writeTouchstone(
    { ports: 2, frequenciesHz: Float64Array.from(freqs), s, referenceOhms },
    { unit: 'Hz', comments: ['Matchloom: ideal through connection (placeholder until a measured .s2p is opened)'] },
  );
}

export function defaultElement(kind: ElementKind, id: string, design: DesignContext): Element {
  const f0 = bandCenterHz(design.band);
  const z0 = design.referenceOhms;
  const w0 = 2 * Math.PI * f0;
  const eighthWave = { degrees: 45, atHz: f0 };
  switch (kind) {
    case 'series-l':
    case 'shunt-l':
      return { id, kind, value: roundToFigures(z0 / w0) };
    case 'series-c':
    case 'shunt-c':
      return { id, kind, value: roundToFigures(1 / (w0 * z0)) };
    case 'series-r':
      return { id, kind, value: roundToFigures(z0 / 5) };
    case 'shunt-r':
      return { id, kind, value: roundToFigures(z0 * 20) };
    case 'line':
    case 'open-stub':
    case 'short-stub':
      return { id, kind, z0, length: eighthWave };
    case 'transformer':
      return { id, kind, ratio: 1.5 };
    case 'two-port':
      return {
        id,
        kind,
        touchstone: throughTwoPortTouchstone(
          Math.min(design.sweep.startHz, design.band.startHz),
          Math.max(design.sweep.stopHz, design.band.stopHz),
          z0,
        ),
      };
  }
}
