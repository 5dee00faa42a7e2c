/** Touchstone uploads: checks by name and content, limits, roles, and using one as the load or a two-port. */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { chipAntennaDesign } from '../../shared/demo/designs';
import { CHIP_ANTENNA_S1P_NAME, chipAntennaTouchstone } from '../../shared/demo/chip-antenna-touchstone';
import { type signUp, signUpTeam, startTestServer, type TestServer } from './helpers/test-server';
import { roomListener } from './helpers/live';

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

async function newRoom(): Promise<string> {
  const id = (
    await owner.agent.post('/api/rooms').send({ name: 'Chip', design: chipAntennaDesign() }).expect(201)
  ).body.id;
  await owner.agent
    .post(`/api/rooms/${id}/members`)
    .send({ email: tuner.user.email, role: 'tuner' })
    .expect(201);
  await owner.agent
    .post(`/api/rooms/${id}/members`)
    .send({ email: observer.user.email, role: 'observer' })
    .expect(201);
  return id;
}

/** A one-port file with a constant Γ = 0.2 + j0.1 at `n` points from `startGHz` to `stopGHz`. */
function flatS1p(startGHz: number, stopGHz: number, n = 31): string {
  const lines = ['! flat test load', '# GHz S RI R 50'];
  for (let i = 0; i < n; i++)
    lines.push(`${(startGHz + ((stopGHz - startGHz) * i) / (n - 1)).toFixed(4)} 0.2 0.1`);
  return `${lines.join('\n')}\n`;
}

/** A matched through (S21 = S12 = 1) from 1.5 to 3.5 GHz. */
function throughS2p(): string {
  const lines = ['# GHz S RI R 50'];
  for (let i = 0; i <= 20; i++) lines.push(`${(1.5 + i * 0.1).toFixed(1)} 0 0 1 0 1 0 0 0`);
  return `${lines.join('\n')}\n`;
}

const upload = (who: Account, roomId: string, text: string | Buffer, name: string, field = 'file') =>
  who.agent
    .post(`/api/rooms/${roomId}/uploads`)
    .attach(field, Buffer.isBuffer(text) ? text : Buffer.from(text), name);

