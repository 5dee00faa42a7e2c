import { describe, expect, it } from 'vitest';
import { loadFormSchema, loadFormValues, sweepForMeasured } from '../../client/features/workspace/forms/load-form-model';
import { bandFormSchema, bandFormValues, portFormSchema, portFormValues } from '../../client/features/workspace/forms/band-form-model';
import { tunedFieldChanges } from '../../client/features/workspace/tools/tuned-changes';
import { presenceRows } from '../../client/features/workspace/room/presence-rows';
import { mergeLogEntry } from '../../client/features/workspace/collab/use-room-events';
import { peersFrom, initials } from '../../client/features/workspace/collab/presence-state';
import { lengthInDegrees, lengthInMeters, defaultVelocityFactor } from '../../client/features/workspace/inspector/length-convert';
import type { Peer } from '../../client/features/workspace/collab/presence-state';

const s1p = '# GHz S RI R 50\n2.0 0.1 0.2\n2.5 0.1 0.1\n3.0 0.2 0.0\n';

describe('the load form', () => {
  it('turns an RLC form into a contract load, leaving out an empty L or C', () => {
    const v = { ...loadFormValues({ kind: 'impedance', ohms: [50, 0] }), kind: 'rlc' as const, r: '18', l: '3.9n', c: '' };
    expect(loadFormSchema.parse(v)).toEqual({ kind: 'rlc', topology: 'series', r: 18, l: 3.9e-9 });
  });

  it('names the field and the reason for a value in the wrong unit', () => {
    const v = { ...loadFormValues({ kind: 'rlc', topology: 'series', r: 18, l: 3.9e-9, c: 1.3e-12 }), l: '3.9 nF' };
    const r = loadFormSchema.safeParse(v);
    expect(r.success).toBe(false);
    expect(r.error?.issues[0].path).toEqual(['l']);
    expect(r.error?.issues[0].message).toMatch(/farads.*expected henries/);
  });

  it('refuses a parallel RLC with no resistance, and a negative resistance', () => {
    const base = loadFormValues({ kind: 'rlc', topology: 'parallel', r: 200, c: 1e-12 });
    expect(loadFormSchema.safeParse({ ...base, r: '0' }).success).toBe(false);
    expect(loadFormSchema.safeParse({ ...loadFormValues({ kind: 'impedance', ohms: [50, 0] }), re: '-5' }).success).toBe(false);
  });

  it('reads back a fixed impedance with its units', () => {
    expect(loadFormValues({ kind: 'impedance', ohms: [25, -10] })).toMatchObject({ kind: 'impedance', re: '25 Ω', im: '-10 Ω' });
    expect(loadFormSchema.parse(loadFormValues({ kind: 'impedance', ohms: [25, -10] }))).toEqual({ kind: 'impedance', ohms: [25, -10] });
  });

  it('checks a measured file and says which line is wrong', () => {
    const ok = loadFormSchema.parse({ ...loadFormValues({ kind: 'impedance', ohms: [50, 0] }), kind: 'measured', touchstone: s1p, fileName: 'chip.s1p' });
    expect(ok).toEqual({ kind: 'measured', touchstone: s1p, fileName: 'chip.s1p' });
    const bad = loadFormSchema.safeParse({ ...loadFormValues({ kind: 'impedance', ohms: [50, 0] }), kind: 'measured', touchstone: '# GHz S RI R 50\n2.0 x 0.2\n' });
    expect(bad.success).toBe(false);
    expect(bad.error?.issues[0].message).toMatch(/line 2/);
  });

  it('narrows a sweep that overruns the measurement, and refuses a band outside it', () => {
    const band = { startHz: 2.4e9, stopHz: 2.4835e9 };
    const fit = sweepForMeasured(s1p, { startHz: 1e9, stopHz: 4e9, points: 101 }, band);
    expect(fit).toMatchObject({ ok: true, sweep: { startHz: 2e9, stopHz: 3e9, points: 101 } });
    expect(sweepForMeasured(s1p, { startHz: 2.1e9, stopHz: 2.9e9, points: 11 }, band)).toEqual({ ok: true, sweep: null, note: null });
    const outside = sweepForMeasured(s1p, { startHz: 1e9, stopHz: 4e9, points: 11 }, { startHz: 3.1e9, stopHz: 3.2e9 });
    expect(outside.ok).toBe(false);
  });
});

