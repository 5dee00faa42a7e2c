/** Review notes: anyone in the room writes and replies; threads, edit, resolve, delete; live events. */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { whipE12Design } from '../../shared/demo/designs';
import { signUp, signUpTeam, startTestServer, type TestServer } from './helpers/test-server';
import { roomListener } from './helpers/live';

let server: TestServer;
type Account = Awaited<ReturnType<typeof signUp>>;
let owner: Account;
let tuner: Account;
let observer: Account;
let outsider: Account;
let roomId: string;

beforeAll(async () => {
  server = await startTestServer();
  ({ owner, tuner, observer, outsider } = await signUpTeam(server));
  roomId = (await owner.agent.post('/api/rooms').send({ name: 'Whip', design: whipE12Design() }).expect(201))
    .body.id;
  await owner.agent
    .post(`/api/rooms/${roomId}/members`)
    .send({ email: tuner.user.email, role: 'tuner' })
    .expect(201);
  await owner.agent
    .post(`/api/rooms/${roomId}/members`)
    .send({ email: observer.user.email, role: 'observer' })
    .expect(201);
});
afterAll(async () => {
  await server.close();
});

const notesUrl = () => `/api/rooms/${roomId}/notes`;
const post = (who: Account, body: object, status = 201) =>
  who.agent.post(notesUrl()).send(body).expect(status);

describe('POST and GET /api/rooms/:id/notes', () => {
  it('an observer pins a note to an element at a frequency; replies form one thread; everyone in the room reads them', async () => {
    const first = (
      await post(observer, {
        body: '  C2 looks tight at the top edge ',
        elementId: 'c-shunt',
        frequencyHz: 434.79e6,
      })
    ).body;
    expect(first).toMatchObject({
      roomId,
      parentId: null,
      author: { id: observer.user.id, displayName: 'Orla Observer' },
      body: 'C2 looks tight at the top edge',
      elementId: 'c-shunt',
      frequencyHz: 434.79e6,
      resolved: false,
      resolvedBy: null,
      resolvedAt: null,
      editedAt: null,
    });
    const reply = (await post(tuner, { body: 'Yield run says 96 %.', parentId: first.id })).body;
    expect(reply).toMatchObject({ parentId: first.id, elementId: null, frequencyHz: null });
    // A reply to the reply joins the same thread.
    const second = (await post(owner, { body: 'Good enough.', parentId: reply.id })).body;
    expect(second.parentId).toBe(first.id);
    const roomWide = (await post(tuner, { body: 'Room-wide remark.' })).body;
    expect(roomWide).toMatchObject({ elementId: null, frequencyHz: null, parentId: null });

    for (const who of [owner, tuner, observer]) {
      const list = (await who.agent.get(notesUrl()).expect(200)).body as { id: string }[];
      expect(list.map((n) => n.id)).toEqual([first.id, reply.id, second.id, roomWide.id]);
    }
  });

  it('refuses bad notes with a 400 naming the field', async () => {
    const cases: [object, string, string][] = [
      [{}, 'body', 'body: is required'],
      [{ body: '   ' }, 'body', 'body: must not be empty'],
      [{ body: 'x'.repeat(4001) }, 'body', 'body: must be at most 4000 characters'],
      [
        { body: 'x', frequencyHz: -5 },
        'frequencyHz',
        'frequencyHz: must be a positive frequency in hertz (at most 10 THz)',
      ],
      [{ body: 'x', frequencyHz: '2.4 GHz' }, 'frequencyHz', 'frequencyHz: must be a number of hertz'],
      [
        { body: 'x', elementId: 'no-such-part' },
        'elementId',
        'elementId: there is no element “no-such-part” in this room’s chain',
      ],
      [{ body: 'x', colour: 'red' }, 'body', 'body: has unknown field(s) "colour"'],
      [{ body: 'x', parentId: 'nosuchnote' }, 'parentId', 'parentId: there is no such note in this room'],
    ];
    for (const [body, field, message] of cases) {
      const res = await post(observer, body, 400);
      expect(res.body.error, JSON.stringify(body)).toMatchObject({ code: 'invalid-input', field, message });
    }
    const parent = (await post(observer, { body: 'thread' })).body;
    const pinnedReply = await post(tuner, { body: 'x', parentId: parent.id, elementId: 'c-shunt' }, 400);
    expect(pinnedReply.body.error.message).toMatch(/^elementId: a reply is pinned where its thread is/);
  });

  it('non-members get 404 and no session 401, for every note route', async () => {
    const note = (await post(observer, { body: 'mine' })).body;
    await outsider.agent.get(notesUrl()).expect(404);
    await outsider.agent.post(notesUrl()).send({ body: 'x' }).expect(404);
    await outsider.agent.patch(`${notesUrl()}/${note.id}`).send({ body: 'x' }).expect(404);
    await outsider.agent.delete(`${notesUrl()}/${note.id}`).expect(404);
    await server.agent().get(notesUrl()).expect(401);
    await owner.agent.patch(`${notesUrl()}/nosuchnote`).send({ body: 'x' }).expect(404);
    await owner.agent.delete(`${notesUrl()}/bad%20id`).expect(404);
  });
});