describe('POST /api/rooms/:id/uploads', () => {
  it('stores a .s1p and describes it; lists newest first; gives the text back; tells the room', async () => {
    const roomId = await newRoom();
    const listener = await roomListener(server.url, observer.cookie, roomId);
    try {
      const res = await upload(tuner, roomId, chipAntennaTouchstone(), CHIP_ANTENNA_S1P_NAME).expect(201);
      expect(res.body).toEqual({
        id: expect.any(String),
        roomId,
        fileName: CHIP_ANTENNA_S1P_NAME,
        ports: 1,
        points: 141,
        startHz: 1.8e9,
        stopHz: 3.2e9,
        uploadedBy: { id: tuner.user.id, displayName: 'Tom Tuner' },
        createdAt: expect.any(Number),
      });
      expect(await listener.next('upload-created')).toEqual({ roomId, upload: res.body });
      const second = await upload(owner, roomId, throughS2p(), 'through.S2P').expect(201);
      expect(second.body).toMatchObject({
        ports: 2,
        points: 21,
        startHz: 1.5e9,
        stopHz: 3.5e9,
        fileName: 'through.S2P',
      });

      const list = (await observer.agent.get(`/api/rooms/${roomId}/uploads`).expect(200)).body;
      expect(list.map((u: { id: string }) => u.id)).toEqual([second.body.id, res.body.id]);
      expect(list[0]).not.toHaveProperty('text');
      const one = (await observer.agent.get(`/api/rooms/${roomId}/uploads/${res.body.id}`).expect(200)).body;
      expect(one).toEqual({ ...res.body, text: chipAntennaTouchstone() });
    } finally {
      listener.close();
    }
  });

  it('a file that does not parse is a 400 naming the line', async () => {
    const roomId = await newRoom();
    const text = [
      '! bench file',
      '! VNA export',
      '# GHz S RI R 50',
      '2.0 0.1 0.2',
      '2.1 0.1 0.2',
      '2.2 0.1 0.2',
      '2.3 abc 0.2',
      '',
    ].join('\n');
    const res = await upload(tuner, roomId, text, 'broken.s1p').expect(400);
    expect(res.body.error).toMatchObject({ code: 'invalid-touchstone', line: 7, fileName: 'broken.s1p' });
    expect(res.body.error.message).toMatch(/^line 7: expected a number, found "abc"/);
    // Named .s2p but holding one-port records: read as two-port records wrapped over lines, the 93
    // numbers of 31 three-number lines leave the last record short at the end (line 33).
    const wrong = await upload(tuner, roomId, flatS1p(2, 3), 'load.s2p').expect(400);
    expect(wrong.body.error).toMatchObject({ code: 'invalid-touchstone', line: 33 });
    expect(wrong.body.error.message).toMatch(/^line 33: /);
    const empty = await upload(tuner, roomId, '', 'empty.s1p').expect(400);
    expect(empty.body.error.message).toBe('line 1: the file is empty');
    expect((await tuner.agent.get(`/api/rooms/${roomId}/uploads`).expect(200)).body).toEqual([]);
  });

  it('refuses other file types, binary content, a wrong field and a missing file, each with a clear 400', async () => {
    const roomId = await newRoom();
    const csv = await upload(tuner, roomId, 'f,re,im\n', 'sweep.csv').expect(400);
    expect(csv.body.error).toMatchObject({
      code: 'unsupported-file',
      message: 'Only Touchstone .s1p and .s2p files can be uploaded (got “sweep.csv”).',
    });
    const binary = await upload(tuner, roomId, Buffer.from([0x23, 0x20, 0x00, 0xff]), 'blob.s1p').expect(400);
    expect(binary.body.error.code).toBe('not-text');
    const field = await upload(tuner, roomId, flatS1p(2, 3), 'a.s1p', 'upload').expect(400);
    expect(field.body.error).toMatchObject({
      code: 'invalid-input',
      field: 'file',
      message: 'file: send one Touchstone file in the multipart field "file" (got a file in "upload")',
    });
    const none = await tuner.agent.post(`/api/rooms/${roomId}/uploads`).send({ file: 'x' }).expect(400);
    expect(none.body.error.field).toBe('file');
  });

  it('a file over 5 MiB is 413 too-large', async () => {
    const roomId = await newRoom();
    const big = Buffer.alloc(5 * 1024 * 1024 + 1, 0x21); // '!' comment bytes
    const res = await upload(tuner, roomId, big, 'huge.s1p').expect(413);
    expect(res.body.error).toEqual({
      code: 'too-large',
      message: 'The file is larger than the 5 MiB limit.',
    });
  });

  it('observers get 403, non-members 404, no session 401; an unknown upload is 404', async () => {
    const roomId = await newRoom();
    expect((await upload(observer, roomId, flatS1p(2, 3), 'a.s1p').expect(403)).body.error.code).toBe(
      'forbidden',
    );
    await upload(outsider, roomId, flatS1p(2, 3), 'a.s1p').expect(404);
    await server
      .agent()
      .post(`/api/rooms/${roomId}/uploads`)
      .attach('file', Buffer.from(flatS1p(2, 3)), 'a.s1p')
      .expect(401);
    await outsider.agent.get(`/api/rooms/${roomId}/uploads`).expect(404);
    await owner.agent.get(`/api/rooms/${roomId}/uploads/nosuchupload`).expect(404);
    // An upload of another room is not found through this one.
    const other = await newRoom();
    const theirs = (await upload(owner, other, flatS1p(2, 3), 'a.s1p').expect(201)).body;
    await owner.agent.get(`/api/rooms/${roomId}/uploads/${theirs.id}`).expect(404);
    await owner.agent.post(`/api/rooms/${roomId}/uploads/${theirs.id}/use`).send({ as: 'load' }).expect(404);
  });
});

