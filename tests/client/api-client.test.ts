import { afterEach, describe, expect, it, vi } from 'vitest';
import { z } from 'zod';
import { api, ApiError, parseResponse } from '../../client/lib/api-client';
import { apiErrorFrom } from '../../client/lib/api-error';

afterEach(() => vi.unstubAllGlobals());

describe('apiErrorFrom', () => {
  it('reads the contract’s error body', () => {
    const error = apiErrorFrom(403, { error: { code: 'forbidden', message: 'Your role in this room does not allow that.' } });
    expect(error).toBeInstanceOf(ApiError);
    expect([error.status, error.code, error.message, error.fields]).toEqual([403, 'forbidden', 'Your role in this room does not allow that.', undefined]);
  });

  it('turns the server’s named field into a message for that field, without repeating its name', () => {
    const error = apiErrorFrom(400, { error: { code: 'invalid-input', message: 'email: must be a valid e-mail address', field: 'email' } });
    expect(error.fields).toEqual({ email: 'must be a valid e-mail address' });
    expect(error.message).toBe('email: must be a valid e-mail address');
  });

  it('reads a map of field messages and a list of issues', () => {
    expect(apiErrorFrom(400, { error: { code: 'x', message: 'm', fields: { name: ['too long', 'other'] } } }).fields).toEqual({ name: 'too long' });
    expect(apiErrorFrom(400, { error: { code: 'x', message: 'm', issues: [{ path: ['band', 'startHz'], message: 'must be positive' }] } }).fields).toEqual({
      'band.startHz': 'must be positive',
    });
  });

  it('still explains a body that is not the contract’s shape', () => {
    const error = apiErrorFrom(502, '<html>Bad gateway</html>', 'Bad Gateway');
    expect([error.code, error.message]).toEqual(['http-502', 'The server answered 502 Bad Gateway.']);
  });
});

describe('api', () => {
  it('sends JSON with the session cookie and returns the parsed body', async () => {
    const fetchMock = vi.fn(async () => new Response(JSON.stringify({ id: 'r1' }), { status: 201 }));
    vi.stubGlobal('fetch', fetchMock);
    expect(await api.post('/api/rooms', { name: 'Whip' })).toEqual({ id: 'r1' });
    expect(fetchMock).toHaveBeenCalledWith('/api/rooms', {
      method: 'POST',
      headers: { Accept: 'application/json', 'Content-Type': 'application/json' },
      body: '{"name":"Whip"}',
      credentials: 'same-origin',
      signal: undefined,
    });
  });

  it('returns undefined for 204 and throws ApiError for a 4xx', async () => {
    vi.stubGlobal('fetch', vi.fn(async () => new Response(null, { status: 204 })));
    expect(await api.post('/api/auth/signout')).toBeUndefined();
    vi.stubGlobal('fetch', vi.fn(async () => new Response(JSON.stringify({ error: { code: 'not-found', message: 'Room not found.' } }), { status: 404 })));
    await expect(api.get('/api/rooms/x')).rejects.toMatchObject({ name: 'ApiError', status: 404, code: 'not-found', message: 'Room not found.' });
  });

  it('names an unreachable server as a network error', async () => {
    vi.stubGlobal('fetch', vi.fn(async () => Promise.reject(new TypeError('Failed to fetch'))));
    await expect(api.get('/api/me')).rejects.toMatchObject({ status: 0, code: 'network' });
  });

  it('refuses an answer of the wrong shape with a clear error', () => {
    const parse = parseResponse(z.object({ id: z.string() }));
    expect(parse({ id: 'a' })).toEqual({ id: 'a' });
    expect(() => parse({ id: 3 })).toThrow(expect.objectContaining({ code: 'bad-response' }));
  });
});
