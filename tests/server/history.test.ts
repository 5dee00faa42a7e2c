/**
 * Snapshots over time: restore (one edit, seen live, undone by its "before" snapshot), rename and
 * review requests by mail, branches with or without the members, the lineage tree, and compare.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import * as Y from 'yjs';
import { readDesign, readElement, setElementField } from '../../shared/collab/schema';
import { loadRoomDocument } from '../../server/collab/store';
import { createTokenService } from '../../server/auth/tokens';
import { loopbackRoomSink } from '../../server/rooms/loopback-sink';
import { parseDesign } from '../../shared/rf/design';
import { whipE12Design, whipFirstCutDesign } from '../../shared/demo/designs';
import { type signUp, signUpTeam, startTestServer, type TestServer } from './helpers/test-server';
import { roomListener, roomPeer, waitFor } from './helpers/live';

let server: TestServer;
type Account = Awaited<ReturnType<typeof signUp>>;
let owner: Account;
let tuner: Account;
let observer: Account;
let outsider: Account;

beforeAll(async () => {
  server = await startTestServer();
  ({ owner, tuner, observer, outsider } = await signUpTeam(server));
});
afterAll(async () => {
  await server.close();
});

async function newRoom(design: object = whipE12Design(), name = 'Whip'): Promise<string> {
  const id = (await owner.agent.post('/api/rooms').send({ name, design }).expect(201)).body.id as string;
  for (const [who, role] of [
    [tuner, 'tuner'],
    [observer, 'observer'],
  ] as const)
    await owner.agent.post(`/api/rooms/${id}/members`).send({ email: who.user.email, role }).expect(201);
  return id;
}

const snapshot = async (roomId: string, label: string, by: Account = tuner) =>
  (await by.agent.post(`/api/rooms/${roomId}/snapshots`).send({ label }).expect(201)).body;
const design = async (roomId: string, by: Account = owner) =>
  (await by.agent.get(`/api/rooms/${roomId}/design`).expect(200)).body;
/** C2's value in a peer's copy of the whip design. */
const shuntValue = (doc: Parameters<typeof readDesign>[0]) => readElement(doc, 'c-shunt')?.value;
const mailbox = async () =>
  (await server.agent().get('/api/dev/mailbox').expect(200)).body as {
    to: string;
    subject: string;
    text: string;
  }[];

