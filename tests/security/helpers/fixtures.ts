/**
 * People and rooms for the security tests, made through the real API. Every room carries unique marker
 * strings (room name, design name, element label, snapshot label, member names and addresses) so a test
 * can show that an answer to someone outside the room contains none of them.
 */
import { randomBytes } from 'node:crypto';
import { rawRequest } from './http';
import type { DesignInput } from '../../../shared/rf/design';

export const PASSWORD = 'correct horse battery';

export interface Account {
  id: string;
  email: string;
  displayName: string;
  password: string;
  /** `ml_session=<token>` */
  cookie: string;
  /** The session token alone. */
  token: string;
}

export interface RoomFixture {
  roomId: string;
  snapshotId: string;
  owner: Account;
  tuner: Account;
  observer: Account;
  /** Strings that only members of this room may ever see. */
  markers: string[];
}

const tag = () => randomBytes(6).toString('hex');
let counter = 0;

export function sessionFrom(setCookie: string | string[] | undefined): string {
  const all = Array.isArray(setCookie) ? setCookie : setCookie ? [setCookie] : [];
  const c = all.find((v) => v.startsWith('ml_session='));
  if (!c) throw new Error(`no session cookie in ${JSON.stringify(all)}`);
  return c.split(';')[0];
}

export async function signUpAccount(baseUrl: string, label = 'Engineer'): Promise<Account> {
  counter += 1;
  const t = tag();
  const email = `${label.toLowerCase().replace(/\W+/g, '-')}-${t}-${counter}@example.test`;
  const displayName = `${label} ${t}`;
  const res = await rawRequest(baseUrl, { method: 'POST', path: '/api/auth/signup', body: { email, password: PASSWORD, displayName } });
  if (res.status !== 201) throw new Error(`signup failed: ${res.status} ${res.text}`);
  const cookie = sessionFrom(res.headers['set-cookie']);
  return { id: (res.json as { id: string }).id, email, displayName, password: PASSWORD, cookie, token: cookie.slice('ml_session='.length) };
}

export function markedDesign(t: string): DesignInput {
  return {
    format: 'matchloom-design',
    version: 1,
    name: `Design-marker-${t}`,
    referenceOhms: 50,
    load: { kind: 'impedance', ohms: [18, 8] },
    band: { startHz: 2.4e9, stopHz: 2.4835e9 },
    sweep: { startHz: 2e9, stopHz: 2.9e9, points: 51 },
    goal: { maxVswr: 2 },
    elements: [{ id: `el-${t}`, kind: 'shunt-c', value: 1.2e-12, label: `Label-marker-${t}` }],
  };
}

async function must(baseUrl: string, cookie: string, method: string, path: string, body: unknown, status: number) {
  const res = await rawRequest(baseUrl, { method, path, cookie, body });
  if (res.status !== status) throw new Error(`${method} ${path}: expected ${status}, got ${res.status} ${res.text}`);
  return res.json as Record<string, unknown>;
}

/** A room owned by a new account, with a tuner and an observer, and one snapshot. */
export async function roomFixture(baseUrl: string, people?: Partial<Pick<RoomFixture, 'owner' | 'tuner' | 'observer'>>): Promise<RoomFixture> {
  const t = tag();
  const owner = people?.owner ?? (await signUpAccount(baseUrl, 'Owner'));
  const tuner = people?.tuner ?? (await signUpAccount(baseUrl, 'Tuner'));
  const observer = people?.observer ?? (await signUpAccount(baseUrl, 'Observer'));
  const name = `Room-marker-${t}`;
  const room = await must(baseUrl, owner.cookie, 'POST', '/api/rooms', { name, design: markedDesign(t) }, 201);
  const roomId = room.id as string;
  await must(baseUrl, owner.cookie, 'POST', `/api/rooms/${roomId}/members`, { email: tuner.email, role: 'tuner' }, 201);
  await must(baseUrl, owner.cookie, 'POST', `/api/rooms/${roomId}/members`, { email: observer.email, role: 'observer' }, 201);
  const label = `Snapshot-marker-${t}`;
  const snap = await must(baseUrl, owner.cookie, 'POST', `/api/rooms/${roomId}/snapshots`, { label }, 201);
  const markers = [name, `Design-marker-${t}`, `Label-marker-${t}`, label, `el-${t}`, roomId, snap.id as string];
  for (const p of [owner, tuner, observer]) markers.push(p.email, p.displayName);
  return { roomId, snapshotId: snap.id as string, owner, tuner, observer, markers };
}

/** The markers of `room` found in `text` (should be none for anyone outside the room). */
export function leakedMarkers(text: string, room: Pick<RoomFixture, 'markers'>, except: string[] = []): string[] {
  return room.markers.filter((m) => !except.includes(m) && text.includes(m));
}
