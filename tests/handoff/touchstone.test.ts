// network.s2p and matched-input.s1p from a real server, read back by the project's own Touchstone
// parser and by scikit-rf (open reference library), against the engine's analysis of the room's design.
import { execFileSync } from 'node:child_process';
import { writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { analyze, type AnalysisResult } from '../../shared/rf/analyze';
import { parseDesign, type Design } from '../../shared/rf/design';
import { parseTouchstone } from '../../shared/rf/touchstone';
import { startTestServer, type TestServer } from '../server/helpers/test-server';
import { chainDesign, PYTHON, roomWithMembers, skrfAvailable, type RoomWithMembers } from './helpers';

const HAVE_SKRF = skrfAvailable();
if (!HAVE_SKRF) console.warn('\n*** SKIPPING the scikit-rf checks of the hand-off Touchstone files: /usr/bin/python3 cannot import skrf. ***\n');

/** Largest |a − b| / max(|a|, |b|, 1e-12) over an interleaved series and a [re, im] list. */
function worstRelative(got: ArrayLike<number>, want: Float64Array): number {
  let worst = 0;
  for (let i = 0; i < want.length; i += 2) {
    const d = Math.hypot(got[i] - want[i], got[i + 1] - want[i + 1]);
    const m = Math.max(Math.hypot(want[i], want[i + 1]), Math.hypot(got[i], got[i + 1]), 1e-12);
    worst = Math.max(worst, d / m);
  }
  return worst;
}

const flat = (pairs: number[][]): number[] => pairs.flat();

describe('hand-off Touchstone files', () => {
  let server: TestServer;
  let room: RoomWithMembers;
  let design: Design;
  let result: AnalysisResult;
  let s2p: string;
  let s1p: string;

  beforeAll(async () => {
    server = await startTestServer();
    room = await roomWithMembers(server, 'Touchstone room', chainDesign());
    design = parseDesign((await room.owner.get(`/api/rooms/${room.roomId}/design`).expect(200)).body);
    result = analyze(design);
    s2p = (await room.observer.get(`/api/rooms/${room.roomId}/exports/network.s2p`).expect(200)).text;
    s1p = (await room.observer.get(`/api/rooms/${room.roomId}/exports/matched-input.s1p`).expect(200)).text;
  });
  afterAll(async () => {
    await server?.close();
  });

  it('network.s2p names the room and the port convention in its comment header', () => {
    const comments = s2p.split('\n').filter((l) => l.startsWith('!'));
    expect(comments.join('\n')).toContain('Room: Touchstone room');
    expect(comments.join('\n')).toContain('port 1 = port (source) side, port 2 = load side');
    expect(s2p).toMatch(/^# GHz S RI R 50$/m);
    expect([...s2p].every((c) => c.charCodeAt(0) < 128)).toBe(true); // ASCII only
  });

  it('network.s2p parsed by the project parser gives the chain S-parameters exactly (RI at full precision)', () => {
    const t = parseTouchstone(s2p, { ports: 2 });
    expect(t.ports).toBe(2);
    expect(t.referenceOhms).toBe(50);
    expect(Array.from(t.frequenciesHz)).toEqual(Array.from(result.frequenciesHz));
    const n = result.frequenciesHz.length;
    const pick = (k: number) => {
      const out = new Float64Array(2 * n);
      for (let i = 0; i < n; i++) {
        out[2 * i] = t.s[8 * i + 2 * k];
        out[2 * i + 1] = t.s[8 * i + 2 * k + 1];
      }
      return out;
    };
    // Row-major S11, S12, S21, S22 (shared/rf/touchstone.ts); written with String(x), read back exactly.
    expect(worstRelative(pick(0), result.s.s11)).toBe(0);
    expect(worstRelative(pick(1), result.s.s12)).toBe(0);
    expect(worstRelative(pick(2), result.s.s21)).toBe(0);
    expect(worstRelative(pick(3), result.s.s22)).toBe(0);
  });

  it('matched-input.s1p parsed by the project parser is Γ at the port over the sweep', () => {
    const t = parseTouchstone(s1p, { ports: 1 });
    expect(t.referenceOhms).toBe(50);
    expect(Array.from(t.frequenciesHz)).toEqual(Array.from(result.frequenciesHz));
    expect(worstRelative(t.s, result.gamma)).toBe(0);
  });

  it.skipIf(!HAVE_SKRF)('scikit-rf reads both files back to the analysis within 1e-9 relative (scikit-rf 0.15 Touchstone reader)', () => {
    const a = join(server.dir, 'network.s2p');
    const b = join(server.dir, 'matched-input.s1p');
    writeFileSync(a, s2p);
    writeFileSync(b, s1p);
    const out = JSON.parse(execFileSync(PYTHON, [join(__dirname, 'read_touchstone.py'), a, b], { encoding: 'utf8' })) as {
      files: { f: number[]; z0: number[]; s: number[][][][] }[];
    };
    const [net, input] = out.files;
    const fr = Array.from(result.frequenciesHz);
    expect(net.f.length).toBe(fr.length);
    net.f.forEach((f, i) => expect(Math.abs(f - fr[i]) / fr[i]).toBeLessThan(1e-12));
    expect(net.z0).toEqual([50, 50]);
    // scikit-rf s[i][j] is S(i+1)(j+1): S21 = s[1][0] (port 2 = load side, driven from port 1 = port side).
    expect(worstRelative(flat(net.s[0][0]), result.s.s11)).toBeLessThan(1e-9);
    expect(worstRelative(flat(net.s[1][0]), result.s.s21)).toBeLessThan(1e-9);
    expect(worstRelative(flat(net.s[0][1]), result.s.s12)).toBeLessThan(1e-9);
    expect(worstRelative(flat(net.s[1][1]), result.s.s22)).toBeLessThan(1e-9);
    expect(input.z0).toEqual([50]);
    expect(worstRelative(flat(input.s[0][0]), result.gamma)).toBeLessThan(1e-9);
  });

  it('a complex port impedance gives Zin on the reference instead, and says so', async () => {
    const port: [number, number] = [40, 15];
    const other = await room.owner.post('/api/rooms').send({ name: 'Complex port', design: chainDesign({ port: { impedance: port } }) }).expect(201);
    const text = (await room.owner.get(`/api/rooms/${other.body.id}/exports/matched-input.s1p`).expect(200)).text;
    expect(text).toContain('is complex');
    const d = parseDesign((await room.owner.get(`/api/rooms/${other.body.id}/design`).expect(200)).body);
    const r = analyze(d);
    const t = parseTouchstone(text, { ports: 1 });
    expect(t.referenceOhms).toBe(50);
    // S11 = (Zin − Z0)/(Zin + Z0) on the real reference (Pozar, Microwave Engineering 4th ed., eq. 2.35, from memory).
    const want = new Float64Array(r.zin.length);
    for (let i = 0; i < r.zin.length; i += 2) {
      const [zr, zi] = [r.zin[i], r.zin[i + 1]];
      const dr = zr + 50;
      const den = dr * dr + zi * zi;
      want[i] = ((zr - 50) * dr + zi * zi) / den;
      want[i + 1] = (zi * dr - (zr - 50) * zi) / den;
    }
    expect(worstRelative(t.s, want)).toBeLessThan(1e-12);
  });
});