describe('POST /api/rooms/:id/snapshots/:snapshotId/restore', () => {
  it('restores as one edit that open clients see, keeps the state before as a snapshot, and undoing is restoring that', async () => {
    const roomId = await newRoom(whipFirstCutDesign());
    const first = await snapshot(roomId, 'first cut');

    // A tuner changes C2 through the room socket while an observer watches.
    const tunerPeer = roomPeer(server.url, tuner.cookie, roomId);
    const observerPeer = roomPeer(server.url, observer.cookie, roomId);
    const events = await roomListener(server.url, observer.cookie, roomId);
    try {
      await Promise.all([tunerPeer.synced, observerPeer.synced]);
      setElementField(tunerPeer.doc, 'c-shunt', 'value', 10e-12);
      await waitFor(async () => (await design(roomId)).elements[1].value === 10e-12, 'the edit to be stored');
      const edited = await design(roomId);

      const res = await tuner.agent.post(`/api/rooms/${roomId}/snapshots/${first.id}/restore`).expect(200);
      expect(res.body).toMatchObject({
        roomId,
        snapshotId: first.id,
        changed: true,
        undoSnapshot: { label: 'Before restoring “first cut”', roomId, figures: { partCount: 2 } },
      });
      expect(res.body.design).toEqual(parseDesign(whipFirstCutDesign()));
      expect(await design(roomId)).toEqual(parseDesign(whipFirstCutDesign()));

      // Both open clients hold the restored design, without reconnecting.
      for (const peer of [tunerPeer, observerPeer])
        await waitFor(() => shuntValue(peer.doc) === 13.05e-12, 'the restore to reach a client');
      expect(readDesign(observerPeer.doc)).toEqual(parseDesign(whipFirstCutDesign()));
      const restored = await events.next('snapshot-restored');
      expect(restored).toEqual({
        roomId,
        snapshotId: first.id,
        undoSnapshotId: res.body.undoSnapshot.id,
        by: { id: tuner.user.id, displayName: 'Tom Tuner' },
      });
      expect((await events.next('snapshot-created')).snapshot.id).toBe(res.body.undoSnapshot.id);

      // The undo snapshot holds the edited state; restoring it brings the edit back.
      const undo = (await owner.agent.get(`/api/snapshots/${res.body.undoSnapshot.id}`).expect(200)).body;
      expect(undo.design).toEqual(edited);
      await owner.agent.post(`/api/rooms/${roomId}/snapshots/${undo.id}/restore`).expect(200);
      expect(await design(roomId)).toEqual(edited);
      await waitFor(() => shuntValue(observerPeer.doc) === 10e-12, 'the undo to reach a client');
    } finally {
      tunerPeer.destroy();
      observerPeer.destroy();
      events.close();
    }
  });

  it('restoring the design the room already holds changes nothing and keeps no extra snapshot', async () => {
    const roomId = await newRoom();
    const snap = await snapshot(roomId, 'as is');
    const res = await owner.agent.post(`/api/rooms/${roomId}/snapshots/${snap.id}/restore`).expect(200);
    expect(res.body).toMatchObject({ changed: false, undoSnapshot: null });
    expect((await owner.agent.get(`/api/rooms/${roomId}/snapshots`).expect(200)).body).toHaveLength(1);
  });

  it('keeps the room’s design name and may restore a snapshot of the parent room into a branch', async () => {
    const parent = await newRoom(whipFirstCutDesign());
    const cut = await snapshot(parent, 'first cut');
    const later = await snapshot(parent, 'second');
    const branch = (
      await tuner.agent.post(`/api/snapshots/${later.id}/branch`).send({ name: 'Branch' }).expect(201)
    ).body.roomId;
    expect((await design(branch, tuner)).name).toBe('Branch');
    await tuner.agent.post(`/api/rooms/${branch}/snapshots/${cut.id}/restore`).expect(200);
    expect(await design(branch, tuner)).toEqual({ ...parseDesign(whipFirstCutDesign()), name: 'Branch' });
  });

  it('observers get 403, non-members 404, an unknown or unreadable snapshot 404', async () => {
    const roomId = await newRoom();
    const snap = await snapshot(roomId, 's');
    const url = `/api/rooms/${roomId}/snapshots/${snap.id}/restore`;
    expect((await observer.agent.post(url).expect(403)).body.error.code).toBe('forbidden');
    expect((await outsider.agent.post(url).expect(404)).body.error.code).toBe('not-found');
    await server.agent().post(url).expect(401);
    await owner.agent.post(`/api/rooms/${roomId}/snapshots/nosuchsnapshot/restore`).expect(404);
    await owner.agent.post(`/api/rooms/${roomId}/snapshots/bad%20id/restore`).expect(404);
    // A snapshot of a room the caller is not in cannot be restored into theirs.
    const foreignRoom = (await outsider.agent.post('/api/rooms').send({ name: 'Other' }).expect(201)).body.id;
    const foreign = await snapshot(foreignRoom, 'theirs', outsider);
    const r = await owner.agent.post(`/api/rooms/${roomId}/snapshots/${foreign.id}/restore`).expect(404);
    expect(r.body.error.message).toBe('Snapshot not found.');
  });
});

