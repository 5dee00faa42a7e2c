// Chains with lines and stubs against an ngspice AC analysis (open reference simulator): lossless T
// lines, open stubs as T lines with a floating far end, shorted stubs with the far end grounded.
import { describe, expect, it } from 'vitest';
import { chainZin, sweepContext } from '../../shared/rf/cascade';
import { type DesignInput } from '../../shared/rf/design';
import { ngspiceNetlist } from '../reference/ngspice-netlist';
import { designOf, maxRelativeError, ngspiceAvailable, ngspiceRows } from './helpers';

const HAVE_NGSPICE = ngspiceAvailable();
if (!HAVE_NGSPICE) console.warn('\n\n*** SKIPPING the ngspice reference tests: ngspice is not installed (CI installs it). ***\n\n');

// ngspice writes 16 significant digits and solves the circuit in double precision, so 1e-9 leaves
// a wide margin. The grids avoid frequencies where a line is exactly an odd number of quarter
// waves: there ngspice 39's T line reports a zero imaginary part (seen while writing this test),
// a defect of that point only.
const TOL = 1e-9;
const SWEEP = { points: 201, startHz: 0.5e9, stopHz: 4e9 };

const chains: { name: string; design: Partial<DesignInput> }[] = [
  {
    name: 'series RLC load; open stub, line, series C, shorted stub, line (degrees form)',
    design: {
      load: { kind: 'rlc', topology: 'series', r: 18, l: 2.2e-9, c: 1.5e-12 },
      elements: [
        { id: 'os', kind: 'open-stub', z0: 62, length: { degrees: 47.3, atHz: 2.44e9 } },
        { id: 'ln', kind: 'line', z0: 35, length: { degrees: 71.9, atHz: 2.44e9 } },
        { id: 'cs', kind: 'series-c', value: 2.7e-12 },
        { id: 'ss', kind: 'short-stub', z0: 80, length: { degrees: 33.1, atHz: 2.44e9 } },
        { id: 'l2', kind: 'line', z0: 50, length: { degrees: 123.4, atHz: 2.44e9 } },
      ],
    },
  },
  {
    name: 'parallel RC load; shorted stub, series L, line (metres form), open stub, shunt C',
    design: {
      load: { kind: 'rlc', topology: 'parallel', r: 180, c: 1.1e-12 },
      elements: [
        { id: 'ss', kind: 'short-stub', z0: 45, length: { meters: 0.0173, velocityFactor: 0.69 } },
        { id: 'ls', kind: 'series-l', value: 3.9e-9 },
        { id: 'ln', kind: 'line', z0: 75, length: { meters: 0.0411, velocityFactor: 0.83 } },
        { id: 'os', kind: 'open-stub', z0: 28, length: { meters: 0.0097, velocityFactor: 0.55 } },
        { id: 'cp', kind: 'shunt-c', value: 0.68e-12 },
      ],
    },
  },
  {
    name: 'resistive load behind a quarter-wave-ish transformer section and a stub pair',
    design: {
      load: { kind: 'impedance', ohms: [12.5, 0] },
      elements: [
        { id: 'q', kind: 'line', z0: 25, length: { degrees: 88.7, atHz: 1.9e9 } },
        { id: 'a', kind: 'open-stub', z0: 50, length: { degrees: 20.2, atHz: 1.9e9 } },
        { id: 'b', kind: 'short-stub', z0: 50, length: { degrees: 151.7, atHz: 1.9e9 } },
        { id: 'r', kind: 'series-r', value: 3.3 },
        { id: 'g', kind: 'shunt-l', value: 12e-9 },
      ],
    },
  },
];

describe.skipIf(!HAVE_NGSPICE)('chainZin against ngspice AC analysis (ngspice 39, lossless T lines)', () => {
  for (const { name, design: over } of chains) {
    it(`Zin of ${name} agrees to 1e-9 relative (ngspice)`, () => {
      const design = designOf({ ...over, sweep: { ...SWEEP, spacing: 'linear' } });
      const rows = ngspiceRows(ngspiceNetlist(design, SWEEP));
      expect(rows.length).toBe(SWEEP.points);
      const freqs = Float64Array.from(rows.map((r) => r[0]));
      const zin = chainZin(sweepContext(design, freqs), design.elements);
      expect(maxRelativeError(zin, rows.map((r) => [r[1], r[2]] as [number, number]))).toBeLessThan(TOL);
    });
  }
});