describe('the band and port forms', () => {
  const design = {
    band: { startHz: 2.4e9, stopHz: 2.4835e9, centerHz: 2.44175e9 },
    sweep: { startHz: 2e9, stopHz: 2.9e9, points: 501, spacing: 'linear' as const },
    goal: { maxVswr: 2 },
  };

  it('round-trips the band, sweep and goal through the form text', () => {
    expect(bandFormValues(design)).toMatchObject({ bandStop: '2.4835 GHz', center: '2.44175 GHz', points: '501', goalValue: '2' });
    expect(bandFormSchema.parse(bandFormValues(design))).toEqual(design);
  });

  it('switches the goal to return loss', () => {
    const out = bandFormSchema.parse({ ...bandFormValues(design), goalKind: 'return-loss', goalValue: '10 dB' });
    expect(out.goal).toEqual({ minReturnLossDb: 10 });
  });

  it('puts cross-field errors beside the field at fault', () => {
    const paths = (v: object) => bandFormSchema.safeParse({ ...bandFormValues(design), ...v }).error?.issues.map((i) => i.path.join('.'));
    expect(paths({ bandStop: '2.3 GHz' })).toContain('bandStop');
    expect(paths({ center: '2.5G' })).toContain('center');
    expect(paths({ sweepStop: '1G' })).toContain('sweepStop');
    expect(paths({ points: '10.5' })).toContain('points');
    expect(paths({ goalValue: '1' })).toContain('goalValue');
  });

  it('reads drive power and board, and leaves out what is empty', () => {
    const empty = portFormSchema.parse(portFormValues({ referenceOhms: 50 }));
    expect(empty).toEqual({ referenceOhms: 50, port: undefined, drive: undefined, substrate: undefined });
    const full = portFormSchema.parse({ ...portFormValues({ referenceOhms: 50 }), power: '100m', epsilonR: '4.4', height: '1.6 mm', portRe: '75' });
    expect(full).toEqual({ referenceOhms: 50, port: { impedance: [75, 0] }, drive: { powerW: 0.1 }, substrate: { epsilonR: 4.4, heightM: 1.6e-3 } });
    expect(portFormSchema.safeParse({ ...portFormValues({ referenceOhms: 50 }), epsilonR: '4.4' }).success).toBe(false);
  });
});

describe('tunedFieldChanges', () => {
  it('lists only the fields refine changed, and never touches a locked element', () => {
    const now = [
      { id: 'L1', kind: 'series-l' as const, value: 1e-9, label: 'L1' },
      { id: 'C1', kind: 'shunt-c' as const, value: 1.7e-12, locked: true },
      { id: 'TL1', kind: 'line' as const, z0: 50, length: { degrees: 45, atHz: 2.44e9 } },
    ];
    const refined = [
      { ...now[0], value: 1.1e-9 },
      { ...now[1], value: 1.9e-12 },
      { ...now[2], length: { degrees: 47.5, atHz: 2.44e9 } },
    ];
    expect(tunedFieldChanges(now, refined)).toEqual([
      { id: 'L1', field: 'value', value: 1.1e-9 },
      { id: 'TL1', field: 'length', value: { degrees: 47.5, atHz: 2.44e9 } },
    ]);
  });
  it('ignores elements that are gone or changed kind meanwhile', () => {
    expect(tunedFieldChanges([{ id: 'L1', kind: 'series-c', value: 1e-12 }], [{ id: 'L1', kind: 'series-l', value: 2e-9 }, { id: 'X', kind: 'series-l', value: 1e-9 }])).toEqual([]);
  });
});

