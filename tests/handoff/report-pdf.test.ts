// report.pdf from a real server: it opens (pdftoppm renders page 1), the page is not blank, the chart
// region holds the amber band trace and the kind-tinted impedance path, and the text carries the room,
// the figures, the notes and the cautions of PRODUCT.md.
import { execFileSync } from 'node:child_process';
import { existsSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { HANDOFF_CAUTIONS } from '../../shared/handoff/cautions';
import { SMITH_BOX, SWEEP_BOX } from '../../server/handoff/pdf/report-pdf';
import { startTestServer, type TestServer } from '../server/helpers/test-server';
import { binary, chainDesign, parsePpm, roomWithMembers, type Ppm, type RoomWithMembers } from './helpers';

const HAVE_POPPLER = existsSync('/usr/bin/pdftoppm') && existsSync('/usr/bin/pdftotext');
if (!HAVE_POPPLER) console.warn('\n*** SKIPPING the report rendering checks: pdftoppm/pdftotext (poppler-utils) are not installed. ***\n');

const DPI = 50;
const PT = DPI / 72;

/** Pixels of a page-point box satisfying `test`. */
function countIn(img: Ppm, box: { x: number; y: number; width: number; height: number }, test: (r: number, g: number, b: number) => boolean): number {
  let n = 0;
  const x0 = Math.floor(box.x * PT);
  const y0 = Math.floor(box.y * PT);
  const x1 = Math.min(img.width, Math.ceil((box.x + box.width) * PT));
  const y1 = Math.min(img.height, Math.ceil((box.y + box.height) * PT));
  for (let y = y0; y < y1; y++)
    for (let x = x0; x < x1; x++) {
      const o = 3 * (y * img.width + x);
      if (test(img.rgb[o], img.rgb[o + 1], img.rgb[o + 2])) n++;
    }
  return n;
}

// The palette (shared/handoff/palette.ts): amber #d9962b, series L teal #1d8a84, shunt C coral #a9412b, paper #f6f1e7.
// Amber-ish: the thick band trace and its lighter out-of-band tint on paper (green about 0.6–0.9 of red;
// coral has far less green, paper far less red-over-blue).
const amber = (r: number, g: number, b: number) => r > 170 && r - b > 60 && g > 0.55 * r && g < 0.92 * r;
const near = (hex: string, d: number) => {
  const [R, G, B] = [1, 3, 5].map((i) => parseInt(hex.slice(i, i + 2), 16));
  return (r: number, g: number, b: number) => Math.hypot(r - R, g - G, b - B) < d;
};
const teal = near('#1d8a84', 40); // series L
const coral = near('#a9412b', 40); // shunt C
const nonWhite = (r: number, g: number, b: number) => r < 245 || g < 245 || b < 245;

describe.skipIf(!HAVE_POPPLER)('report.pdf', () => {
  let server: TestServer;
  let room: RoomWithMembers;
  let pdf: Buffer;
  let file: string;

  beforeAll(async () => {
    server = await startTestServer();
    room = await roomWithMembers(server, 'Sensor board — rev C', chainDesign());
    const now = Date.now();
    // Review notes as the notes table holds them: a note on C1 at the top band edge and a reply.
    await server.knex('notes').insert([
      { id: 'note-1', room_id: room.roomId, author_id: room.ownerId, element_id: 'c1', frequency_hz: 2.4835e9, body: 'Check C1 voltage rating at the band edge.', resolved: false, created_at: now },
      { id: 'note-2', room_id: room.roomId, author_id: room.ownerId, parent_id: 'note-1', body: 'Rated 50 V, fine at 0.5 W.', resolved: true, created_at: now + 1 },
    ]);
    pdf = (await room.observer.get(`/api/rooms/${room.roomId}/exports/report.pdf`).buffer(true).parse(binary).expect(200)).body as Buffer;
    file = join(server.dir, 'report.pdf');
    writeFileSync(file, pdf);
  });
  afterAll(async () => {
    await server?.close();
  });

  it('is a PDF that pdftoppm renders; page 1 is not blank and its chart holds the amber band trace and the tinted path', () => {
    expect(pdf.subarray(0, 5).toString('latin1')).toBe('%PDF-');
    execFileSync('/usr/bin/pdftoppm', ['-png', '-r', String(DPI), '-f', '1', '-l', '1', file, join(server.dir, 'page')]);
    expect(readFileSync(join(server.dir, 'page-1.png')).subarray(1, 4).toString('latin1')).toBe('PNG');
    // Without -png pdftoppm writes binary PPM.
    execFileSync('/usr/bin/pdftoppm', ['-r', String(DPI), '-f', '1', '-l', '1', '-singlefile', file, join(server.dir, 'page-raw')]);
    const ppm = parsePpm(readFileSync(join(server.dir, 'page-raw.ppm')));
    // A4 at 50 dpi: about 413 × 585 pixels (pdftoppm rounds up).
    expect(Math.abs(ppm.width - 595.28 * PT)).toBeLessThan(1.5);
    expect(Math.abs(ppm.height - 841.89 * PT)).toBeLessThan(1.5);
    const page = { x: 0, y: 0, width: 595.28, height: 841.89 };
    expect(countIn(ppm, page, nonWhite) / (ppm.width * ppm.height)).toBeGreaterThan(0.15);
    expect(countIn(ppm, SMITH_BOX, amber)).toBeGreaterThan(40);
    expect(countIn(ppm, SWEEP_BOX, amber)).toBeGreaterThan(60);
    // The path's series L (teal) and shunt C (coral) segments are on the chart, and not on the sweep plot.
    expect(countIn(ppm, SMITH_BOX, teal)).toBeGreaterThan(15);
    expect(countIn(ppm, SMITH_BOX, coral)).toBeGreaterThan(15);
    expect(countIn(ppm, SWEEP_BOX, teal)).toBeLessThan(5);
    expect(countIn(ppm, SWEEP_BOX, coral)).toBeLessThan(5);
    // The chart sits on paper: most of its panel is the warm off-white, not page white.
    const paper = (r: number, g: number, b: number) => Math.abs(r - 0xf6) < 8 && Math.abs(g - 0xf1) < 8 && Math.abs(b - 0xe7) < 10;
    expect(countIn(ppm, SMITH_BOX, paper) / (SMITH_BOX.width * SMITH_BOX.height * PT * PT)).toBeGreaterThan(0.3);
  });

  it('carries the title, room, figures, element table, notes and the cautions as text', () => {
    const text = execFileSync('/usr/bin/pdftotext', ['-layout', file, '-'], { encoding: 'utf8' }).replace(/\s+/g, ' ');
    expect(text).toContain('MATCHLOOM HAND-OFF REPORT');
    expect(text).toContain('Sensor board — rev C');
    for (const label of ['BANDWIDTH', 'FRACTIONAL BANDWIDTH', 'WORST IN BAND', 'MATCH AT CENTRE', 'LIMIT GAUGE']) expect(text).toContain(label);
    expect(text).toMatch(/L1 series L 2\.13 nH 2\.2 nH \(E24\)/);
    expect(text).toContain('Check C1 voltage rating at the band edge.');
    expect(text).toContain('Reply');
    expect(text).toContain('Rated 50 V, fine at 0.5 W.');
    expect(text).toContain('Line dimensions');
    for (const c of HANDOFF_CAUTIONS) expect(text).toContain(c);
  });

  it('says so when the room has no notes', async () => {
    const other = await room.owner.post('/api/rooms').send({ name: 'Quiet room', design: chainDesign({ elements: [] }) }).expect(201);
    const res = await room.owner.get(`/api/rooms/${other.body.id}/exports/report.pdf`).buffer(true).parse(binary).expect(200);
    const f = join(server.dir, 'quiet.pdf');
    writeFileSync(f, res.body as Buffer);
    const text = execFileSync('/usr/bin/pdftotext', [f, '-'], { encoding: 'utf8' }).replace(/\s+/g, ' ');
    expect(text).toContain('No review notes in this room.');
    expect(text).toContain('The chain has no elements');
  });
});
