/**
 * Mail: the MIME reader behind the local mailbox (on messages nodemailer composes), the fake SMTP
 * server itself, the mail texts, and how the server behaves with a real SMTP_URL and in production.
 */
import net from 'node:net';
import nodemailer from 'nodemailer';
import MailComposer from 'nodemailer/lib/mail-composer';
import { afterAll, describe, expect, it } from 'vitest';
import { decodeEncodedWords, decodeQuotedPrintable, readMessage } from '../../server/mail/mime';
import { startFakeSmtpServer } from '../../server/mail/fake-smtp';
import { invitationMail, reviewRequestMail } from '../../server/mail/messages';
import { createMailer } from '../../server/mail/mailer';
import { createLogger } from '../../server/logger';
import { signUp, startTestServer, uniqueEmail, type TestServer } from './helpers/test-server';

function compose(mail: Record<string, unknown>): Promise<Buffer> {
  return new MailComposer(mail).compile().build();
}

describe('readMessage (what nodemailer sends, read back)', () => {
  it('reads the subject, the plain text and the HTML of a multipart/alternative message with non-ASCII text', async () => {
    const text = 'Room “433 MHz whip” — C2 ±5 %, 12 pF, Q ≈ 400, 50 Ω.\nSecond line.\n';
    const html = '<p>Room “433 MHz whip” — 50 Ω</p>';
    const raw = await compose({
      from: 'a@example.test',
      to: 'b@example.test',
      subject: 'Review: “E12 values” ±5 %',
      text,
      html,
    });
    expect(readMessage(raw)).toEqual({
      subject: 'Review: “E12 values” ±5 %',
      to: 'b@example.test',
      text,
      html,
    });
  });

  it('reads long lines (quoted-printable soft breaks) and base64 bodies exactly', async () => {
    const long = `${'https://matchloom.invalid/invitations/'}${'A'.repeat(43)} ${'word '.repeat(40)}µ\n`;
    const qp = await compose({ to: 'x@example.test', subject: 's', text: long });
    expect(qp.toString('latin1')).toMatch(/quoted-printable/i);
    expect(readMessage(qp).text).toBe(long);
    const b64 = await compose({ to: 'x@example.test', subject: 's', text: long, textEncoding: 'base64' });
    expect(b64.toString('latin1')).toMatch(/Content-Transfer-Encoding: base64/i);
    expect(readMessage(b64).text).toBe(long);
    expect(readMessage(b64).html).toBeNull();
  });

  it('decodeEncodedWords joins adjacent encoded words (RFC 2047, section 8 examples)', () => {
    expect(decodeEncodedWords('=?ISO-8859-1?Q?a?=')).toBe('a');
    expect(decodeEncodedWords('=?ISO-8859-1?Q?a?= b')).toBe('a b');
    expect(decodeEncodedWords('=?ISO-8859-1?Q?a?= =?ISO-8859-1?Q?b?=')).toBe('ab');
    expect(decodeEncodedWords('=?ISO-8859-1?Q?a_b?=')).toBe('a b');
    expect(decodeEncodedWords('=?UTF-8?B?wrE1ICU=?=')).toBe('±5 %');
  });

  it('decodeQuotedPrintable removes soft line breaks and decodes =XX (RFC 2045, section 6.7)', () => {
    expect(decodeQuotedPrintable('caf=C3=A9 =\r\nau lait').toString('utf8')).toBe('café au lait');
    expect(decodeQuotedPrintable('a=3Db').toString('utf8')).toBe('a=b');
  });
});

describe('the local fake SMTP server', () => {
  it('keeps what it receives, newest first, up to its limit; clear() empties it; close() stops it', async () => {
    const box = await startFakeSmtpServer({ limit: 2 });
    const transport = nodemailer.createTransport({
      host: box.host,
      port: box.port,
      secure: false,
      ignoreTLS: true,
    });
    try {
      for (const n of [1, 2, 3])
        await transport.sendMail({
          from: 'a@example.test',
          to: `r${n}@example.test`,
          subject: `m${n}`,
          text: `body ${n}`,
        });
      // A single-part body arrives with the line break that ends it before SMTP's closing dot.
      expect(box.messages().map((m) => [m.to, m.subject, m.text.trimEnd()])).toEqual([
        ['r3@example.test', 'm3', 'body 3'],
        ['r2@example.test', 'm2', 'body 2'],
      ]);
      box.clear();
      expect(box.messages()).toEqual([]);
    } finally {
      transport.close();
      await box.close();
    }
    await expect(
      new Promise((resolve, reject) => {
        const s = net.connect(box.port, box.host);
        s.once('connect', () => (s.destroy(), resolve('connected')));
        s.once('error', reject);
      }),
    ).rejects.toThrow(/ECONNREFUSED/);
  });
});

