/**
 * Invitations by e-mail, end to end through the local fake SMTP server: the mailed link shows the
 * invitation, works once for the invited address, and then never again; expired and wrong-account
 * links fail with a clear message.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { signUp, startTestServer, uniqueEmail, type TestServer } from './helpers/test-server';

let server: TestServer;
type Account = Awaited<ReturnType<typeof signUp>>;
let owner: Account;
let roomId: string;

beforeAll(async () => {
  server = await startTestServer();
  owner = await signUp(server, { displayName: 'Olive Owner' });
  roomId = (await owner.agent.post('/api/rooms').send({ name: '433 MHz whip' }).expect(201)).body.id;
});
afterAll(async () => {
  await server.close();
});

interface Mail {
  to: string;
  subject: string;
  text: string;
  html: string | null;
  sentAt: number;
}
const mailbox = async () => (await server.agent().get('/api/dev/mailbox').expect(200)).body as Mail[];

/** Invite `email` and read the token out of the link in the mail that arrived. */
async function invite(
  email: string,
  role = 'tuner',
): Promise<{ token: string; mail: Mail; body: Record<string, unknown> }> {
  const res = await owner.agent.post(`/api/rooms/${roomId}/members`).send({ email, role }).expect(202);
  const mail = (await mailbox()).find((m) => m.to === email);
  if (!mail) throw new Error(`no mail to ${email}`);
  const m = /\/invitations\/([A-Za-z0-9_-]{43})\b/.exec(mail.text);
  if (!m) throw new Error(`no link in ${mail.text}`);
  return { token: m[1], mail, body: res.body };
}

describe('invitation e-mail', () => {
  it('an unknown address gets a mail with a link to the app; the 202 says it was sent', async () => {
    const email = uniqueEmail('guest');
    const before = Date.now();
    const { token, mail, body } = await invite(email, 'observer');
    expect(body).toMatchObject({ invited: true, email, role: 'observer', mailSent: true });
    const week = 7 * 24 * 60 * 60 * 1000;
    expect(body.expiresAt as number).toBeGreaterThanOrEqual(before + week);
    expect(body.expiresAt as number).toBeLessThanOrEqual(Date.now() + week);

    expect(mail.subject).toBe('Join the room “433 MHz whip” on Matchloom');
    expect(mail.sentAt).toBeGreaterThanOrEqual(before);
    // No PUBLIC_URL and no Origin: the link names the host the request went to.
    expect(mail.text).toContain(`${server.url}/invitations/${token}`);
    expect(mail.text).toContain(
      'Olive Owner invites you to the Matchloom room “433 MHz whip” as an observer',
    );
    expect(mail.text).toContain(`with this address (${email})`);
    expect(mail.text).toMatch(/The link works once, until \d{4}-\d\d-\d\d \d\d:\d\d UTC\./);
    expect(mail.html).toContain(`<a href="${server.url}/invitations/${token}">`);
    // Only the token's hash is stored.
    const row = await server.knex('invitations').where({ email }).first();
    expect(row.token_hash).toMatch(/^[0-9a-f]{64}$/);
    expect(JSON.stringify(row)).not.toContain(token);
  });

  it('DELETE /api/dev/mailbox empties the mailbox', async () => {
    await invite(uniqueEmail('x'));
    await server.agent().delete('/api/dev/mailbox').expect(204);
    expect(await mailbox()).toEqual([]);
  });
});

