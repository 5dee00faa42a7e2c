/**
 * A raw HTTP client for hostile requests (node:http, so any path, header or body bytes can be sent), and
 * the checks every answer must pass: never a 5xx, and every 4xx in the contract's error shape.
 */
import http from 'node:http';
import { expect } from 'vitest';

export interface RawResponse {
  status: number;
  headers: http.IncomingHttpHeaders;
  text: string;
  /** The parsed JSON body, or undefined when the body is not JSON. */
  json: unknown;
}

export interface RawRequest {
  method: string;
  path: string;
  /** `ml_session=...` or a whole Cookie header. */
  cookie?: string;
  /** An object is sent as JSON; a string or Buffer is sent as is. */
  body?: unknown;
  headers?: Record<string, string>;
}

export function rawRequest(baseUrl: string, r: RawRequest): Promise<RawResponse> {
  const url = new URL(baseUrl);
  let payload: Buffer | undefined;
  const headers: Record<string, string> = { ...(r.cookie ? { cookie: r.cookie } : {}) };
  if (typeof r.body === 'string') payload = Buffer.from(r.body, 'utf8');
  else if (Buffer.isBuffer(r.body)) payload = r.body;
  else if (r.body !== undefined) {
    payload = Buffer.from(JSON.stringify(r.body), 'utf8');
    headers['content-type'] = 'application/json';
  }
  if (payload && !headers['content-type'] && !r.headers?.['content-type']) headers['content-type'] = 'application/json';
  Object.assign(headers, r.headers);
  if (payload) headers['content-length'] = String(payload.byteLength);
  return new Promise((resolve, reject) => {
    const req = http.request(
      { host: url.hostname, port: url.port, method: r.method, path: r.path, headers, agent: false },
      (res) => {
        const chunks: Buffer[] = [];
        res.on('data', (c: Buffer) => chunks.push(c));
        res.on('end', () => {
          const text = Buffer.concat(chunks).toString('utf8');
          let json: unknown;
          try {
            json = text ? JSON.parse(text) : undefined;
          } catch {
            json = undefined;
          }
          resolve({ status: res.statusCode ?? 0, headers: res.headers, text, json });
        });
        res.on('error', reject);
      },
    );
    req.on('error', reject);
    if (payload) req.write(payload);
    req.end();
  });
}

/** The contract's error body: `{ error: { code: string, message: string } }` (more fields allowed). */
export function isErrorShape(json: unknown): boolean {
  if (!json || typeof json !== 'object') return false;
  const e = (json as { error?: unknown }).error;
  if (!e || typeof e !== 'object') return false;
  const { code, message } = e as { code?: unknown; message?: unknown };
  return typeof code === 'string' && code.length > 0 && typeof message === 'string' && message.length > 0;
}

/** A one-line description of a request and its answer, for failure messages. */
export function describeExchange(r: RawRequest, res: RawResponse): string {
  const body = r.body === undefined ? '' : typeof r.body === 'string' ? r.body : JSON.stringify(r.body);
  return `${r.method} ${r.path} ${body.slice(0, 300)} -> ${res.status} ${res.text.slice(0, 300)}`;
}

/** Never a 5xx; every 4xx carries the error shape. Returns true when the request was refused (4xx). */
export function checkAnswer(r: RawRequest, res: RawResponse): boolean {
  expect(res.status, describeExchange(r, res)).toBeGreaterThanOrEqual(200);
  expect(res.status, describeExchange(r, res)).toBeLessThan(500);
  if (res.status >= 400) {
    expect(isErrorShape(res.json), `not the error shape: ${describeExchange(r, res)}`).toBe(true);
    expect(res.headers['content-type'] ?? '', describeExchange(r, res)).toMatch(/^application\/json/);
    // Never a stack trace, a file path or a database message in an answer.
    expect(res.text, describeExchange(r, res)).not.toMatch(/\bat [\w.<>]+ \(|node_modules|\/work\/|SQLITE_|knex|TypeError|ReferenceError/);
    return true;
  }
  return false;
}