describe('mail texts', () => {
  it('invitationMail names the room, the role, the link and its expiry; the HTML part escapes', () => {
    const m = invitationMail({
      to: 'guest@example.test',
      roomName: '<Bench> & co',
      role: 'tuner',
      inviterName: 'Olive Owner',
      link: 'http://127.0.0.1:3000/invitations/abc',
      expiresAt: Date.UTC(2026, 11, 22, 14, 5),
    });
    expect(m.subject).toBe('Join the room “<Bench> & co” on Matchloom');
    expect(m.text).toContain(
      'Olive Owner invites you to the Matchloom room “<Bench> & co” as a tuner (edit the chain, load, band and goal; snapshot; branch).',
    );
    expect(m.text).toContain('\n\nhttp://127.0.0.1:3000/invitations/abc\n\n');
    expect(m.text).toContain('until 2026-12-22 14:05 UTC');
    expect(m.html).toContain('“&lt;Bench&gt; &amp; co”');
    expect(m.html).not.toContain('<Bench>');
    expect(m.html).toContain('<a href="http://127.0.0.1:3000/invitations/abc">');
  });

  it('reviewRequestMail gives the headline figures when the snapshot was analysed', () => {
    const m = reviewRequestMail({
      to: 'o@example.test',
      roomName: 'Whip',
      snapshotLabel: 'E12 values',
      requesterName: 'Tom Tuner',
      figures: {
        partCount: 2,
        worstInBand: { vswr: 1.216, returnLossDb: 20.1 },
        bandwidth: { lowHz: 420e6, highHz: 447.5e6, fractional: 0.063 },
        goalMet: true,
        analysed: true,
      },
      link: 'http://h/rooms/r1',
    });
    expect(m.text).toContain(
      'Headline figures: 2 parts, worst in-band VSWR 1.22, return loss 20.1 dB, bandwidth 27.5 MHz, goal met.',
    );
    const bare = reviewRequestMail({
      to: 'o@example.test',
      roomName: 'W',
      snapshotLabel: 'x',
      requesterName: null,
      figures: null,
      link: 'http://h/rooms/r1',
    });
    expect(bare.text).not.toContain('Headline figures');
    expect(bare.text).toMatch(/^A member of the room marked the snapshot “x”/);
  });
});

describe('the server with SMTP_URL set, and in production', () => {
  const servers: TestServer[] = [];
  afterAll(async () => {
    for (const s of servers) await s.close();
  });

  it('with SMTP_URL set there is no local mailbox; a mail server that refuses keeps the invitation and says mailSent: false', async () => {
    // A port nothing listens on: take a free one and close it again.
    const port = await new Promise<number>((resolve) => {
      const s = net.createServer().listen(0, '127.0.0.1', () => {
        const p = (s.address() as net.AddressInfo).port;
        s.close(() => resolve(p));
      });
    });
    const server = await startTestServer({ smtpUrl: `smtp://127.0.0.1:${port}` });
    servers.push(server);
    const res = await server.agent().get('/api/dev/mailbox').expect(404);
    expect(res.body.error.message).toMatch(/SMTP_URL is set/);
    const owner = await signUp(server);
    const roomId = (await owner.agent.post('/api/rooms').send({ name: 'R' }).expect(201)).body.id;
    const email = uniqueEmail('unmailed');
    const invited = await owner.agent
      .post(`/api/rooms/${roomId}/members`)
      .send({ email, role: 'tuner' })
      .expect(202);
    expect(invited.body).toMatchObject({ invited: true, email, mailSent: false });
    expect((await owner.agent.get(`/api/rooms/${roomId}/invitations`).expect(200)).body).toHaveLength(1);
  });

  it('in production without SMTP_URL no fake server starts and sending fails (so callers say mailSent: false)', async () => {
    const mailer = await createMailer(
      { nodeEnv: 'production', mailFrom: 'Matchloom <no-reply@matchloom.invalid>' },
      createLogger({ logLevel: 'silent', nodeEnv: 'production' }),
    );
    expect(mailer.mailbox).toBeNull();
    await expect(mailer.send({ to: 'a@example.test', subject: 's', text: 't' })).rejects.toThrow(
      /SMTP_URL is not set/,
    );
    await mailer.close();
  });

  it('in production GET /api/dev/mailbox is 404', async () => {
    const server = await startTestServer({ nodeEnv: 'production' });
    servers.push(server);
    const res = await server.agent().get('/api/dev/mailbox').expect(404);
    expect(res.body.error).toEqual({ code: 'not-found', message: 'No such API route.' });
    await server.agent().delete('/api/dev/mailbox').expect(404);
  });
});
