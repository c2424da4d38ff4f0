/**
 * The one way the client talks to /api: JSON (or a multipart form, or bytes) in and out, the session cookie,
 * the CSRF token on every write, an Idempotency-Key on creates, and errors turned into ApiError with the
 * server's `{ error: { code, message, fields } }` shape (ConflictWithCurrent when a 409 brings the record).
 */
export interface ApiErrorBody {
  code: string;
  message: string;
  fields?: Record<string, string>;
}

export class ApiError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly fields: Record<string, string> = {},
  ) {
    super(message);
    this.name = 'ApiError';
  }
}

/** A 409 that came with the record as it is now (`current` beside the error): the page shows the newer one. */
export class ConflictWithCurrent<T> extends ApiError {
  constructor(
    message: string,
    readonly current: T,
  ) {
    super(409, 'CONFLICT', message);
    this.name = 'ConflictWithCurrent';
  }
}

type Method = 'GET' | 'POST' | 'PUT' | 'PATCH' | 'DELETE';

// The cross-site request token, bound to the session (GET /api/auth/csrf). A new session (sign-in,
// sign-out) needs a new one, so those calls forget it.
let csrfToken: Promise<string> | null = null;

export function forgetCsrfToken() {
  csrfToken = null;
}

function currentCsrfToken(): Promise<string> {
  csrfToken ??= fetch('/api/auth/csrf', { credentials: 'same-origin', headers: { Accept: 'application/json' } })
    .then((r) => (r.ok ? r.json() : Promise.reject(new Error('no token'))))
    .then((b: { token: string }) => b.token)
    .catch((e) => {
      csrfToken = null;
      throw e;
    });
  return csrfToken;
}

interface RequestOptions {
  /** Sent as Idempotency-Key: the server runs a create once per key, and answers a retry with the first answer. */
  idempotencyKey?: string;
  /** Send once more when the request never got an answer (network failure); safe only with a key. */
  retryOnNetworkFailure?: boolean;
  /** The answer is bytes (the browser undoes Content-Encoding: gzip), not JSON. */
  binary?: boolean;
}

const NETWORK_RETRY_DELAY_MS = 500;

async function request<T>(method: Method, path: string, body?: unknown, retried = false, options: RequestOptions = {}): Promise<T> {
  const headers: Record<string, string> = { Accept: 'application/json' };
  const isForm = typeof FormData !== 'undefined' && body instanceof FormData;
  // a FormData body sets its own multipart Content-Type (with the boundary)
  if (body !== undefined && !isForm) headers['Content-Type'] = 'application/json';
  if (options.idempotencyKey) headers['Idempotency-Key'] = options.idempotencyKey;
  if (method !== 'GET') {
    try {
      headers['X-CSRF-Token'] = await currentCsrfToken();
    } catch {
      throw new ApiError(0, 'NETWORK', 'The server cannot be reached. Check that Fanlight is running.');
    }
  }
  let response: Response;
  try {
    response = await fetch(`/api${path}`, {
      method,
      headers,
      credentials: 'same-origin',
      body: body === undefined ? undefined : isForm ? (body as FormData) : JSON.stringify(body),
    });
  } catch {
    if (options.retryOnNetworkFailure) {
      // The answer was lost, not refused: the write may have been stored. The same key makes the retry safe.
      await new Promise((r) => setTimeout(r, NETWORK_RETRY_DELAY_MS));
      return request<T>(method, path, body, retried, { ...options, retryOnNetworkFailure: false });
    }
    throw new ApiError(0, 'NETWORK', 'The server cannot be reached. Check that Fanlight is running.');
  }
  if (response.status === 204) return undefined as T;
  if (options.binary && response.ok) return new Uint8Array(await response.arrayBuffer()) as T;
  const text = await response.text();
  let data: unknown = undefined;
  try {
    data = text ? JSON.parse(text) : undefined;
  } catch {
    // fall through: a non-JSON answer is reported below
  }
  if (!response.ok) {
    const err = (data as { error?: ApiErrorBody } | undefined)?.error;
    const current = (data as { current?: unknown } | undefined)?.current;
    if (response.status === 409 && current !== undefined) throw new ConflictWithCurrent(err?.message ?? 'Changed in the meantime.', current);
    if (err?.code === 'CSRF_REJECTED' && !retried) {
      forgetCsrfToken(); // the session changed under us (signed in elsewhere, expired): fetch a new token once
      return request<T>(method, path, body, true, options);
    }
    throw new ApiError(
      response.status,
      err?.code ?? 'HTTP_' + response.status,
      err?.message ?? `The server answered ${response.status}.`,
      err?.fields,
    );
  }
  return data as T;
}

export const api = {
  get: <T>(path: string) => request<T>('GET', path),
  /** GET of a binary resource (a snapshot). */
  getBytes: (path: string) => request<Uint8Array>('GET', path, undefined, false, { binary: true }),
  post: <T>(path: string, body?: unknown) => request<T>('POST', path, body ?? {}),
  /** A multipart request (a file with its fields); a POST that creates gets an Idempotency-Key and one retry. */
  sendForm: <T>(method: 'POST' | 'PATCH' | 'PUT', path: string, form: FormData) =>
    request<T>(method, path, form, false, method === 'POST' ? { idempotencyKey: newIdempotencyKey(), retryOnNetworkFailure: true } : {}),
  /** A POST that creates a record: sent with a fresh Idempotency-Key and retried once if no answer came. */
  create: <T>(path: string, body?: unknown) =>
    request<T>('POST', path, body ?? {}, false, { idempotencyKey: newIdempotencyKey(), retryOnNetworkFailure: true }),
  patch: <T>(path: string, body: unknown) => request<T>('PATCH', path, body),
  put: <T>(path: string, body: unknown) => request<T>('PUT', path, body),
  delete: <T>(path: string) => request<T>('DELETE', path),
};

/** A random key per create (crypto.randomUUID needs a secure context; loopback counts as one). */
export function newIdempotencyKey(): string {
  if (typeof crypto !== 'undefined' && typeof crypto.randomUUID === 'function') return crypto.randomUUID();
  const bytes = new Uint8Array(16);
  crypto.getRandomValues(bytes);
  return Array.from(bytes, (b) => b.toString(16).padStart(2, '0')).join('');
}