describe('PATCH and DELETE /api/rooms/:id/notes/:noteId', () => {
  it('the author edits the body; others may not', async () => {
    const note = (await post(observer, { body: 'first wording' })).body;
    const edited = (
      await observer.agent.patch(`${notesUrl()}/${note.id}`).send({ body: 'second wording' }).expect(200)
    ).body;
    expect(edited).toMatchObject({ body: 'second wording', editedAt: expect.any(Number) });
    const r = await owner.agent.patch(`${notesUrl()}/${note.id}`).send({ body: 'not mine' }).expect(403);
    expect(r.body.error.message).toBe('Only the author can edit a note.');
    await owner.agent.patch(`${notesUrl()}/${note.id}`).send({}).expect(400);
  });

  it('the author, an owner or a tuner resolves and reopens a thread; another observer may not; replies go with the thread', async () => {
    const other = await signUp(server, { displayName: 'Second Observer' });
    await owner.agent
      .post(`/api/rooms/${roomId}/members`)
      .send({ email: other.user.email, role: 'observer' })
      .expect(201);
    const thread = (await post(observer, { body: 'Check C1 rating' })).body;
    const reply = (await post(other, { body: '+1', parentId: thread.id })).body;

    const refused = await other.agent
      .patch(`${notesUrl()}/${thread.id}`)
      .send({ resolved: true })
      .expect(403);
    expect(refused.body.error.message).toBe('Only the author, an owner or a tuner can resolve a note.');
    const onReply = await other.agent.patch(`${notesUrl()}/${reply.id}`).send({ resolved: true }).expect(400);
    expect(onReply.body.error.field).toBe('resolved');

    const resolved = (
      await tuner.agent.patch(`${notesUrl()}/${thread.id}`).send({ resolved: true }).expect(200)
    ).body;
    expect(resolved).toMatchObject({
      resolved: true,
      resolvedBy: { id: tuner.user.id, displayName: 'Tom Tuner' },
      resolvedAt: expect.any(Number),
      editedAt: null,
    });
    const reopened = (
      await observer.agent.patch(`${notesUrl()}/${thread.id}`).send({ resolved: false }).expect(200)
    ).body;
    expect(reopened).toMatchObject({ resolved: false, resolvedBy: null, resolvedAt: null });
  });

  it('the author or an owner deletes; a thread’s first note takes its replies', async () => {
    const thread = (await post(observer, { body: 'to go' })).body;
    const reply = (await post(tuner, { body: 'reply', parentId: thread.id })).body;
    const r = await tuner.agent.delete(`${notesUrl()}/${thread.id}`).expect(403);
    expect(r.body.error.message).toBe('Only the author or an owner can delete a note.');
    await owner.agent.delete(`${notesUrl()}/${thread.id}`).expect(204);
    const ids = ((await observer.agent.get(notesUrl()).expect(200)).body as { id: string }[]).map(
      (n) => n.id,
    );
    expect(ids).not.toContain(thread.id);
    expect(ids).not.toContain(reply.id);
    const own = (await post(tuner, { body: 'mine to delete' })).body;
    await tuner.agent.delete(`${notesUrl()}/${own.id}`).expect(204);
    await tuner.agent.delete(`${notesUrl()}/${own.id}`).expect(404);
  });
});

describe('note events', () => {
  it('every change reaches the room’s event sockets: note-created, note-updated, note-deleted', async () => {
    const listener = await roomListener(server.url, owner.cookie, roomId);
    try {
      const note = (await post(observer, { body: 'live one', frequencyHz: 433.92e6 })).body;
      expect(await listener.next('note-created', (p) => p.note.id === note.id)).toEqual({ roomId, note });
      const updated = (
        await tuner.agent.patch(`${notesUrl()}/${note.id}`).send({ resolved: true }).expect(200)
      ).body;
      expect(await listener.next('note-updated', (p) => p.note.id === note.id)).toEqual({
        roomId,
        note: updated,
      });
      const reply = (await post(tuner, { body: 'reply', parentId: note.id })).body;
      await observer.agent.delete(`${notesUrl()}/${note.id}`).expect(204);
      expect(await listener.next('note-deleted', (p) => p.noteId === note.id)).toEqual({
        roomId,
        noteId: note.id,
        deletedIds: [note.id, reply.id],
      });
    } finally {
      listener.close();
    }
  });
});