describe('presence', () => {
  const peer = (clientId: number, id: string, name: string, selection: string | null): Peer => ({
    clientId,
    user: { id, name, role: 'tuner', color: '#3d6fb4' },
    selection,
    cursor: null,
    view: null,
    following: null,
  });

  it('joins the member list with awareness selections, me first', () => {
    const rows = presenceRows(
      [
        { userId: 'u2', displayName: 'Zed', role: 'observer', colour: '#111111', following: 'u1' },
        { userId: 'u1', displayName: 'Ann', role: 'tuner', colour: '#222222', following: null },
      ],
      [peer(7, 'u1', 'Ann', 'C1'), peer(8, 'u1', 'Ann', 'L1')],
      { id: 'u2', name: 'Zed', role: 'observer', selection: 'C1' },
    );
    expect(rows.map((r) => [r.userId, r.isMe, r.selections, r.following])).toEqual([
      ['u2', true, ['C1'], 'u1'],
      ['u1', false, ['C1', 'L1'], null],
    ]);
  });

  it('lists people from awareness alone while the event socket is down', () => {
    const rows = presenceRows([], [peer(7, 'u1', 'Ann', null)], { id: 'me', name: 'Me', role: 'tuner', selection: null });
    expect(rows.map((r) => r.name)).toEqual(['Me', 'Ann']);
  });

  it('drops malformed awareness states and its own', () => {
    const states = new Map<number, unknown>([
      [1, { user: { id: 'a', name: 'A', role: 'tuner', color: '#123456' }, selection: 'C1' }],
      [2, { user: { id: 'b', name: 'B', role: 'admin', color: '#123456' } }],
      [3, { cursor: { area: 'chart', gamma: [0, 0] } }],
      [4, { user: { id: 'me', name: 'Me', role: 'tuner', color: '#123456' } }],
    ]);
    expect(peersFrom(states, 4).map((p) => p.user.id)).toEqual(['a']);
  });

  it('makes initials from names and addresses', () => {
    expect(initials('Demo Tuner')).toBe('DT');
    expect(initials('observer@demo.test')).toBe('OB');
  });
});

describe('mergeLogEntry', () => {
  const entry = (id: number, at: number, message: string) => ({ id, roomId: 'r', userId: 'u', displayName: 'Ann', message, at });
  it('replaces an entry sent again with the same id (a merged run of edits) and keeps newest first', () => {
    let log = mergeLogEntry([], entry(1, 100, 'Ann changed C1 from 1 pF to 2 pF'));
    log = mergeLogEntry(log, entry(2, 200, 'Ann added L1'));
    log = mergeLogEntry(log, entry(1, 300, 'Ann changed C1 from 1 pF to 3 pF'));
    expect(log.map((e) => e.message)).toEqual(['Ann changed C1 from 1 pF to 3 pF', 'Ann added L1']);
  });
  it('keeps at most the limit', () => {
    let log: ReturnType<typeof mergeLogEntry> = [];
    for (let i = 0; i < 10; i++) log = mergeLogEntry(log, entry(i, i, `e${i}`), 4);
    expect(log.map((e) => e.id)).toEqual([9, 8, 7, 6]);
  });
});

describe('line length conversion', () => {
  // ℓ = (θ/360°)·v·c/f: 90° at 2.44 GHz with v = 0.66 is 0.66 × 299792458 / 2.44e9 / 4 = 20.27 mm (from the formula)
  it('keeps the electrical length when switching to metres and back', () => {
    const m = lengthInMeters({ degrees: 90, atHz: 2.44e9 }, 0.66);
    expect(m).toEqual({ meters: 0.02027, velocityFactor: 0.66 });
    const back = lengthInDegrees(m, 2.44e9);
    expect('degrees' in back && back.degrees).toBeCloseTo(90, 1);
  });
  it('estimates a microstrip velocity factor from εr as 1/√((εr+1)/2) (common practice)', () => {
    expect(defaultVelocityFactor({ substrate: { epsilonR: 4.4, heightM: 1.6e-3 } })).toBe(0.609);
    expect(defaultVelocityFactor({})).toBe(0.66);
  });
});
