// `npm run analyze` end to end: the exact JSON on stdout, or one line and exit status 2 for bad input.
// The good design and one bad input run through tsx exactly as `npm run analyze` does; the other bad
// inputs run the same source bundled once by esbuild (tsx's own compiler), which starts several times
// faster, so the suite stays quick on a busy two-core machine.
import { spawn } from 'node:child_process';
import { buildSync } from 'esbuild';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { analyze } from '../../shared/rf/analyze';
import { parseDesign } from '../../shared/rf/design';
import { resultToJson } from '../../shared/rf/result';

const dir = mkdtempSync(join(tmpdir(), 'matchloom-cli-analyze-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));
const bundle = join(dir, 'analyze.mjs');
buildSync({ entryPoints: ['server/cli/analyze.ts'], bundle: true, platform: 'node', format: 'esm', outfile: bundle, logLevel: 'warning' });
const TSX = ['--import', 'tsx', 'server/cli/analyze.ts'];

interface Run {
  status: number | null;
  stdout: string;
  stderr: string;
}

function runAnalyze(args: string[], stdin?: string, entry: string[] = [bundle]): Promise<Run> {
  return new Promise((resolve, reject) => {
    const child = spawn(process.execPath, [...entry, ...args], { stdio: ['pipe', 'pipe', 'pipe'] });
    let stdout = '';
    let stderr = '';
    child.stdout.on('data', (b: Buffer) => (stdout += b.toString()));
    child.stderr.on('data', (b: Buffer) => (stderr += b.toString()));
    child.on('error', reject);
    child.on('close', (status) => resolve({ status, stdout, stderr }));
    child.stdin.end(stdin ?? '');
  });
}

const good = {
  format: 'matchloom-design',
  version: 1,
  name: '2.4 GHz chip antenna (invented)',
  referenceOhms: 50,
  load: { kind: 'rlc', topology: 'series', r: 12, l: 1.5e-9, c: 2e-12 },
  band: { startHz: 2.4e9, stopHz: 2.4835e9, centerHz: 2.44e9 },
  sweep: { startHz: 2e9, stopHz: 3e9, points: 51, spacing: 'linear' },
  goal: { maxVswr: 2 },
  drive: { powerW: 10 },
  elements: [
    { id: 'c1', kind: 'shunt-c', value: 1.1e-12 },
    { id: 'l1', kind: 'series-l', value: 2.7e-9, q: 60 },
    { id: 't1', kind: 'line', z0: 50, length: { degrees: 20, atHz: 2.44e9 } },
  ],
};

const file = (name: string, text: string) => {
  const p = join(dir, name);
  writeFileSync(p, text);
  return p;
};

const withOver = (over: (d: typeof good & Record<string, unknown>) => unknown) =>
  JSON.stringify(over(JSON.parse(JSON.stringify(good)) as typeof good & Record<string, unknown>));

const bad: [string, string, RegExp][] = [
  ['bad JSON', '{ "format": ', /^design: not valid JSON/],
  ['an unknown element kind', withOver((d) => ((d.elements[0] as Record<string, unknown>).kind = 'flux-capacitor', d)), /^elements\[0\]\.kind: unknown kind "flux-capacitor"/],
  ['a negative value', withOver((d) => ((d.elements[1] as Record<string, unknown>).value = -1e-9, d)), /^elements\[1\]\.value: must be a positive number of henries/],
  ['zero points', withOver((d) => ((d.sweep.points = 0), d)), /^sweep\.points: must be at least 1 point/],
  ['a Touchstone text that does not parse', withOver((d) => ((d as Record<string, unknown>).load = { kind: 'measured', touchstone: '# Hz S RI R 50\n2e9 0.1 nope\n' }, d)), /^load\.touchstone: line 2: /],
  ['a measured load outside the sweep', withOver((d) => ((d as Record<string, unknown>).load = { kind: 'measured', touchstone: '# Hz S RI R 50\n2e9 0.1 0\n2.5e9 0.2 0\n' }, d)), /^load\.touchstone: .*measured range/],
];

describe('npm run analyze (server/cli/analyze.ts)', () => {
  it('prints exactly resultToJson(analyze(design)) for a file, and the same for standard input (CONTRACT §3)', async () => {
    const text = JSON.stringify(good);
    const fromFile = await runAnalyze([file('good.matchloom.json', text)], undefined, TSX);
    const fromStdin = await runAnalyze(['-'], text);
    const want = JSON.parse(JSON.stringify(resultToJson(analyze(parseDesign(good)))));
    for (const run of [fromFile, fromStdin]) {
      expect(run.stderr).toBe('');
      expect(run.status).toBe(0);
      expect(JSON.parse(run.stdout)).toEqual(want);
      expect(run.stdout).not.toMatch(/NaN|Infinity/);
    }
  }, 60_000);

  it('through tsx, as npm runs it, a bad design exits 2 with one line (CONTRACT §3)', async () => {
    const run = await runAnalyze(['-'], bad[2][1], TSX);
    expect(run.status).toBe(2);
    expect(run.stderr.trim()).toMatch(bad[2][2]);
    expect(run.stderr.trim().split('\n')).toHaveLength(1);
  }, 60_000);

  it('bad input: exit status 2 and one line naming the JSON path and reason, never a stack trace (CONTRACT §3)', async () => {
    const runs: Run[] = [];
    for (const [name, text] of bad) runs.push(await runAnalyze([file(`${name.replace(/\W+/g, '-')}.json`, text)]));
    runs.forEach((run, k) => {
      const [name, , pattern] = bad[k];
      expect(run.status, name).toBe(2);
      expect(run.stdout, name).toBe('');
      const lines = run.stderr.split('\n').filter(Boolean);
      expect(lines, name).toHaveLength(1);
      expect(lines[0], name).toMatch(pattern);
      expect(run.stderr, name).not.toMatch(/\bat .*\.(ts|js):\d+/);
    });
  }, 60_000);

  it('a missing file and a missing argument are one-line errors with status 2', async () => {
    const [missing, none] = await Promise.all([runAnalyze([join(dir, 'nope.json')]), runAnalyze([])]);
    expect(missing.status).toBe(2);
    expect(missing.stderr.trim()).toMatch(/^design: cannot read .*nope\.json.*ENOENT/);
    expect(none.status).toBe(2);
    expect(none.stderr.trim().split('\n')).toHaveLength(1);
  }, 60_000);
});
