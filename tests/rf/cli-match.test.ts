import { execFile } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

interface Run {
  code: number;
  stdout: string;
  stderr: string;
}
const run = (script: string, args: string[]): Promise<Run> =>
  new Promise((resolve) => {
    execFile(process.execPath, ['--import', 'tsx', `server/cli/${script}.ts`, ...args], { cwd: process.cwd(), timeout: 60_000 }, (err, stdout, stderr) => {
      const code = err ? (typeof (err as { code?: unknown }).code === 'number' ? ((err as { code: number }).code) : 1) : 0;
      resolve({ code, stdout, stderr });
    });
  });

let dir = '';
let good = '';
let bad = '';
let notJson = '';
beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'matchloom-cli-'));
  good = join(dir, 'good.matchloom.json');
  bad = join(dir, 'bad.matchloom.json');
  notJson = join(dir, 'broken.json');
  const design = {
    format: 'matchloom-design',
    version: 1,
    name: 'CLI test',
    referenceOhms: 50,
    load: { kind: 'rlc', topology: 'series', r: 12, l: 1.5e-9, c: 2e-12 },
    band: { startHz: 2.4e9, stopHz: 2.4835e9, centerHz: 2.44e9 },
    sweep: { startHz: 2.3e9, stopHz: 2.6e9, points: 61 },
    goal: { maxVswr: 2 },
    elements: [
      { id: 'C1', kind: 'series-c', value: 2.2e-12, tolerance: { relative: 0.05 } },
      { id: 'L1', kind: 'shunt-l', value: 1.5e-9, tolerance: { relative: 0.05 } },
    ],
  };
  writeFileSync(good, JSON.stringify(design));
  writeFileSync(bad, JSON.stringify({ ...design, elements: [{ id: 'X', kind: 'series-l', value: -1 }] }));
  writeFileSync(notJson, '{ "format": ');
});
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('match, refine and yield command lines', { timeout: 60_000 }, () => {
  it('match prints candidates whose elements are chains of the design format, and --keep keeps elements (CONTRACT §3)', async () => {
    const [all, keep] = await Promise.all([run('match', [good]), run('match', [good, '--keep', '1'])]);
    expect(all.code).toBe(0);
    const out = JSON.parse(all.stdout);
    expect(Array.isArray(out.candidates)).toBe(true);
    expect(out.candidates.length).toBeGreaterThan(5);
    for (const c of out.candidates) {
      expect(typeof c.topology).toBe('string');
      expect(Array.isArray(c.elements)).toBe(true);
      for (const e of c.elements) expect(typeof e.id).toBe('string');
      expect(c.gammaAtCenter).toBeLessThan(1e-9);
    }
    expect(out.explanation).toBeUndefined();
    expect(keep.code).toBe(0);
    for (const c of JSON.parse(keep.stdout).candidates) expect(c.elements[0].id).toBe('C1');
  });

  it('refine prints { design, worstInBand, iterations } with a design no worse than the input (CONTRACT §3)', async () => {
    const r = await run('refine', [good, '--max-evaluations', '400']);
    expect(r.code).toBe(0);
    const out = JSON.parse(r.stdout);
    expect(out.design.format).toBe('matchloom-design');
    expect(out.design.elements).toHaveLength(2);
    expect(typeof out.iterations).toBe('number');
    expect(out.worstInBand.vswr).toBeGreaterThan(1);
    expect(out.worstInBand.gamma).toBeLessThanOrEqual(out.initialWorstGamma);
  });

  it('yield with the same seed prints the same numbers in the contract shape (CONTRACT §3)', async () => {
    const [a, b] = await Promise.all([run('yield', [good, '--trials', '300', '--seed', '7']), run('yield', ['--trials', '300', '--seed', '7', good])]);
    expect(a.code).toBe(0);
    expect(a.stdout).toBe(b.stdout);
    const out = JSON.parse(a.stdout);
    expect(out.trials).toBe(300);
    expect(out.passFraction).toBeGreaterThanOrEqual(0);
    expect(out.passFraction).toBeLessThanOrEqual(1);
    for (const k of ['p50', 'p95', 'max']) expect(typeof out.worstVswr[k]).toBe('number');
    expect(out.sensitivity.map((s: { id: string }) => s.id).sort()).toEqual(['C1', 'L1']);
  });

  it('bad input and bad flags exit with status 2 and one line on standard error (CONTRACT §3)', { timeout: 90_000 }, async () => {
    const runs = [
      ...(await Promise.all([run('match', [bad]), run('match', [notJson]), run('match', [good, '--keep', '9'])])),
      ...(await Promise.all([run('refine', [good, '--snap', 'E7']), run('yield', [good, '--trials', 'many']), run('yield', [good, '--colour', 'red'])])),
    ];
    for (const r of runs) {
      expect(r.code).toBe(2);
      expect(r.stdout).toBe('');
      expect(r.stderr.trim().split('\n')).toHaveLength(1);
      expect(r.stderr).not.toMatch(/\bat .*\.ts:\d+/);
    }
    expect(runs[0].stderr).toMatch(/^elements\[0\]\.value/);
    expect(runs[2].stderr).toMatch(/keep/);
    expect(runs[4].stderr).toMatch(/--trials/);
  });
});
