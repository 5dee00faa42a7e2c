/**
 * Engine benchmark: analyze() on a 10-element chain (series L, shunt C, lines) at 1,001 and 100,001
 * points, the fast Zin-only path (chainZin) on the same chain, and in the same run the same network
 * through a plain numpy ABCD cascade and through scikit-rf (/usr/bin/python3,
 * tests/reference/bench_cascade.py). Prints medians and ratios against the targets:
 *   1,001 points: analyze() ≥ 2.5× faster than numpy and ≥ 100× faster than scikit-rf;
 *   100,001 points: analyze() ≥ 1.5× faster than numpy; analyze() within 2× of chainZin.
 * Run by tests/bench/run.ts, or alone: npx tsx tests/bench/engine.bench.ts
 */
import { execFileSync } from 'node:child_process';
import os from 'node:os';
import { analyze } from '../../shared/rf/analyze';
import { chainZin, sweepContext } from '../../shared/rf/cascade';
import { parseDesign, type Design, type DesignInput } from '../../shared/rf/design';

const CHAIN: DesignInput['elements'] = [
  { id: 'L1', kind: 'series-l', value: 1.2e-9 },
  { id: 'C1', kind: 'shunt-c', value: 0.8e-12 },
  { id: 'T1', kind: 'line', z0: 50, length: { degrees: 25, atHz: 2.44e9 } },
  { id: 'L2', kind: 'series-l', value: 2.2e-9 },
  { id: 'C2', kind: 'shunt-c', value: 1.5e-12 },
  { id: 'T2', kind: 'line', z0: 70, length: { degrees: 40, atHz: 2.44e9 } },
  { id: 'L3', kind: 'series-l', value: 0.9e-9 },
  { id: 'C3', kind: 'shunt-c', value: 0.5e-12 },
  { id: 'T3', kind: 'line', z0: 35, length: { meters: 0.01, velocityFactor: 0.7 } },
  { id: 'L4', kind: 'series-l', value: 1.8e-9 },
];
const LOAD: DesignInput['load'] = { kind: 'rlc', topology: 'series', r: 12, l: 1.5e-9, c: 2e-12 };
const START = 1e9;
const STOP = 4e9;

function design(points: number): Design {
  return parseDesign({
    format: 'matchloom-design',
    version: 1,
    referenceOhms: 50,
    load: LOAD,
    band: { startHz: 2.4e9, stopHz: 2.4835e9, centerHz: 2.44e9 },
    sweep: { startHz: START, stopHz: STOP, points, spacing: 'linear' },
    goal: { maxVswr: 2 },
    elements: CHAIN,
  });
}

/**
 * Median per-call wall times (ms) of `a` and `b`, measured in alternating batches so that a change
 * in the machine's load during the run affects both alike (the ratio is what the target is about).
 */
function pairedMedians(a: () => unknown, b: () => unknown, rounds: number, batch: number, warmup: number): [number, number] {
  for (let i = 0; i < warmup; i++) {
    a();
    b();
  }
  const ta: number[] = [];
  const tb: number[] = [];
  for (let r = 0; r < rounds; r++) {
    let t0 = performance.now();
    for (let k = 0; k < batch; k++) a();
    ta.push((performance.now() - t0) / batch);
    t0 = performance.now();
    for (let k = 0; k < batch; k++) b();
    tb.push((performance.now() - t0) / batch);
  }
  const median = (t: number[]) => [...t].sort((x, y) => x - y)[t.length >> 1];
  return [median(ta), median(tb)];
}

interface PythonTimes {
  numpy: Record<string, number>;
  skrf: Record<string, number>;
  zinSample: Record<string, [number, number][]>;
}

const ms = (x: number) => (x < 1 ? `${(x * 1000).toFixed(1)} µs` : `${x.toFixed(2)} ms`);
const ratio = (x: number) => `${x.toFixed(1)}×`;

export default async function engineBench(): Promise<void> {
  const d1 = design(1001);
  const d2 = design(100_001);
  const ctx1 = sweepContext(d1);
  const ctx2 = sweepContext(d2);
  const out1 = new Float64Array(2 * 1001);
  const out2 = new Float64Array(2 * 100_001);

  const [analyze1, zin1] = pairedMedians(() => analyze(d1), () => chainZin(ctx1, d1.elements, out1), 80, 5, 200);
  const [analyze2, zin2] = pairedMedians(() => analyze(d2), () => chainZin(ctx2, d2.elements, out2), 11, 1, 3);

  const job = {
    chain: { z0: 50, load: d1.load, elements: d1.elements },
    startHz: START,
    stopHz: STOP,
    runs: [
      { points: 1001, numpyReps: 200, skrfReps: 15 },
      { points: 100_001, numpyReps: 9, skrfReps: 0 },
    ],
  };
  let py: PythonTimes | null = null;
  try {
    py = JSON.parse(
      execFileSync('/usr/bin/python3', ['tests/reference/bench_cascade.py'], { input: JSON.stringify(job), encoding: 'utf8', maxBuffer: 64 << 20 }),
    ) as PythonTimes;
  } catch (e) {
    console.log(`engine bench: the numpy / scikit-rf side did not run (${(e as Error).message.split('\n')[0]})`);
  }

  // The same network on both sides: compare a few Zin values.
  let agreement = '';
  if (py) {
    const a = analyze(d1);
    const idx = [0, 500, 1000];
    const worst = Math.max(
      ...idx.map((i, k) => {
        const [re, im] = py!.zinSample['1001'][k];
        return Math.hypot(a.zin[2 * i] - re, a.zin[2 * i + 1] - im) / Math.hypot(re, im);
      }),
    );
    agreement = ` (Zin agrees with numpy to ${worst.toExponential(1)} relative)`;
  }

  const rows: [string, string, string][] = [
    ['analyze(), 10 elements × 1,001 points', ms(analyze1), ''],
    ['chainZin (Zin only), 1,001 points', ms(zin1), `analyze/chainZin = ${ratio(analyze1 / zin1)} (target ≤ 2×)`],
    ['analyze(), 10 elements × 100,001 points', ms(analyze2), ''],
    ['chainZin (Zin only), 100,001 points', ms(zin2), `analyze/chainZin = ${ratio(analyze2 / zin2)}`],
  ];
  if (py) {
    rows.push(['numpy ABCD cascade, 1,001 points', ms(py.numpy['1001']), `analyze is ${ratio(py.numpy['1001'] / analyze1)} faster (target ≥ 2.5×)`]);
    rows.push(['scikit-rf, 1,001 points', ms(py.skrf['1001']), `analyze is ${ratio(py.skrf['1001'] / analyze1)} faster (target ≥ 100×)`]);
    rows.push(['numpy ABCD cascade, 100,001 points', ms(py.numpy['100001']), `analyze is ${ratio(py.numpy['100001'] / analyze2)} faster (target ≥ 1.5×)`]);
  }
  console.log(`\nEngine (median wall times, analyze and chainZin in alternating batches; load average ${os.loadavg()[0].toFixed(1)} on ${os.cpus().length} cores)${agreement}`);
  const w0 = Math.max(...rows.map((r) => r[0].length));
  const w1 = Math.max(...rows.map((r) => r[1].length));
  for (const [a, b, c] of rows) console.log(`  ${a.padEnd(w0)}  ${b.padStart(w1)}  ${c}`);
}

const invokedDirectly = process.argv[1]?.endsWith('engine.bench.ts');
if (invokedDirectly) await engineBench();
