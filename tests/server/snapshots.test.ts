import * as Y from 'yjs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { appendUpdate, loadRoomDocument } from '../../server/collab/store';
import { readDesign, setDesignField, insertElement } from '../../shared/collab/schema';
import { parseDesign } from '../../shared/rf/design';
import { whipE12Design, chipAntennaDesign } from '../../shared/demo/designs';
import { signUp, startTestServer, type TestServer } from './helpers/test-server';

let server: TestServer;
let owner: Awaited<ReturnType<typeof signUp>>;
let tuner: Awaited<ReturnType<typeof signUp>>;

beforeAll(async () => {
  server = await startTestServer();
  owner = await signUp(server, { displayName: 'Owner' });
  tuner = await signUp(server, { displayName: 'Tuner' });
});
afterAll(async () => {
  await server.close();
});

async function newRoom(design: object = whipE12Design()): Promise<string> {
  const id = (await owner.agent.post('/api/rooms').send({ name: 'Whip', design }).expect(201)).body.id;
  await owner.agent
    .post(`/api/rooms/${id}/members`)
    .send({ email: tuner.user.email, role: 'tuner' })
    .expect(201);
  return id;
}

/** An edit as the room socket stores it: an update appended to the room's log. */
async function editRoom(roomId: string, edit: (doc: Y.Doc) => void): Promise<void> {
  const { doc } = await loadRoomDocument(server.knex, roomId);
  const before = Y.encodeStateVector(doc);
  edit(doc);
  await appendUpdate(server.knex, roomId, Y.encodeStateAsUpdate(doc, before), tuner.user.id);
  doc.destroy();
}

describe('POST /api/rooms/:id/snapshots', () => {
  it('stores the current document and design with figures from the engine', async () => {
    const roomId = await newRoom();
    const res = await tuner.agent
      .post(`/api/rooms/${roomId}/snapshots`)
      .send({ label: '  E12 values ' })
      .expect(201);
    expect(res.body).toMatchObject({
      id: expect.any(String),
      roomId,
      label: 'E12 values',
      createdBy: { id: tuner.user.id, displayName: 'Tuner' },
      forReview: false,
      figures: { partCount: 2, analysed: true, goalMet: true },
    });
    // Worst in-band VSWR of the invented whip with 18 pF / 12 pF: series-then-shunt L-section arithmetic
    // by hand (common practice; lossless parts) gives 1.216 at the lower band edge; Q = 400 barely moves it.
    expect(res.body.figures.worstInBand.vswr).toBeGreaterThan(1.1);
    expect(res.body.figures.worstInBand.vswr).toBeLessThan(1.3);
    const row = await server.knex('snapshots').where({ id: res.body.id }).first();
    expect(JSON.parse(row.design_json)).toEqual(parseDesign(whipE12Design()));
    const doc = new Y.Doc();
    Y.applyUpdate(doc, new Uint8Array(row.state));
    expect(readDesign(doc)).toEqual(parseDesign(whipE12Design()));
  });

  it('captures edits made through the room socket', async () => {
    const roomId = await newRoom(chipAntennaDesign());
    await editRoom(roomId, (doc) => insertElement(doc, { id: 'l1', kind: 'series-l', value: 2.2e-9 }));
    const snap = (
      await owner.agent.post(`/api/rooms/${roomId}/snapshots`).send({ label: 'one part' }).expect(201)
    ).body;
    expect(snap.figures.partCount).toBe(1);
    const full = (await owner.agent.get(`/api/snapshots/${snap.id}`).expect(200)).body;
    expect(full.design.elements).toEqual([{ id: 'l1', kind: 'series-l', value: 2.2e-9 }]);
    const design = (await owner.agent.get(`/api/rooms/${roomId}/design`).expect(200)).body;
    expect(design.elements).toHaveLength(1);
  });

  it('a document holding an invalid design cannot be snapshot (409 naming the path), and its design is 409 too', async () => {
    const roomId = await newRoom();
    await editRoom(roomId, (doc) => setDesignField(doc, 'referenceOhms', -5));
    const res = await owner.agent
      .post(`/api/rooms/${roomId}/snapshots`)
      .send({ label: 'broken' })
      .expect(409);
    expect(res.body.error).toMatchObject({ code: 'invalid-design', path: 'referenceOhms' });
    expect((await owner.agent.get(`/api/rooms/${roomId}/design`).expect(409)).body.error.path).toBe(
      'referenceOhms',
    );
  });

  it.each([
    [{}, 'label: is required'],
    [{ label: '' }, 'label: must not be empty'],
    [{ label: 3 }, 'label: must be a string'],
    [{ label: 'x'.repeat(201) }, 'label: must be at most 200 characters'],
    [{ label: 'ok', forReview: 'yes' }, 'forReview: must be true or false'],
  ])('answers 400 for %o', async (body, message) => {
    const roomId = await newRoom();
    expect(
      (await owner.agent.post(`/api/rooms/${roomId}/snapshots`).send(body).expect(400)).body.error.message,
    ).toBe(message);
  });
});

