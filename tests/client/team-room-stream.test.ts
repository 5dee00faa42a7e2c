/**
 * The team features' room stream against the real server: one socket.io connection per room shared
 * by its listeners, joined on connect, carrying the server's note events to every listener, refusing
 * a non-member, and closed a moment after the last listener leaves.
 */
import { io, type Socket } from 'socket.io-client';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { TEAM_EVENTS } from '../../shared/collab/team-events';
import { createRoomEventStreams, STREAM_JOINED, type RoomStreamStatus } from '../../client/lib/room-event-stream';
import { signUp, startTestServer, type TestServer } from '../server/helpers/test-server';

let server: TestServer;
const sockets: Socket[] = [];

beforeAll(async () => {
  server = await startTestServer();
});

afterAll(async () => {
  sockets.forEach((s) => s.disconnect());
  await server?.close();
});

const factoryFor = (cookie: string) => () => {
  const socket = io(server.url, { path: '/socket.io', transports: ['websocket'], extraHeaders: { cookie }, reconnection: false });
  sockets.push(socket);
  return socket;
};

function until<T>(check: () => T | undefined, timeoutMs = 5000): Promise<T> {
  return new Promise((resolve, reject) => {
    const started = Date.now();
    const tick = () => {
      const value = check();
      if (value !== undefined) return resolve(value);
      if (Date.now() - started > timeoutMs) return reject(new Error('timed out'));
      setTimeout(tick, 20);
    };
    tick();
  });
}

describe('createRoomEventStreams', () => {
  it('shares one joined socket between listeners, delivers note events to both, and closes after the last leaves', async () => {
    const owner = await signUp(server, { displayName: 'Rhea Okafor' });
    const room = (await owner.agent.post('/api/rooms').send({ name: 'Stream test room' }).expect(201)).body as { id: string };
    const opened: Socket[] = [];
    const factory = factoryFor(owner.cookie);
    const streams = createRoomEventStreams(() => {
      const s = factory();
      opened.push(s);
      return s;
    }, { lingerMs: 50 });

    const seenA: string[] = [];
    const seenB: string[] = [];
    let status: RoomStreamStatus = 'connecting';
    const stopA = streams.subscribe(room.id, (event) => seenA.push(event), (s) => (status = s));
    const stopB = streams.subscribe(room.id, (event) => seenB.push(event));
    await until(() => (status === 'live' ? true : undefined));
    expect(opened).toHaveLength(1);
    await until(() => (seenA.includes(STREAM_JOINED) ? true : undefined));

    await owner.agent.post(`/api/rooms/${room.id}/notes`).send({ body: 'Check the shunt C rating' }).expect(201);
    await until(() => (seenA.includes(TEAM_EVENTS.noteCreated) && seenB.includes(TEAM_EVENTS.noteCreated) ? true : undefined));

    stopA();
    // One listener left: the socket stays.
    await new Promise((r) => setTimeout(r, 120));
    expect(opened[0].connected).toBe(true);
    stopB();
    await until(() => (opened[0].connected ? undefined : true));

    // A new listener after that opens a fresh connection.
    const stopC = streams.subscribe(room.id, () => undefined);
    await until(() => (opened.length === 2 ? true : undefined));
    stopC();
  });

  it('reports offline for a signed-in user who is not a member of the room', async () => {
    const owner = await signUp(server);
    const stranger = await signUp(server);
    const room = (await owner.agent.post('/api/rooms').send({ name: 'Private room' }).expect(201)).body as { id: string };
    const streams = createRoomEventStreams(factoryFor(stranger.cookie), { lingerMs: 0 });
    const statuses: RoomStreamStatus[] = [];
    const events: string[] = [];
    const stop = streams.subscribe(room.id, (e) => events.push(e), (s) => statuses.push(s));
    await until(() => (statuses.includes('offline') ? true : undefined));
    await owner.agent.post(`/api/rooms/${room.id}/notes`).send({ body: 'not for strangers' }).expect(201);
    await new Promise((r) => setTimeout(r, 200));
    expect(events).not.toContain(TEAM_EVENTS.noteCreated);
    expect(events).not.toContain(STREAM_JOINED);
    stop();
  });
});
