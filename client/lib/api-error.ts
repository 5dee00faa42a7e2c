/**
 * The one error type the client's API layer throws. It carries the contract's error body
 * (`{ "error": { "code", "message" } }`) and, when the server names them, per-field messages
 * keyed by the request body's field name (`{ email: "is already registered" }`).
 */
export class ApiError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly fields?: Readonly<Record<string, string>>,
  ) {
    super(message);
    this.name = 'ApiError';
  }
}

export const isApiError = (error: unknown): error is ApiError => error instanceof ApiError;

const isRecord = (value: unknown): value is Record<string, unknown> =>
  typeof value === 'object' && value !== null && !Array.isArray(value);

/**
 * Field messages from an error body. The server names the one field at fault
 * (`{ field: "email", message: "email: must be a valid e-mail address" }`); the message shown beside
 * the field drops the repeated name. A map (`fields: { email: "..." }`) or a list of issues
 * (`issues: [{ path: "email", message: "..." }]`) is read too.
 */
function fieldsFrom(error: Record<string, unknown>): Record<string, string> | undefined {
  const fields: Record<string, string> = {};
  const raw = error.fields ?? error.issues;
  if (typeof error.field === 'string' && error.field && typeof error.message === 'string') {
    const prefix = `${error.field}: `;
    fields[error.field] = error.message.startsWith(prefix) ? error.message.slice(prefix.length) : error.message;
  } else if (Array.isArray(raw)) {
    for (const issue of raw) {
      if (!isRecord(issue) || typeof issue.message !== 'string') continue;
      const path = Array.isArray(issue.path) ? issue.path.join('.') : issue.path ?? issue.field;
      if (typeof path === 'string' && path && !(path in fields)) fields[path] = issue.message;
    }
  } else if (isRecord(raw)) {
    for (const [name, value] of Object.entries(raw)) {
      const message = Array.isArray(value) ? value.find((v) => typeof v === 'string') : value;
      if (typeof message === 'string') fields[name] = message;
    }
  }
  return Object.keys(fields).length ? fields : undefined;
}

/** Builds an `ApiError` from a failed response's status and (possibly absent or non-JSON) body. */
export function apiErrorFrom(status: number, body: unknown, statusText = ''): ApiError {
  const error = isRecord(body) && isRecord(body.error) ? body.error : undefined;
  const code = typeof error?.code === 'string' ? error.code : `http-${status}`;
  const message =
    typeof error?.message === 'string' && error.message
      ? error.message
      : `The server answered ${status}${statusText ? ` ${statusText}` : ''}.`;
  return new ApiError(status, code, message, error ? fieldsFrom(error) : undefined);
}
