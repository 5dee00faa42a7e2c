// Requests Node's HTTP parser refuses before any route sees them (a raw non-ASCII path, a broken request
// line, headers over Node's 16 KiB limit) get the API's JSON error shape and a 4xx, and the server goes on
// serving. Sent over a raw TCP socket, since HTTP clients will not send such bytes.
import { connect } from 'node:net';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startTestServer, type TestServer } from '../server/helpers/test-server';

let server: TestServer;

beforeAll(async () => {
  server = await startTestServer();
});
afterAll(async () => {
  await server.close();
});

/** Send raw bytes; resolve with everything the server answered before closing. */
function raw(bytes: Buffer | string): Promise<string> {
  return new Promise((resolve, reject) => {
    const socket = connect(server.port, '127.0.0.1');
    let answer = '';
    socket.on('data', (d) => (answer += d.toString('latin1')));
    socket.on('end', () => resolve(answer));
    socket.on('error', reject);
    socket.write(bytes);
  });
}

function parse(answer: string): { status: number; contentType: string; body: unknown } {
  const [head, body] = answer.split('\r\n\r\n');
  const status = Number(/^HTTP\/1\.1 (\d{3})/.exec(head)?.[1]);
  const contentType = /content-type: ([^\r\n]+)/i.exec(head)?.[1] ?? '';
  return { status, contentType, body: JSON.parse(body) };
}

describe('requests the HTTP parser cannot read', () => {
  it('a raw non-ASCII byte in the path gets 400 in the error shape', async () => {
    const answer = parse(await raw(Buffer.concat([Buffer.from('GET /api/rooms/'), Buffer.from([0xe9, 0x01]), Buffer.from(' HTTP/1.1\r\nHost: x\r\n\r\n')])));
    expect(answer.status).toBe(400);
    expect(answer.contentType).toMatch(/^application\/json/);
    expect(answer.body).toEqual({ error: { code: 'bad-request', message: expect.stringMatching(/could not be read/) } });
  });

  it('a broken request line gets 400', async () => {
    const answer = parse(await raw('THIS IS NOT HTTP\r\n\r\n'));
    expect(answer.status).toBe(400);
    expect((answer.body as { error: { code: string } }).error.code).toBe('bad-request');
  });

  it('headers over the size limit get 431', async () => {
    const answer = parse(await raw(`GET /api/health HTTP/1.1\r\nHost: x\r\nX-Padding: ${'a'.repeat(20_000)}\r\n\r\n`));
    expect(answer.status).toBe(431);
    expect(answer.body).toEqual({ error: { code: 'headers-too-large', message: 'The request headers are too large.' } });
  });

  it('the server still answers afterwards', async () => {
    const res = await server.agent().get('/api/health');
    expect(res.status).toBe(200);
  });
});
