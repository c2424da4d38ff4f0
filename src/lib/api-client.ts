/**
 * The one way the client talks to /api: JSON in and out, the session cookie, and errors turned into
 * ApiError with the server's `{ error: { code, message, fields } }` shape.
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

async function request<T>(method: Method, path: string, body?: unknown, retried = false): Promise<T> {
  const headers: Record<string, string> = { Accept: 'application/json' };
  if (body !== undefined) headers['Content-Type'] = 'application/json';
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
      body: body === undefined ? undefined : JSON.stringify(body),
    });
  } catch {
    throw new ApiError(0, 'NETWORK', 'The server cannot be reached. Check that Fanlight is running.');
  }
  if (response.status === 204) return undefined as T;
  const text = await response.text();
  let data: unknown = undefined;
  try {
    data = text ? JSON.parse(text) : undefined;
  } catch {
    // fall through: a non-JSON answer is reported below
  }
  if (!response.ok) {
    const err = (data as { error?: ApiErrorBody } | undefined)?.error;
    if (err?.code === 'CSRF_REJECTED' && !retried) {
      forgetCsrfToken(); // the session changed under us (signed in elsewhere, expired): fetch a new token once
      return request<T>(method, path, body, true);
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
  post: <T>(path: string, body?: unknown) => request<T>('POST', path, body ?? {}),
  patch: <T>(path: string, body: unknown) => request<T>('PATCH', path, body),
  put: <T>(path: string, body: unknown) => request<T>('PUT', path, body),
  delete: <T>(path: string) => request<T>('DELETE', path),
};