describe('the loopback sink (how a server-side edit reaches the hub)', () => {
  async function editUpdate(roomId: string): Promise<Uint8Array> {
    const { doc } = await loadRoomDocument(server.knex, roomId);
    const before = Y.encodeStateVector(doc);
    setElementField(doc, 'c-shunt', 'value', 11e-12);
    const update = Y.encodeStateAsUpdate(doc, before);
    doc.destroy();
    return update;
  }

  it('does not pretend: a change the hub drops (an observer may not edit) is 503 room-busy, and nothing is stored', async () => {
    const roomId = await newRoom();
    const sink = loopbackRoomSink({
      knex: server.knex,
      tokens: createTokenService(server.config.jwtSecret),
      baseUrl: () => server.url,
      timeoutMs: 400,
    });
    const update = await editUpdate(roomId);
    await expect(sink.applyUpdate(roomId, update, observer.user.id)).rejects.toMatchObject({
      status: 503,
      code: 'room-busy',
    });
    expect((await design(roomId)).elements[1].value).toBe(12e-12);
    await sink.applyUpdate(roomId, update, tuner.user.id);
    expect((await design(roomId)).elements[1].value).toBe(11e-12);
  });

  it('refuses a change larger than one room-socket message with 413, before connecting', async () => {
    const roomId = await newRoom();
    const sink = loopbackRoomSink({
      knex: server.knex,
      tokens: createTokenService(server.config.jwtSecret),
      baseUrl: () => 'http://127.0.0.1:1',
      maxMessageBytes: 16,
    });
    await expect(sink.applyUpdate(roomId, await editUpdate(roomId), tuner.user.id)).rejects.toMatchObject({
      status: 413,
      code: 'too-large',
    });
  });
});

describe('PATCH /api/snapshots/:id and review requests', () => {
  it('renames; marking for review mails the members who keep review mail on, except the one asking', async () => {
    const roomId = await newRoom(whipE12Design(), 'Review room');
    const snap = await snapshot(roomId, 'E12');
    await server.agent().delete('/api/dev/mailbox').expect(204);

    const renamed = await tuner.agent
      .patch(`/api/snapshots/${snap.id}`)
      .send({ label: '  E12 parts ' })
      .expect(200);
    expect(renamed.body).toMatchObject({ id: snap.id, label: 'E12 parts', forReview: false });
    expect(await mailbox()).toEqual([]);

    const marked = await tuner.agent.patch(`/api/snapshots/${snap.id}`).send({ forReview: true }).expect(200);
    expect(marked.body.forReview).toBe(true);
    const mails = await mailbox();
    expect(mails.map((m) => m.to).sort()).toEqual([owner.user.email, observer.user.email].sort());
    for (const m of mails) {
      expect(m.subject).toBe('Review requested: “E12 parts” in Review room');
      expect(m.text).toContain(
        'Tom Tuner marked the snapshot “E12 parts” of the room “Review room” for review.',
      );
      expect(m.text).toContain(`${server.url}/rooms/${roomId}`);
      expect(m.text).toMatch(/worst in-band VSWR 1\.\d\d/);
    }

    // Marking it again sends nothing; an observer who turns review mail off gets none next time.
    await tuner.agent.patch(`/api/snapshots/${snap.id}`).send({ forReview: true }).expect(200);
    expect(await mailbox()).toHaveLength(2);
    const me = await observer.agent.patch('/api/me').send({ notifyReviews: false }).expect(200);
    expect(me.body).toMatchObject({ id: observer.user.id, notifyReviews: false });
    expect((await observer.agent.get('/api/me').expect(200)).body.notifyReviews).toBe(false);
    await server.agent().delete('/api/dev/mailbox').expect(204);
    await owner.agent
      .post(`/api/rooms/${roomId}/snapshots`)
      .send({ label: 'for a look', forReview: true })
      .expect(201);
    expect((await mailbox()).map((m) => m.to)).toEqual([tuner.user.email]);
    await observer.agent.patch('/api/me').send({ notifyReviews: true }).expect(200);
  });

  it('PATCH /api/snapshots/:id is for owners and tuners, with a clear 400 for a bad body', async () => {
    const roomId = await newRoom();
    const snap = await snapshot(roomId, 'x');
    await observer.agent.patch(`/api/snapshots/${snap.id}`).send({ label: 'y' }).expect(403);
    await outsider.agent.patch(`/api/snapshots/${snap.id}`).send({ label: 'y' }).expect(404);
    await owner.agent.patch('/api/snapshots/nosuch').send({ label: 'y' }).expect(404);
    const empty = await owner.agent.patch(`/api/snapshots/${snap.id}`).send({}).expect(400);
    expect(empty.body.error.message).toBe('body: give "label" or "forReview" (or both)');
    const blank = await owner.agent.patch(`/api/snapshots/${snap.id}`).send({ label: '  ' }).expect(400);
    expect(blank.body.error).toMatchObject({ field: 'label', message: 'label: must not be empty' });
    const typo = await owner.agent.patch(`/api/snapshots/${snap.id}`).send({ forreview: true }).expect(400);
    expect(typo.body.error.message).toMatch(/unknown field.*forreview/);
    await owner.agent.patch(`/api/snapshots/${snap.id}`).send({ forReview: 'yes' }).expect(400);
    const me = await owner.agent.patch('/api/me').send({ notifyReviews: 1 }).expect(400);
    expect(me.body.error.field).toBe('notifyReviews');
  });
});

