// bom.csv and lines.csv from a real server: the BOM's rounded values are preferred values of the series
// it names, the stress figures are the engine's; the line widths and lengths are the microstrip module's.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { BOM_HEADER } from '../../shared/handoff/bom';
import { LINES_HEADER } from '../../shared/handoff/lines';
import { analyze } from '../../shared/rf/analyze';
import { bandCenterHz, parseDesign, type Design } from '../../shared/rf/design';
import { isPreferred, type ESeries } from '../../shared/rf/eseries';
import { microstripPhysicalLength, microstripSynthesize } from '../../shared/rf/microstrip';
import { startTestServer, type TestServer } from '../server/helpers/test-server';
import { chainDesign, roomWithMembers, type RoomWithMembers } from './helpers';

/** A small RFC 4180 reader (quoted fields, doubled quotes, CRLF records) for checking the files. */
function readCsv(text: string): string[][] {
  const rows: string[][] = [];
  let row: string[] = [];
  let field = '';
  let quoted = false;
  for (let i = 0; i < text.length; i++) {
    const c = text[i];
    if (quoted) {
      if (c === '"' && text[i + 1] === '"') {
        field += '"';
        i++;
      } else if (c === '"') quoted = false;
      else field += c;
    } else if (c === '"') quoted = true;
    else if (c === ',') {
      row.push(field);
      field = '';
    } else if (c === '\r' && text[i + 1] === '\n') {
      row.push(field);
      rows.push(row);
      row = [];
      field = '';
      i++;
    } else field += c;
  }
  if (field || row.length) throw new Error('the last record does not end with CRLF');
  return rows;
}

function records(text: string): Record<string, string>[] {
  const [header, ...rows] = readCsv(text);
  return rows.map((r) => Object.fromEntries(header.map((h, i) => [h, r[i]])));
}

