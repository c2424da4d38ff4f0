/**
 * The two requests lib/api-client.ts does not cover: a binary answer (the snapshot) and an edit whose 409
 * carries the newer record beside the error (`current`), which the page shows instead of a bare error.
 */
import { ApiError, type ApiErrorBody } from '../../../lib/api-client';

const unreachable = () => new ApiError(0, 'NETWORK', 'The server cannot be reached. Check that Fanlight is running.');

async function errorOf(response: Response): Promise<{ error: ApiError; body: unknown }> {
  let body: unknown;
  try {
    body = await response.json();
  } catch {
    body = undefined;
  }
  const err = (body as { error?: ApiErrorBody } | undefined)?.error;
  return {
    error: new ApiError(
      response.status,
      err?.code ?? `HTTP_${response.status}`,
      err?.message ?? `The server answered ${response.status}.`,
      err?.fields,
    ),
    body,
  };
}

/** GET of a binary resource under /api (the browser undoes Content-Encoding: gzip). */
export async function getBytes(path: string): Promise<Uint8Array> {
  let response: Response;
  try {
    response = await fetch(`/api${path}`, { credentials: 'same-origin' });
  } catch {
    throw unreachable();
  }
  if (!response.ok) throw (await errorOf(response)).error;
  return new Uint8Array(await response.arrayBuffer());
}

/** A 409 that came with the record as it is now. */
export class ConflictWithCurrent<T> extends ApiError {
  constructor(
    message: string,
    readonly current: T,
  ) {
    super(409, 'CONFLICT', message);
  }
}

async function csrfToken(): Promise<string> {
  const r = await fetch('/api/auth/csrf', { credentials: 'same-origin', headers: { Accept: 'application/json' } });
  if (!r.ok) throw unreachable();
  return ((await r.json()) as { token: string }).token;
}

/** PATCH that turns a 409 with `current` into ConflictWithCurrent. */
export async function patchKeepingConflict<T, C>(path: string, body: unknown): Promise<T> {
  let response: Response;
  try {
    response = await fetch(`/api${path}`, {
      method: 'PATCH',
      credentials: 'same-origin',
      headers: { Accept: 'application/json', 'Content-Type': 'application/json', 'X-CSRF-Token': await csrfToken() },
      body: JSON.stringify(body),
    });
  } catch (e) {
    throw e instanceof ApiError ? e : unreachable();
  }
  if (response.ok) return (await response.json()) as T;
  const { error, body: answer } = await errorOf(response);
  const current = (answer as { current?: C } | undefined)?.current;
  if (response.status === 409 && current !== undefined) throw new ConflictWithCurrent<C>(error.message, current);
  throw error;
}