describe('branches and GET /api/rooms/:id/lineage', () => {
  it('a branch takes the members along only with copyMembers', async () => {
    const roomId = await newRoom();
    const snap = await snapshot(roomId, 'base');
    const alone = (
      await owner.agent.post(`/api/snapshots/${snap.id}/branch`).send({ name: 'Alone' }).expect(201)
    ).body;
    expect(alone.room.members.map((m: { userId: string }) => m.userId)).toEqual([owner.user.id]);
    const team = (
      await tuner.agent
        .post(`/api/snapshots/${snap.id}/branch`)
        .send({ name: 'Team', copyMembers: true })
        .expect(201)
    ).body;
    const roles = Object.fromEntries(
      team.room.members.map((m: { userId: string; role: string }) => [m.userId, m.role]),
    );
    expect(roles).toEqual({
      [tuner.user.id]: 'owner',
      [owner.user.id]: 'owner',
      [observer.user.id]: 'observer',
    });
    await tuner.agent
      .post(`/api/snapshots/${snap.id}/branch`)
      .send({ name: 'x', copyMembers: 'yes' })
      .expect(400);
  });

  it('shows the whole tree from any room in it, hiding the names and data of branches the caller is not in', async () => {
    const root = await newRoom(whipE12Design(), 'Root');
    const s1 = await snapshot(root, 'root snap');
    // The owner branches alone; the tuner is not in that branch...
    const hidden = (
      await owner.agent.post(`/api/snapshots/${s1.id}/branch`).send({ name: 'Secret branch' }).expect(201)
    ).body.roomId;
    const s2 = (
      await owner.agent.post(`/api/rooms/${hidden}/snapshots`).send({ label: 'secret snap' }).expect(201)
    ).body;
    // ...but is in a branch of that branch.
    const leaf = (await owner.agent.post(`/api/snapshots/${s2.id}/branch`).send({ name: 'Leaf' }).expect(201))
      .body.roomId;
    await owner.agent
      .post(`/api/rooms/${leaf}/members`)
      .send({ email: tuner.user.email, role: 'tuner' })
      .expect(201);

    const seen = (await tuner.agent.get(`/api/rooms/${leaf}/lineage`).expect(200)).body;
    expect(seen.roomId).toBe(leaf);
    expect(seen.rootRoomId).toBe(root);
    expect(seen.rooms).toHaveLength(3);
    expect(seen.rooms[0]).toMatchObject({
      id: root,
      member: true,
      name: 'Root',
      role: 'tuner',
      parent: null,
    });
    expect(seen.rooms[0].snapshots.map((s: { label: string }) => s.label)).toEqual(['root snap']);
    expect(seen.rooms[0].snapshots[0].figures).toMatchObject({ partCount: 2, analysed: true });
    expect(seen.rooms[1]).toEqual({ id: hidden, member: false, parent: { snapshotId: s1.id, roomId: root } });
    expect(seen.rooms[2]).toMatchObject({
      id: leaf,
      member: true,
      name: 'Leaf',
      role: 'tuner',
      parent: { snapshotId: s2.id, roomId: hidden },
      snapshots: [],
    });
    expect(JSON.stringify(seen)).not.toContain('Secret');

    // The owner, in every room, sees every name; from the root the tree is the same.
    const all = (await owner.agent.get(`/api/rooms/${root}/lineage`).expect(200)).body;
    expect(all.rooms.map((r: { name: string }) => r.name)).toEqual(['Root', 'Secret branch', 'Leaf']);
    expect(all.rooms[1].snapshots.map((s: { label: string }) => s.label)).toEqual(['secret snap']);
  });

  it('a room with no branches is a tree of one; non-members get 404', async () => {
    const roomId = await newRoom();
    const lone = (await observer.agent.get(`/api/rooms/${roomId}/lineage`).expect(200)).body;
    expect(lone).toMatchObject({
      roomId,
      rootRoomId: roomId,
      rooms: [{ id: roomId, member: true, role: 'observer' }],
    });
    await outsider.agent.get(`/api/rooms/${roomId}/lineage`).expect(404);
  });
});

