/**
 * The fetch wrapper every feature's API file goes through: JSON in and out, the session cookie
 * sent (same origin), and any failure thrown as an `ApiError`. It has no UI side effects; the query
 * client decides what to show (see `lib/react-query.ts`).
 */
import { ApiError, apiErrorFrom } from './api-error';

export { ApiError, isApiError } from './api-error';

type Method = 'GET' | 'POST' | 'PATCH' | 'PUT' | 'DELETE';

export interface RequestOptions {
  body?: unknown;
  signal?: AbortSignal;
  headers?: Record<string, string>;
}

async function bodyOf(response: Response): Promise<unknown> {
  if (response.status === 204) return undefined;
  const text = await response.text();
  if (!text) return undefined;
  try {
    return JSON.parse(text) as unknown;
  } catch {
    return text;
  }
}

async function request(method: Method, url: string, options: RequestOptions = {}): Promise<unknown> {
  const headers: Record<string, string> = { Accept: 'application/json', ...options.headers };
  let body: BodyInit | undefined;
  if (options.body instanceof FormData) body = options.body;
  else if (options.body !== undefined) {
    headers['Content-Type'] = 'application/json';
    body = JSON.stringify(options.body);
  }

  let response: Response;
  try {
    response = await fetch(url, { method, headers, body, credentials: 'same-origin', signal: options.signal });
  } catch (cause) {
    if (cause instanceof DOMException && cause.name === 'AbortError') throw cause;
    throw new ApiError(0, 'network', 'The server could not be reached. Check your connection and try again.');
  }

  const data = await bodyOf(response);
  if (!response.ok) throw apiErrorFrom(response.status, data, response.statusText);
  return data;
}

/** Returns the parsed JSON body (`unknown`: callers check it with their own schema). */
export const api = {
  get: (url: string, options?: Omit<RequestOptions, 'body'>) => request('GET', url, options),
  post: (url: string, body?: unknown, options?: RequestOptions) => request('POST', url, { ...options, body }),
  patch: (url: string, body?: unknown, options?: RequestOptions) => request('PATCH', url, { ...options, body }),
  put: (url: string, body?: unknown, options?: RequestOptions) => request('PUT', url, { ...options, body }),
  delete: (url: string, options?: RequestOptions) => request('DELETE', url, options),
};

/**
 * Checks a response body against a zod schema; a body of the wrong shape becomes an `ApiError`
 * (`bad-response`) rather than a crash somewhere in a component.
 */
export function parseResponse<T>(schema: { safeParse(data: unknown): { success: true; data: T } | { success: false } }) {
  return (data: unknown): T => {
    const result = schema.safeParse(data);
    if (!result.success) throw new ApiError(0, 'bad-response', 'The server sent an answer the app did not expect.');
    return result.data;
  };
}
