// Seeded random chains and loads for the reference comparisons and the property tests.
import { type Design, type Element } from '../../shared/rf/design';
import { logUniform } from './helpers';

export interface ChainOptions {
  lossy?: boolean;
  kinds?: readonly Element['kind'][];
  maxLength?: number;
}

const ALL_KINDS: Element['kind'][] = [
  'series-l',
  'series-c',
  'series-r',
  'shunt-l',
  'shunt-c',
  'shunt-r',
  'line',
  'open-stub',
  'short-stub',
  'transformer',
];

function length(rnd: () => number): Extract<Element, { kind: 'line' }>['length'] {
  if (rnd() < 0.5) return { degrees: 5 + rnd() * 295, atHz: logUniform(rnd, 0.5e9, 3e9) };
  return { meters: logUniform(rnd, 1e-3, 0.2), velocityFactor: 0.5 + rnd() * 0.5 };
}

export function randomElement(rnd: () => number, id: string, opts: ChainOptions = {}): Element {
  const kinds = opts.kinds ?? ALL_KINDS;
  const kind = kinds[Math.floor(rnd() * kinds.length)];
  const q = opts.lossy !== false && rnd() < 0.3 ? { q: logUniform(rnd, 10, 300) } : {};
  switch (kind) {
    case 'series-l':
    case 'shunt-l':
      return { id, kind, value: logUniform(rnd, 1e-10, 3e-8), ...q };
    case 'series-c':
    case 'shunt-c':
      return { id, kind, value: logUniform(rnd, 1e-13, 1e-10), ...q };
    case 'series-r':
      return { id, kind, value: logUniform(rnd, 1, 300) };
    case 'shunt-r':
      return { id, kind, value: logUniform(rnd, 10, 3000) };
    case 'line':
    case 'open-stub':
    case 'short-stub': {
      const loss = opts.lossy !== false && rnd() < 0.4 ? { lossDbPerM: logUniform(rnd, 0.1, 30) } : {};
      return { id, kind, z0: 20 + rnd() * 100, length: length(rnd), ...loss };
    }
    case 'transformer':
      return { id, kind, ratio: logUniform(rnd, 0.3, 3) };
    default:
      throw new Error(`randomElement: ${kind} not generated`);
  }
}

export function randomChain(rnd: () => number, opts: ChainOptions = {}): Element[] {
  const n = 1 + Math.floor(rnd() * (opts.maxLength ?? 8));
  return Array.from({ length: n }, (_, i) => randomElement(rnd, `e${i}`, opts));
}

export function randomLoad(rnd: () => number): Design['load'] {
  const u = rnd();
  if (u < 0.4) return { kind: 'impedance', ohms: [logUniform(rnd, 1, 300), (rnd() - 0.5) * 600] };
  const topology = u < 0.7 ? 'series' : 'parallel';
  const withL = rnd() < 0.7;
  const withC = !withL || rnd() < 0.6;
  return {
    kind: 'rlc',
    topology,
    r: topology === 'series' ? logUniform(rnd, 1, 200) : logUniform(rnd, 20, 2000),
    ...(withL ? { l: logUniform(rnd, 1e-10, 2e-8) } : {}),
    ...(withC ? { c: logUniform(rnd, 1e-13, 1e-10) } : {}),
  };
}