describe('GET /api/rooms/:id/compare', () => {
  it('gives both designs and what changed between a snapshot and the live room', async () => {
    const roomId = await newRoom(whipFirstCutDesign());
    const cut = await snapshot(roomId, 'first cut');
    const peer = roomPeer(server.url, tuner.cookie, roomId);
    try {
      await peer.synced;
      setElementField(peer.doc, 'c-series', 'value', 18e-12);
      await waitFor(async () => (await design(roomId)).elements[0].value === 18e-12, 'the edit to be stored');
    } finally {
      peer.destroy();
    }
    const res = await observer.agent.get(`/api/rooms/${roomId}/compare?a=${cut.id}&b=live`).expect(200);
    expect(res.body.a).toMatchObject({
      ref: cut.id,
      kind: 'snapshot',
      roomId,
      label: 'first cut',
      createdAt: cut.createdAt,
    });
    expect(res.body.a.design).toEqual(parseDesign(whipFirstCutDesign()));
    expect(res.body.b).toMatchObject({ ref: 'live', kind: 'live', roomId, label: 'Whip', createdAt: null });
    expect(res.body.b.design.elements[0].value).toBe(18e-12);
    expect(res.body.diff).toEqual({
      fields: [],
      added: [],
      removed: [],
      changed: [
        { id: 'c-series', kind: 'series-c', changes: [{ path: 'value', old: 18.67e-12, new: 18e-12 }] },
      ],
      moved: [],
      identical: false,
    });
    const same = await observer.agent.get(`/api/rooms/${roomId}/compare?a=live&b=live`).expect(200);
    expect(same.body.diff.identical).toBe(true);
  });

  it('compares across the lineage, and answers 400 for a missing or malformed side, 404 for an unknown or unreadable snapshot', async () => {
    const roomId = await newRoom();
    const snap = await snapshot(roomId, 'base');
    const branch = (
      await owner.agent.post(`/api/snapshots/${snap.id}/branch`).send({ name: 'B' }).expect(201)
    ).body.roomId;
    const across = await owner.agent.get(`/api/rooms/${branch}/compare?a=${snap.id}&b=live`).expect(200);
    expect(across.body.diff.fields).toEqual([{ path: 'name', old: '433 MHz whip antenna', new: 'B' }]);

    const base = `/api/rooms/${roomId}/compare`;
    const missing = await owner.agent.get(`${base}?a=live`).expect(400);
    expect(missing.body.error).toMatchObject({ field: 'b', message: 'b: is required' });
    const bad = await owner.agent.get(`${base}?a=live&b=${encodeURIComponent('no such!')}`).expect(400);
    expect(bad.body.error.message).toBe('b: must be "live" or a snapshot id');
    await owner.agent.get(`${base}?a=live&b=x&b=y`).expect(400);
    const unknown = await owner.agent.get(`${base}?a=live&b=nosuchsnapshot`).expect(404);
    expect(unknown.body.error.message).toBe('Snapshot “nosuchsnapshot” not found.');
    const foreignRoom = (await outsider.agent.post('/api/rooms').send({ name: 'Other' }).expect(201)).body.id;
    const foreign = await snapshot(foreignRoom, 'theirs', outsider);
    await owner.agent.get(`${base}?a=live&b=${foreign.id}`).expect(404);
    await outsider.agent.get(`${base}?a=live&b=live`).expect(404);
  });
});