describe('POST /api/rooms/:id/uploads/:uploadId/use', () => {
  it('makes a .s1p the room’s measured load in one step; the engine reads it back close to the model it came from', async () => {
    const roomId = await newRoom();
    const before = (
      await owner.agent.post(`/api/rooms/${roomId}/snapshots`).send({ label: 'RLC model' }).expect(201)
    ).body;
    const up = (await upload(tuner, roomId, chipAntennaTouchstone(), CHIP_ANTENNA_S1P_NAME).expect(201)).body;
    const res = await tuner.agent
      .post(`/api/rooms/${roomId}/uploads/${up.id}/use`)
      .send({ as: 'load' })
      .expect(200);
    expect(res.body).toMatchObject({
      roomId,
      uploadId: up.id,
      as: 'load',
      elementId: null,
      sweepAdjusted: false,
    });
    const design = (await observer.agent.get(`/api/rooms/${roomId}/design`).expect(200)).body;
    expect(design.load).toEqual({
      kind: 'measured',
      touchstone: chipAntennaTouchstone(),
      uploadId: up.id,
      fileName: CHIP_ANTENNA_S1P_NAME,
    });
    expect(design.sweep).toEqual(chipAntennaDesign().sweep);
    expect(res.body.design).toEqual(design);

    // The .s1p was generated from the room's series RLC with σ = 0.004 noise on Γ (shared/demo), so the
    // worst in-band VSWR from the measured load stays within 5 % of the model's (common practice).
    const after = (
      await owner.agent.post(`/api/rooms/${roomId}/snapshots`).send({ label: 'measured' }).expect(201)
    ).body;
    expect(after.figures.analysed).toBe(true);
    const model = before.figures.worstInBand.vswr as number;
    expect(model).toBeGreaterThan(2);
    expect(Math.abs(after.figures.worstInBand.vswr - model) / model).toBeLessThan(0.05);
  });

  it('narrows a sweep that reaches past the measurement, and refuses one whose band lies outside it', async () => {
    const roomId = await newRoom();
    const narrow = (await upload(tuner, roomId, flatS1p(2.3, 2.6), 'narrow.s1p').expect(201)).body;
    const res = await tuner.agent
      .post(`/api/rooms/${roomId}/uploads/${narrow.id}/use`)
      .send({ as: 'load' })
      .expect(200);
    expect(res.body.sweepAdjusted).toBe(true);
    expect(res.body.design.sweep).toEqual({ ...chipAntennaDesign().sweep, startHz: 2.3e9, stopHz: 2.6e9 });

    const short = (await upload(tuner, roomId, flatS1p(2.45, 2.6), 'short.s1p').expect(201)).body;
    const out = await tuner.agent
      .post(`/api/rooms/${roomId}/uploads/${short.id}/use`)
      .send({ as: 'load' })
      .expect(400);
    expect(out.body.error.code).toBe('out-of-range');
    expect(out.body.error.message).toMatch(
      /^“short\.s1p” covers 2\.45 GHz–2\.6 GHz, but the band 2\.4 GHz–2\.48 GHz reaches outside it/,
    );
    expect((await owner.agent.get(`/api/rooms/${roomId}/design`).expect(200)).body.load.uploadId).toBe(
      narrow.id,
    );
  });

  it('inserts a .s2p as a two-port at the port end, or in place of a named element', async () => {
    const roomId = await newRoom();
    const through = (await upload(tuner, roomId, throughS2p(), 'through.s2p').expect(201)).body;
    const added = (
      await tuner.agent
        .post(`/api/rooms/${roomId}/uploads/${through.id}/use`)
        .send({ as: 'two-port' })
        .expect(200)
    ).body;
    expect(added.elementId).toMatch(/^two-port-/);
    expect(added.design.elements).toEqual([
      {
        id: added.elementId,
        kind: 'two-port',
        label: 'through.s2p',
        touchstone: throughS2p(),
        flipped: false,
        uploadId: through.id,
      },
    ]);

    // Replace a lumped part in the middle of a chain, keeping its place.
    const chain = [
      { id: 'l1', kind: 'series-l', value: 2e-9 },
      { id: 'c1', kind: 'shunt-c', value: 1e-12 },
      { id: 'l2', kind: 'series-l', value: 1e-9 },
    ];
    const room2 = (
      await owner.agent
        .post('/api/rooms')
        .send({ name: 'Chain', design: { ...chipAntennaDesign(), elements: chain } })
        .expect(201)
    ).body.id;
    const up2 = (await upload(owner, room2, throughS2p(), 'part.s2p').expect(201)).body;
    const replaced = (
      await owner.agent
        .post(`/api/rooms/${room2}/uploads/${up2.id}/use`)
        .send({ as: 'two-port', elementId: 'c1' })
        .expect(200)
    ).body;
    expect(replaced.elementId).toBe('c1');
    expect(replaced.design.elements.map((e: { id: string; kind: string }) => `${e.id}:${e.kind}`)).toEqual([
      'l1:series-l',
      'c1:two-port',
      'l2:series-l',
    ]);
    expect(replaced.design.elements[1]).not.toHaveProperty('value');
    const missing = await owner.agent
      .post(`/api/rooms/${room2}/uploads/${up2.id}/use`)
      .send({ as: 'two-port', elementId: 'zz' })
      .expect(404);
    expect(missing.body.error.message).toBe('There is no element “zz” in this room’s chain.');
  });

  it('checks ports, body and role', async () => {
    const roomId = await newRoom();
    const one = (await upload(tuner, roomId, flatS1p(2, 3), 'one.s1p').expect(201)).body;
    const two = (await upload(tuner, roomId, throughS2p(), 'two.s2p').expect(201)).body;
    const use = (id: string) => `/api/rooms/${roomId}/uploads/${id}/use`;
    const asTwoPort = await tuner.agent.post(use(one.id)).send({ as: 'two-port' }).expect(400);
    expect(asTwoPort.body.error).toMatchObject({
      code: 'wrong-ports',
      message: '“one.s1p” has 1 port; a two-port element needs a two-port (.s2p) measurement.',
    });
    const asLoad = await tuner.agent.post(use(two.id)).send({ as: 'load' }).expect(400);
    expect(asLoad.body.error.code).toBe('wrong-ports');
    const badAs = await tuner.agent.post(use(one.id)).send({ as: 'port' }).expect(400);
    expect(badAs.body.error.message).toBe('as: must be "load" or "two-port"');
    await tuner.agent.post(use(one.id)).send({ as: 'load', elementId: 'c1' }).expect(400);
    await observer.agent.post(use(one.id)).send({ as: 'load' }).expect(403);
    await outsider.agent.post(use(one.id)).send({ as: 'load' }).expect(404);
    await tuner.agent.post(use('nosuchupload')).send({ as: 'load' }).expect(404);
  });
});
