/**
 * Benchmarks of the match finder, refine and the yield run (targets: finder < 5 ms, refine < 300 ms,
 * yield of 10,000 trials < 1 s, on one core), and the limit-gauge ratio refine reaches with 2 and 4
 * elements on a parallel-RC load. Run by tests/bench/run.ts, or alone: npx tsx tests/bench/match.bench.ts
 */
import os from 'node:os';
import { analyze } from '../../shared/rf/index';
import { parseDesign, type Design, type DesignInput } from '../../shared/rf/design';
import { findMatches } from '../../shared/rf/match';
import { refineDesign } from '../../shared/rf/refine';
import { yieldRun } from '../../shared/rf/yield';
import { ladderLimitForDesign } from '../../shared/rf/ladder-limit';

/** Median wall time and median CPU time (user + system of this process) per run, in ms. On a shared
 * machine the CPU time is the fairer figure for "on one core". */
function timed<T>(fn: () => T, repeats: number, warmup = 2): { ms: number; cpuMs: number; value: T } {
  let value = fn();
  for (let i = 1; i < warmup; i++) value = fn();
  const times: number[] = [];
  const cpu: number[] = [];
  for (let i = 0; i < repeats; i++) {
    const c0 = process.cpuUsage();
    const t0 = performance.now();
    value = fn();
    times.push(performance.now() - t0);
    const c = process.cpuUsage(c0);
    cpu.push((c.user + c.system) / 1000);
  }
  const median = (a: number[]) => [...a].sort((x, y) => x - y)[Math.floor(a.length / 2)];
  return { ms: median(times), cpuMs: median(cpu), value };
}
const fmt = (t: { ms: number; cpuMs: number }, digits = 0) => `${t.ms.toFixed(digits)} ms wall, ${t.cpuMs.toFixed(digits)} ms CPU`;

const base = (load: DesignInput['load'], band: DesignInput['band'], sweep: DesignInput['sweep'], elements: DesignInput['elements'] = []): Design =>
  parseDesign({ format: 'matchloom-design', version: 1, referenceOhms: 50, load, band, sweep, goal: { maxVswr: 2 }, elements });

function loadAverage(): string {
  return os.loadavg()[0].toFixed(1);
}

export default async function matchBench(): Promise<void> {
  const rows: [string, string, string][] = [];

  // 1. Finder on a complex load (the demo chip antenna's series RLC), 501-point sweep.
  const antenna = base({ kind: 'rlc', topology: 'series', r: 12, l: 1.5e-9, c: 2e-12 }, { startHz: 2.4e9, stopHz: 2.4835e9, centerHz: 2.44e9 }, { startHz: 2e9, stopHz: 3e9, points: 501 });
  const finder = timed(() => findMatches(antenna), 100, 20);
  rows.push(['match finder, series-RLC load, 501-point sweep', `${fmt(finder, 2)} (median of 100)`, `< 5 ms; ${finder.value.candidates.length} candidates`]);

  // 2. Refine a 4-element ladder on a parallel-RC load (200 Ω ∥ 2 pF, Q = 6.1) over 2.2–2.7 GHz (20 %),
  //    which a 2-element L-section cannot cover at VSWR 2.
  const band = { startHz: 2.2e9, stopHz: 2.7e9, centerHz: 2.44e9 };
  const sweep = { startHz: 1.8e9, stopHz: 3.1e9, points: 201 };
  const rc = { kind: 'rlc' as const, topology: 'parallel' as const, r: 200, c: 2e-12 };
  const four: DesignInput['elements'] = [
    { id: 'L1', kind: 'series-l', value: 2e-9, tolerance: { relative: 0.05 } },
    { id: 'L2', kind: 'shunt-l', value: 0.4e-9, tolerance: { relative: 0.05 } },
    { id: 'L3', kind: 'series-l', value: 1e-9, tolerance: { relative: 0.05 } },
    { id: 'C1', kind: 'shunt-c', value: 1e-12, tolerance: { relative: 0.05 } },
  ];
  const d4 = base(rc, band, sweep, four);
  const r4 = timed(() => refineDesign(d4), 5, 1);
  rows.push(['refine, 4-element ladder on 200 Ω ∥ 2 pF, 2.2–2.7 GHz', `${fmt(r4)} (median of 5)`, `< 300 ms; worst |Γ| ${r4.value.initialWorstGamma.toFixed(3)} → ${r4.value.worstInBand.gamma.toFixed(4)} (VSWR ${r4.value.worstInBand.vswr?.toFixed(3)}), ${r4.value.evaluations} evaluations`]);

  const lsection = findMatches(base(rc, band, sweep)).candidates.find((c) => c.family === 'l-section')!;
  const d2 = base(rc, band, sweep, lsection.elements);
  const r2 = timed(() => refineDesign(d2), 5, 1);
  rows.push(['refine, 2-element L-section, same load and band', `${fmt(r2)} (median of 5)`, `worst |Γ| ${r2.value.initialWorstGamma.toFixed(3)} → ${r2.value.worstInBand.gamma.toFixed(4)}`]);

  // Limit gauge: the refined chains' bandwidth at VSWR 2 against Bode–Fano, and the ladder gauge's rows.
  const gauge = ladderLimitForDesign(d4)!;
  for (const [n, r] of [[2, r2.value], [4, r4.value]] as const) {
    const a = analyze(r.design);
    const frac = a.bandwidth?.fractional ?? 0;
    const row = gauge.rows[n / 2 - 1];
    rows.push([
      `limit gauge, ${n} elements after refine`,
      `ratio ${a.limit ? a.limit.ratio.toFixed(3) : 'n/a'}`,
      `bandwidth ${(100 * frac).toFixed(1)} % vs Bode–Fano ${(100 * gauge.bodeFanoFractional).toFixed(1)} %; ladder gauge for ${n} parts ${(100 * row.maxFractional).toFixed(1)} % (${row.ofBodeFano.toFixed(3)} of Bode–Fano)`,
    ]);
  }

  // 3. Yield run: 10,000 trials on the refined 4-element chain over the 201-point sweep (envelope on).
  const y = timed(() => yieldRun(r4.value.design, { trials: 10_000, seed: 7, sensitivityTrials: 0 }), 3, 1);
  rows.push(['yield run, 10,000 trials, 4 elements, 201 points', `${fmt(y)} (median of 3)`, `< 1 s; pass ${(100 * y.value.passFraction).toFixed(1)} %, worst VSWR p50 ${y.value.worstVswr.p50.toFixed(3)} p95 ${y.value.worstVswr.p95.toFixed(3)}`]);
  const ys = timed(() => yieldRun(r4.value.design, { trials: 10_000, seed: 7 }), 1, 1);
  rows.push(['yield run, same, with per-part sensitivity (4 × 500 trials)', fmt(ys), `most harmful part ${ys.value.sensitivity[0]?.id}`]);

  const w = [Math.max(...rows.map((r) => r[0].length)), Math.max(...rows.map((r) => r[1].length))];
  console.log(`\nmatch finder / refine / yield (1-min load average ${loadAverage()} on ${os.cpus().length} cores)`);
  for (const r of rows) console.log(`  ${r[0].padEnd(w[0])}  ${r[1].padEnd(w[1])}  ${r[2]}`);
}

if (import.meta.url === `file://${process.argv[1]}`) void matchBench();