describe('GET /api/rooms/:id/snapshots', () => {
  it('lists newest first', async () => {
    const roomId = await newRoom();
    for (const label of ['one', 'two', 'three'])
      await owner.agent.post(`/api/rooms/${roomId}/snapshots`).send({ label }).expect(201);
    const list = (await tuner.agent.get(`/api/rooms/${roomId}/snapshots`).expect(200)).body;
    expect(list.map((s: { label: string }) => s.label)).toEqual(['three', 'two', 'one']);
  });
});

describe('POST /api/snapshots/:id/branch', () => {
  it('starts a new room from the snapshot, owned by the caller, with its lineage', async () => {
    const roomId = await newRoom();
    const snap = (
      await owner.agent.post(`/api/rooms/${roomId}/snapshots`).send({ label: 'E12 values' }).expect(201)
    ).body;
    // Later edits to the parent do not reach the branch.
    await editRoom(roomId, (doc) => setDesignField(doc, 'goal', { maxVswr: 1.5 }));
    const res = await tuner.agent
      .post(`/api/snapshots/${snap.id}/branch`)
      .send({ name: 'Low-cost branch' })
      .expect(201);
    expect(res.body.roomId).toEqual(expect.any(String));
    expect(res.body.room).toMatchObject({
      name: 'Low-cost branch',
      role: 'owner',
      parent: { snapshotId: snap.id, snapshotLabel: 'E12 values', roomId, roomName: 'Whip' },
    });
    expect(res.body.room.members).toEqual([
      expect.objectContaining({ userId: tuner.user.id, role: 'owner' }),
    ]);
    const design = (await tuner.agent.get(`/api/rooms/${res.body.roomId}/design`).expect(200)).body;
    expect(design).toEqual({ ...parseDesign(whipE12Design()), name: 'Low-cost branch' });
    const row = await server.knex('rooms').where({ id: res.body.roomId }).first();
    expect(row.parent_snapshot_id).toBe(snap.id);
    // The owner of the parent is not a member of the branch.
    await owner.agent.get(`/api/rooms/${res.body.roomId}`).expect(404);
    // The branch shows in the tuner's list with its parent.
    const rooms = (await tuner.agent.get('/api/rooms')).body;
    expect(rooms.find((r: { id: string }) => r.id === res.body.roomId).parent.snapshotId).toBe(snap.id);
  });

  it('hides the parent room from a branch member who is not in it', async () => {
    const roomId = await newRoom();
    const snap = (await owner.agent.post(`/api/rooms/${roomId}/snapshots`).send({ label: 's' }).expect(201))
      .body;
    const branchId = (
      await owner.agent.post(`/api/snapshots/${snap.id}/branch`).send({ name: 'B' }).expect(201)
    ).body.roomId;
    const outsider = await signUp(server);
    await owner.agent
      .post(`/api/rooms/${branchId}/members`)
      .send({ email: outsider.user.email, role: 'observer' })
      .expect(201);
    const details = (await outsider.agent.get(`/api/rooms/${branchId}`).expect(200)).body;
    expect(details.parent).toEqual({ snapshotId: snap.id, snapshotLabel: 's', roomId: null, roomName: null });
  });

  it('is 404 for an unknown snapshot and 400 for a bad name', async () => {
    await owner.agent.post('/api/snapshots/AAAAAAAAAAAAAAAAAAAAAA/branch').send({ name: 'x' }).expect(404);
    const roomId = await newRoom();
    const snap = (await owner.agent.post(`/api/rooms/${roomId}/snapshots`).send({ label: 's' }).expect(201))
      .body;
    expect(
      (await owner.agent.post(`/api/snapshots/${snap.id}/branch`).send({}).expect(400)).body.error.message,
    ).toBe('name: is required');
  });
});