describe('bom.csv and lines.csv', () => {
  let server: TestServer;
  let room: RoomWithMembers;
  let design: Design;

  beforeAll(async () => {
    server = await startTestServer();
    room = await roomWithMembers(server, 'BOM room', chainDesign());
    design = parseDesign((await room.owner.get(`/api/rooms/${room.roomId}/design`).expect(200)).body);
  });
  afterAll(async () => {
    await server?.close();
  });

  const bom = async (query = '') => (await room.observer.get(`/api/rooms/${room.roomId}/exports/bom.csv${query}`).expect(200)).text;

  it('lists every lumped part, load end first, under a header with units (RFC 4180 records)', async () => {
    const text = await bom();
    expect(readCsv(text)[0]).toEqual([...BOM_HEADER]);
    const rows = records(text);
    expect(rows.map((r) => r.id)).toEqual(['l1', 'c1', 'r1']);
    expect(rows.map((r) => r.kind)).toEqual(['series L', 'shunt C', 'series R']);
    expect(rows.map((r) => r.ref)).toEqual(['L1', 'C1', 'R1']);
    expect(rows[0]['exact value (SI: H, F or Ω)']).toBe('2.13e-9');
    expect(rows[1].tolerance).toBe('±100 fF (normal, 3σ)');
    expect(rows[0]['Q (empty = ideal)']).toBe('60');
    expect(rows[2]['Q (empty = ideal)']).toBe('');
  });

  it('rounds to E24 for L and C and E96 for R by default, and to the asked series with ?series=', async () => {
    for (const [query, want] of [
      ['', { H: 'E24', F: 'E24', Ω: 'E96' }],
      ['?series=E12', { H: 'E12', F: 'E12', Ω: 'E12' }],
      ['?series=E48', { H: 'E48', F: 'E48', Ω: 'E48' }],
      ['?series=E96', { H: 'E96', F: 'E96', Ω: 'E96' }],
    ] as const) {
      for (const r of records(await bom(query))) {
        const series = r['E-series'] as ESeries;
        expect(series, `${query} ${r.id}`).toBe(want[r.unit as 'H' | 'F' | 'Ω']);
        const nearest = Number(r['nearest E-series value (SI: H, F or Ω)']);
        // IEC 60063 preferred values (shared/rf/eseries.ts tables)
        expect(isPreferred(nearest, series), `${query} ${r.id} ${nearest}`).toBe(true);
        const exact = Number(r['exact value (SI: H, F or Ω)']);
        // The nearest preferred value is within half a series step (E12: 10^(1/24) ≈ 1.10; common practice).
        const halfStep = 10 ** (1 / (2 * Number(series.slice(1))));
        expect(Math.max(nearest / exact, exact / nearest), `${query} ${r.id}`).toBeLessThan(halfStep * 1.05);
      }
    }
    // 2.13 nH -> 2.2 nH in E24, 1.37 pF -> 1.3 pF in E24 (IEC 60063 E24 table), 3.3 Ω -> 3.32 Ω in E96.
    expect(records(await bom()).map((r) => r['nearest E-series value'])).toEqual(['2.2 nH', '1.3 pF', '3.32 Ω']);
  });

  it('gives the engine’s peak voltage and current at the drive power, and leaves them empty without a drive', async () => {
    const stress = analyze(design).stressAtCenter ?? [];
    const rows = records(await bom());
    for (const r of rows) {
      const s = stress.find((x) => x.id === r.id);
      expect(s, r.id).toBeDefined();
      expect(Number(r['drive power (W)'])).toBe(0.5);
      // Written to 6 significant figures.
      expect(Math.abs(Number(r['peak voltage at drive (V)']) / (s?.voltagePeak ?? NaN) - 1)).toBeLessThan(1e-5);
      expect(Math.abs(Number(r['peak current at drive (A)']) / (s?.currentPeak ?? NaN) - 1)).toBeLessThan(1e-5);
    }
    const nodrive = await room.owner.post('/api/rooms').send({ name: 'No drive', design: chainDesign({ drive: undefined }) }).expect(201);
    const quiet = records((await room.owner.get(`/api/rooms/${nodrive.body.id}/exports/bom.csv`).expect(200)).text);
    for (const r of quiet) {
      expect(r['drive power (W)']).toBe('');
      expect(r['peak voltage at drive (V)']).toBe('');
      expect(r['peak current at drive (A)']).toBe('');
    }
  });

  it('guards free text against spreadsheet formulas and quotes commas and quotes (RFC 4180 §2)', async () => {
    const d = chainDesign();
    d.elements = [{ id: '=HYPERLINK("x")', kind: 'series-c', value: 1e-12, label: 'C9, "tuned"' }];
    const r = await room.owner.post('/api/rooms').send({ name: 'Quoting', design: d }).expect(201);
    const text = (await room.owner.get(`/api/rooms/${r.body.id}/exports/bom.csv`).expect(200)).text;
    expect(text.split('\r\n')[1]).toMatch(/^"C9, ""tuned""","'=HYPERLINK\(""x""\)","C9, ""tuned""",series C,/);
    const [row] = records(text);
    expect(row.label).toBe('C9, "tuned"');
    expect(row.id).toBe('\'=HYPERLINK("x")');
  });

  it('gives every line and stub a microstrip width for its Z0 and the length of its electrical length at the centre', async () => {
    const text = (await room.observer.get(`/api/rooms/${room.roomId}/exports/lines.csv`).expect(200)).text;
    expect(readCsv(text)[0]).toEqual([...LINES_HEADER]);
    const rows = records(text);
    expect(rows.map((r) => r.id)).toEqual(['tl1', 'st1', 'st2']);
    const sub = { epsilonR: 4.4, heightM: 1.6e-3, copperM: 35e-6 }; // the chip antenna's FR-4 (shared/demo/designs.ts)
    const fc = bandCenterHz(design.band);
    const degrees: Record<string, number> = {
      tl1: (20 * fc) / 2.44e9, // degrees scale with frequency
      st1: (360 * 0.004 * fc) / (0.66 * 299_792_458), // βl = 2πf·l/(v·c)
      st2: (70 * fc) / 2.44e9,
    };
    for (const r of rows) {
      const z0 = Number(r['Z0 (Ω)']);
      const strip = microstripSynthesize(z0, sub); // shared/rf/microstrip.ts (Hammerstad and Jensen 1980)
      expect(Number(r['width (m)']), r.id).toBe(strip.widthM);
      expect(Number(r['εeff'])).toBeCloseTo(strip.epsilonEff, 4);
      expect(Number(r['electrical length at centre (°)'])).toBeCloseTo(degrees[r.id], 3);
      expect(Number(r['length (m)']), r.id).toBe(microstripPhysicalLength(degrees[r.id], fc, strip.epsilonEff));
      // λ = c/(f·√εeff) on the strip (common practice)
      expect(Number(r['length (m)'])).toBeCloseTo((degrees[r.id] / 360) * (299_792_458 / (fc * Math.sqrt(strip.epsilonEff))), 12);
      expect(r.substrate).toContain("the room's substrate");
      expect(Number(r['substrate height (mm)'])).toBe(1.6);
    }
    // A 50 Ω strip on 1.6 mm FR-4 is about 3 mm wide (common practice: w/h ≈ 1.9 for εr 4.4).
    expect(Number(rows[0]['width (mm)'])).toBeGreaterThan(2.8);
    expect(Number(rows[0]['width (mm)'])).toBeLessThan(3.2);
    expect(rows[1].note).toContain('end extension');
  });

  it('states the FR-4 assumption in the file when the room sets no substrate, and explains an impossible Z0', async () => {
    const d = chainDesign({ substrate: undefined });
    d.elements = [...(d.elements ?? []), { id: 'tl9', kind: 'line', z0: 400, length: { degrees: 30, atHz: 2.44e9 } }];
    const r = await room.owner.post('/api/rooms').send({ name: 'No substrate', design: d }).expect(201);
    const rows = records((await room.owner.get(`/api/rooms/${r.body.id}/exports/lines.csv`).expect(200)).text);
    for (const row of rows) {
      expect(row.substrate).toMatch(/assumed 1\.6 mm FR-4, the room sets no substrate/);
      expect(row['substrate εr']).toBe('4.4');
      expect(row['copper thickness (µm)']).toBe('35');
    }
    const wide = rows.find((x) => x.id === 'tl9');
    expect(wide?.['width (m)']).toBe('');
    expect(wide?.note).toMatch(/no microstrip width gives 400 Ω/);
  });
});
