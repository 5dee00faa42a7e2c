// Shared helpers of the engine tests: design builders, tolerances, a seeded PRNG, the reference runners.
import { execFileSync, spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { parseDesign, type Design, type DesignInput, type Element } from '../../shared/rf/design';

export const PYTHON = '/usr/bin/python3';

/** A checked design with defaults for everything not given. */
export function designOf(over: Partial<DesignInput> = {}): Design {
  return parseDesign({
    format: 'matchloom-design',
    version: 1,
    name: 'test',
    referenceOhms: 50,
    load: { kind: 'impedance', ohms: [50, 0] },
    band: { startHz: 2.4e9, stopHz: 2.4835e9, centerHz: 2.44e9 },
    sweep: { startHz: 2e9, stopHz: 3e9, points: 101, spacing: 'linear' },
    goal: { maxVswr: 2 },
    elements: [],
    ...over,
  });
}

/** |a − b| ≤ rel·max(|a|, |b|, floor) for complex numbers. */
export function complexClose(a: readonly [number, number], b: readonly [number, number], rel: number, floor = 1): boolean {
  const d = Math.hypot(a[0] - b[0], a[1] - b[1]);
  return d <= rel * Math.max(Math.hypot(a[0], a[1]), Math.hypot(b[0], b[1]), floor);
}

/** Largest relative difference between an interleaved series and a list of [re, im]. */
export function maxRelativeError(got: Float64Array, want: readonly (readonly [number, number])[], floor = 1): number {
  let worst = 0;
  for (let i = 0; i < want.length; i++) {
    const g: [number, number] = [got[2 * i], got[2 * i + 1]];
    const w = want[i];
    const d = Math.hypot(g[0] - w[0], g[1] - w[1]) / Math.max(Math.hypot(w[0], w[1]), Math.hypot(g[0], g[1]), floor);
    if (!(d <= worst)) worst = d;
  }
  return worst;
}

/** mulberry32: a small seeded PRNG (deterministic tests). */
export function seededRandom(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** Log-uniform value in [lo, hi]. */
export function logUniform(rnd: () => number, lo: number, hi: number): number {
  return lo * Math.pow(hi / lo, rnd());
}

/** True when /usr/bin/python3 can import scikit-rf (with the numpy aliases it still needs). */
export function skrfAvailable(): boolean {
  const r = spawnSync(PYTHON, ['-c', 'import numpy; numpy.complex=complex; numpy.float=float; numpy.int=int; import skrf'], {
    encoding: 'utf8',
  });
  return r.status === 0;
}

export function ngspiceAvailable(): boolean {
  return spawnSync('ngspice', ['-v'], { encoding: 'utf8' }).status === 0;
}

/** Run a Python script of tests/reference with a JSON value on stdin; returns the parsed JSON it prints. */
export function runPythonJson<T>(script: string, input: unknown, args: string[] = []): T {
  const out = execFileSync(PYTHON, [join('tests/reference', script), ...args], {
    input: JSON.stringify(input),
    encoding: 'utf8',
    maxBuffer: 256 * 1024 * 1024,
  });
  return JSON.parse(out) as T;
}

export interface SkrfCase {
  sZ0?: number;
  freqs: number[];
  z0: number;
  load: Design['load'];
  elements: Element[];
}
export interface SkrfResult {
  zin: [number, number][];
  s11: [number, number][];
  s12: [number, number][];
  s21: [number, number][];
  s22: [number, number][];
}

/** Batch many chains into one scikit-rf call. */
export function skrfChains(cases: SkrfCase[]): SkrfResult[] {
  return runPythonJson<{ results: SkrfResult[] }>('skrf_chain.py', { cases }).results;
}

/** Run an ngspice netlist in batch mode; the netlist writes `wrdata <file> ...` to the placeholder OUTFILE. Returns the numeric rows. */
export function ngspiceRows(netlist: string): number[][] {
  const dir = mkdtempSync(join(tmpdir(), 'matchloom-ngspice-'));
  try {
    const out = join(dir, 'out.txt');
    const cir = join(dir, 'chain.cir');
    writeFileSync(cir, netlist.replace('OUTFILE', out));
    execFileSync('ngspice', ['-b', cir], { encoding: 'utf8', stdio: ['ignore', 'pipe', 'pipe'] });
    return readFileSync(out, 'utf8')
      .trim()
      .split('\n')
      .slice(1)
      .map((l) => l.trim().split(/\s+/).map(Number));
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}
