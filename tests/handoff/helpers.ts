// Shared pieces of the hand-off pack tests: invented designs (the 2.4 GHz chip antenna of PRODUCT.md
// with lumped parts, a line and stubs; a design the engine refuses), a room-with-members builder on a
// real test server, and a tiny PPM reader for the rendered report.
import { spawnSync } from 'node:child_process';
import type TestAgent from 'supertest/lib/agent';
import { chipAntennaDesign } from '../../shared/demo/designs';
import type { DesignInput } from '../../shared/rf/design';
import { signUp, type TestServer } from '../server/helpers/test-server';

export const PYTHON = '/usr/bin/python3';

/** The chip antenna (invented series RLC) with a four-element chain, a drive and the FR-4 substrate. */
export function chainDesign(over: Partial<DesignInput> = {}): DesignInput {
  return {
    ...chipAntennaDesign(),
    name: 'Chip antenna, four-part match',
    sweep: { startHz: 2.0e9, stopHz: 2.9e9, points: 181, spacing: 'linear' },
    drive: { powerW: 0.5 },
    elements: [
      { id: 'l1', kind: 'series-l', value: 2.13e-9, label: 'L1', q: 60, tolerance: { relative: 0.05 } },
      { id: 'c1', kind: 'shunt-c', value: 1.37e-12, q: 300, tolerance: { absolute: 0.1e-12, distribution: 'normal' } },
      { id: 'tl1', kind: 'line', z0: 50, length: { degrees: 20, atHz: 2.44e9 }, lossDbPerM: 2 },
      { id: 'st1', kind: 'open-stub', z0: 60, length: { meters: 0.004, velocityFactor: 0.66 } },
      { id: 'st2', kind: 'short-stub', z0: 90, length: { degrees: 70, atHz: 2.44e9 } },
      { id: 'r1', kind: 'series-r', value: 3.3 },
    ],
    ...over,
  };
}

/** A measured load covering 1–2 GHz only, swept 2–3 GHz: the engine refuses it. */
export function refusedDesign(): DesignInput {
  const lines = ['# GHz S RI R 50'];
  for (let i = 0; i <= 10; i++) lines.push(`${1 + i * 0.1} 0.2 -0.1`);
  return {
    ...chipAntennaDesign(),
    name: 'Out of range',
    load: { kind: 'measured', touchstone: `${lines.join('\n')}\n`, fileName: 'antenna.s1p' },
    sweep: { startHz: 2e9, stopHz: 3e9, points: 51, spacing: 'linear' },
  };
}

export interface RoomWithMembers {
  roomId: string;
  owner: TestAgent;
  observer: TestAgent;
  outsider: TestAgent;
  ownerId: string;
}

/** A room holding `design`, with an observer member and a signed-in outsider. */
export async function roomWithMembers(server: TestServer, name: string, design: DesignInput): Promise<RoomWithMembers> {
  const owner = await signUp(server, { displayName: 'Room Owner' });
  const observer = await signUp(server, { displayName: 'Review Observer' });
  const outsider = await signUp(server, { displayName: 'Someone Else' });
  const created = await owner.agent.post('/api/rooms').send({ name, design }).expect(201);
  const roomId = created.body.id as string;
  await owner.agent.post(`/api/rooms/${roomId}/members`).send({ email: observer.user.email, role: 'observer' }).expect(201);
  return { roomId, owner: owner.agent, observer: observer.agent, outsider: outsider.agent, ownerId: owner.user.id };
}

/** Binary response bodies for supertest. */
export function binary(res: NodeJS.EventEmitter, cb: (err: Error | null, body: Buffer) => void): void {
  const chunks: Buffer[] = [];
  res.on('data', (c: Buffer) => chunks.push(Buffer.from(c)));
  res.on('end', () => cb(null, Buffer.concat(chunks)));
  res.on('error', (e: Error) => cb(e, Buffer.alloc(0)));
}

export function skrfAvailable(): boolean {
  const r = spawnSync(PYTHON, ['-c', 'import numpy; numpy.complex=complex; numpy.float=float; numpy.int=int; import skrf'], { encoding: 'utf8' });
  return r.status === 0;
}

export interface Ppm {
  width: number;
  height: number;
  /** RGB, 3 bytes per pixel, row-major */
  rgb: Uint8Array;
}

/** A binary PPM (P6, maxval 255), as pdftoppm -ppm writes it. */
export function parsePpm(buf: Buffer): Ppm {
  let pos = 0;
  const token = (): string => {
    for (;;) {
      while (pos < buf.length && /\s/.test(String.fromCharCode(buf[pos]))) pos++;
      if (buf[pos] === 0x23) {
        while (pos < buf.length && buf[pos] !== 0x0a) pos++;
        continue;
      }
      break;
    }
    const start = pos;
    while (pos < buf.length && !/\s/.test(String.fromCharCode(buf[pos]))) pos++;
    return buf.subarray(start, pos).toString('ascii');
  };
  const magic = token();
  if (magic !== 'P6') throw new Error(`not a binary PPM (${magic})`);
  const width = Number(token());
  const height = Number(token());
  const max = Number(token());
  if (max !== 255) throw new Error(`unexpected maxval ${max}`);
  pos += 1; // the single whitespace after maxval
  const rgb = new Uint8Array(buf.buffer, buf.byteOffset + pos, width * height * 3);
  return { width, height, rgb };
}
