/**
 * Hostile request bodies (fast-check arbitraries) and the property every refused request must hold:
 * no 5xx, the error shape, and not one row of the database changed.
 */
import fc from 'fast-check';
import { expect } from 'vitest';
import type { Knex } from 'knex';
import { writeCount } from './db';
import { checkAnswer, describeExchange, rawRequest, type RawRequest } from './http';

/** Strings an attacker would try, and arbitrary ones. */
export const hostileString: fc.Arbitrary<string> = fc.oneof(
  fc.string({ maxLength: 40 }),
  fc.string({ unit: 'grapheme', maxLength: 30 }),
  fc.string({ unit: 'binary', maxLength: 30 }),
  fc.emailAddress(),
  fc.constantFrom(
    '',
    ' ',
    '\u0000',
    'a\u0000b@example.test',
    "' OR 1=1 --",
    '"; DROP TABLE users; --',
    "x'); DELETE FROM rooms; --",
    '<script>alert(1)</script>',
    '../../../../etc/passwd',
    '%00',
    '%2e%2e%2f',
    '\u202eevil',
    '\ud800',
    '\udfff\ud800',
    '😀'.repeat(50),
    'owner',
    'observer',
    'tuner',
    'admin',
    '__proto__',
    'constructor',
    'toString',
    'x'.repeat(5000),
    'é'.repeat(300),
    '1e309',
    'NaN',
    'null',
    'true',
    '{}',
    '[]',
  ),
);

export const hostileNumber: fc.Arbitrary<number> = fc.oneof(
  fc.integer(),
  fc.double({ noNaN: true, noDefaultInfinity: true }),
  fc.constantFrom(0, -0, -1, 1e308, -1e308, 5e-324, 2 ** 53 + 2, 1e21, 0.1),
);

export const hostileScalar: fc.Arbitrary<unknown> = fc.oneof(hostileString, hostileNumber, fc.boolean(), fc.constant(null));

/** Any JSON value, nested a little, with hostile leaves and keys (including `__proto__`). */
export const hostileValue: fc.Arbitrary<unknown> = fc.letrec<{ value: unknown }>((tie) => ({
  value: fc.oneof(
    { depthSize: 'small', withCrossShrink: true },
    hostileScalar,
    fc.array(tie('value'), { maxLength: 4 }),
    fc.dictionary(fc.oneof(hostileString, fc.constantFrom('__proto__', 'constructor', 'prototype')), tie('value'), { maxKeys: 4 }),
  ),
})).value;

/** Values a field could take: the right one or anything else. */
export function field(valid: fc.Arbitrary<unknown>): fc.Arbitrary<unknown> {
  return fc.oneof({ weight: 2, arbitrary: valid }, { weight: 3, arbitrary: hostileValue });
}

/** A body object with some of these fields (each right or wrong), maybe with extra hostile keys. */
export function shapedBody(fields: Record<string, fc.Arbitrary<unknown>>): fc.Arbitrary<unknown> {
  const record = fc.record(
    Object.fromEntries(Object.entries(fields).map(([k, v]) => [k, field(v)])),
    { requiredKeys: [] },
  );
  return fc.oneof(
    { weight: 4, arbitrary: record },
    {
      weight: 1,
      arbitrary: fc
        .tuple(record, fc.dictionary(hostileString, hostileValue, { maxKeys: 3 }))
        .map(([a, b]) => ({ ...b, ...(a as object) })),
    },
    { weight: 1, arbitrary: hostileValue },
  );
}

/** Raw bodies: bytes, text, and JSON under the wrong content type or charset. */
export interface RawBody {
  body: string | Buffer;
  contentType: string;
}

export const rawBody: fc.Arbitrary<RawBody> = fc.oneof(
  fc.record({ body: fc.string({ maxLength: 200 }), contentType: fc.constant('application/json') }),
  fc.record({ body: fc.uint8Array({ maxLength: 300 }).map((b) => Buffer.from(b)), contentType: fc.constant('application/json') }),
  fc.record({
    body: fc.jsonValue({ maxDepth: 3 }).map((v) => JSON.stringify(v) ?? 'null'),
    contentType: fc.constantFrom(
      'text/plain',
      'application/x-www-form-urlencoded',
      'multipart/form-data; boundary=zzz',
      'application/json; charset=latin1',
      'application/json; charset=utf-16',
      'application/json; charset=nonsense',
      'application/vnd.api+json',
      'application/json, text/plain',
      'application/octet-stream',
    ),
  }),
  fc.constantFrom<RawBody>(
    { body: '{"__proto__": {"polluted": "yes"}}', contentType: 'application/json' },
    { body: '{"constructor": {"prototype": {"polluted": "yes"}}}', contentType: 'application/json' },
    { body: '{"email": "a@example.test", "email": {"$ne": null}}', contentType: 'application/json' },
    { body: '[' + '['.repeat(5000) + ']'.repeat(5001), contentType: 'application/json' },
    { body: '{"a":' + '{"a":'.repeat(3000) + '1' + '}'.repeat(3001), contentType: 'application/json' },
    { body: '\uFEFF{"name": "bom"}', contentType: 'application/json' },
    { body: Buffer.from([0xff, 0xfe, 0x7b, 0x00, 0x7d, 0x00]), contentType: 'application/json' },
    { body: '{"name": "x"', contentType: 'application/json' },
    { body: '1e999999', contentType: 'application/json' },
    { body: '"just a string"', contentType: 'application/json' },
    { body: 'null', contentType: 'application/json' },
  ),
);

export interface FuzzTarget {
  baseUrl: string;
  knex: Knex;
}

/**
 * Send one hostile request and check the answer; a refused one must not have written a single row
 * (the test files also compare whole-database fingerprints around runs of refused requests).
 * Returns the status.
 */
export async function probe(t: FuzzTarget, req: RawRequest): Promise<number> {
  const before = await writeCount(t.knex);
  const res = await rawRequest(t.baseUrl, req);
  const refused = checkAnswer(req, res);
  if (refused) {
    const written = (await writeCount(t.knex)) - before;
    expect(written, `a refused request wrote ${written} row(s): ${describeExchange(req, res)}`).toBe(0);
  }
  return res.status;
}

export function requestWithRaw(base: Omit<RawRequest, 'body' | 'headers'>, raw: RawBody): RawRequest {
  return { ...base, body: raw.body, headers: raw.contentType ? { 'content-type': raw.contentType } : {} };
}

/** Seeded, bounded runs, so a failure reproduces and a file stays well under half a minute. */
export function runs(seed: number, numRuns: number): fc.Parameters<unknown> {
  return { seed, numRuns, endOnFailure: true };
}

/** No request may have planted a key on Object.prototype of the server's process (this process). */
export function expectPrototypeClean(): void {
  expect(Object.prototype).not.toHaveProperty('polluted');
  expect(({} as Record<string, unknown>).polluted).toBeUndefined();
}