describe('GET /api/invitations/:token and POST /api/invitations/:token/accept', () => {
  it('the mailed link shows the invitation, joins the invited account once, and then never again', async () => {
    const email = uniqueEmail('invitee');
    const { token } = await invite(email, 'tuner');

    const preview = await server.agent().get(`/api/invitations/${token}`).expect(200);
    expect(preview.body).toEqual({
      roomName: '433 MHz whip',
      role: 'tuner',
      email,
      invitedBy: { displayName: 'Olive Owner' },
      expiresAt: expect.any(Number),
      state: 'pending',
    });

    await server.agent().post(`/api/invitations/${token}/accept`).expect(401);
    const invitee = await signUp(server, { email, displayName: 'Ivy Invitee' });
    // Not yet a member: the room is hidden.
    await invitee.agent.get(`/api/rooms/${roomId}`).expect(404);
    const accepted = await invitee.agent.post(`/api/invitations/${token}/accept`).expect(200);
    expect(accepted.body).toEqual({ roomId, role: 'tuner', alreadyMember: false });
    expect((await invitee.agent.get(`/api/rooms/${roomId}`).expect(200)).body.role).toBe('tuner');
    // The owner's pending list no longer shows it.
    const pending = (await owner.agent.get(`/api/rooms/${roomId}/invitations`).expect(200)).body as {
      email: string;
    }[];
    expect(pending.map((p) => p.email)).not.toContain(email);

    const again = await invitee.agent.post(`/api/invitations/${token}/accept`).expect(410);
    expect(again.body.error).toMatchObject({ code: 'invitation-used' });
    expect(again.body.error.message).toMatch(/already been used/);
    expect((await server.agent().get(`/api/invitations/${token}`).expect(200)).body.state).toBe('used');
  });

  it('an expired link fails with a clear 410, and its page says so', async () => {
    const email = uniqueEmail('late');
    const { token } = await invite(email);
    await server
      .knex('invitations')
      .where({ email })
      .update({ expires_at: Date.now() - 60_000 });
    expect((await server.agent().get(`/api/invitations/${token}`).expect(200)).body.state).toBe('expired');
    const late = await signUp(server, { email });
    const res = await late.agent.post(`/api/invitations/${token}/accept`).expect(410);
    expect(res.body.error.code).toBe('invitation-expired');
    expect(res.body.error.message).toMatch(
      /^This invitation link expired on \d{4}-\d\d-\d\d \d\d:\d\d UTC\. Ask the room’s owner to invite you again\.$/,
    );
    await late.agent.get(`/api/rooms/${roomId}`).expect(404);
  });

  it('another account cannot use the link (403 naming both addresses); the invited one still can', async () => {
    const email = uniqueEmail('meant');
    const { token } = await invite(email, 'observer');
    const stranger = await signUp(server);
    const res = await stranger.agent.post(`/api/invitations/${token}/accept`).expect(403);
    expect(res.body.error).toMatchObject({ code: 'wrong-account' });
    expect(res.body.error.message).toBe(
      `This invitation is for ${email}, but you are signed in as ${stranger.user.email}. Sign in with the invited address to accept it.`,
    );
    await stranger.agent.get(`/api/rooms/${roomId}`).expect(404);
    const meant = await signUp(server, { email: email.toUpperCase() });
    expect((await meant.agent.post(`/api/invitations/${token}/accept`).expect(200)).body.role).toBe(
      'observer',
    );
  });

  it('inviting the address again replaces the link: the old one is no longer valid', async () => {
    const email = uniqueEmail('twice');
    const first = await invite(email, 'observer');
    await server.agent().delete('/api/dev/mailbox').expect(204);
    const second = await invite(email, 'tuner');
    expect(second.token).not.toBe(first.token);
    const old = await server.agent().get(`/api/invitations/${first.token}`).expect(404);
    expect(old.body.error.code).toBe('invitation-not-found');
    expect((await server.agent().get(`/api/invitations/${second.token}`).expect(200)).body.role).toBe(
      'tuner',
    );
  });

  it('an account that joined another way uses the link up and keeps its role', async () => {
    const email = uniqueEmail('both');
    const { token } = await invite(email, 'observer');
    const both = await signUp(server, { email });
    await owner.agent.post(`/api/rooms/${roomId}/members`).send({ email, role: 'tuner' }).expect(201);
    expect((await both.agent.post(`/api/invitations/${token}/accept`).expect(200)).body).toEqual({
      roomId,
      role: 'tuner',
      alreadyMember: true,
    });
    await both.agent.post(`/api/invitations/${token}/accept`).expect(410);
  });

  it('unknown, malformed and deleted-room tokens are 404, never a hint about other invitations', async () => {
    const user = await signUp(server);
    for (const t of ['A'.repeat(43), 'short', 'not%20a%20token']) {
      const res = await server.agent().get(`/api/invitations/${t}`).expect(404);
      expect(res.body.error.code).toBe('invitation-not-found');
      await user.agent.post(`/api/invitations/${t}/accept`).expect(404);
    }
    const doomed = (await owner.agent.post('/api/rooms').send({ name: 'Doomed' }).expect(201)).body.id;
    const email = uniqueEmail('doomed');
    const res = await owner.agent
      .post(`/api/rooms/${doomed}/members`)
      .send({ email, role: 'tuner' })
      .expect(202);
    const mail = (await mailbox()).find((m) => m.to === email)!;
    const token = /\/invitations\/([A-Za-z0-9_-]{43})/.exec(mail.text)![1];
    expect(res.body.mailSent).toBe(true);
    await owner.agent.delete(`/api/rooms/${doomed}`).expect(204);
    await server.agent().get(`/api/invitations/${token}`).expect(404);
  });
});
