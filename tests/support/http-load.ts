/**
 * A bounded load on an app listening on loopback: a few clients sending requests one after another until a
 * deadline, each answer (or network failure) recorded. Used by the database-fault tests.
 */
import { createServer, type Server } from 'node:http';
import type { Express } from 'express';

export interface Listening {
  url: string;
  close(): Promise<void>;
}

export async function listen(app: Express): Promise<Listening> {
  const server: Server = createServer(app);
  // Node closes a keep-alive connection after 5 s idle, and a client that picks that connection for its next
  // request in the same instant sees ECONNRESET: a race of the two ends, not an answer of the app. Proxies
  // in front of a server avoid it the same way: the server keeps idle connections longer than the client.
  server.keepAliveTimeout = 65_000;
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  const address = server.address();
  if (!address || typeof address === 'string') throw new Error('no address');
  return {
    url: `http://127.0.0.1:${address.port}`,
    close: async () => {
      const closed = new Promise<void>((resolve) => server.close(() => resolve()));
      server.closeAllConnections();
      await closed;
    },
  };
}

/** A signed-in browser-like client: the session cookie and the CSRF token on every write. */
export interface HttpSession {
  cookie: string;
  csrf: string;
}

export async function signIn(url: string, email: string, password: string): Promise<HttpSession> {
  const res = await fetch(`${url}/api/auth/signin`, {
    method: 'POST',
    headers: { 'Content-Type': 'application/json' },
    body: JSON.stringify({ email, password }),
  });
  if (res.status !== 200) throw new Error(`sign-in answered ${res.status}`);
  const cookie = (res.headers.get('set-cookie') ?? '').split(';')[0];
  const csrfRes = await fetch(`${url}/api/auth/csrf`, { headers: { Cookie: cookie } });
  const { token } = (await csrfRes.json()) as { token: string };
  return { cookie, csrf: token };
}

export interface Answer {
  /** 0 when no answer came (connection refused or broken) */
  status: number;
  body: unknown;
  /** what this request asked to write, for checking acknowledged writes afterwards */
  tag: string;
  atMs: number;
}

export async function send(url: string, s: HttpSession, method: string, path: string, body?: unknown, tag = ''): Promise<Answer> {
  const started = Date.now();
  try {
    const res = await fetch(`${url}${path}`, {
      method,
      headers: {
        Cookie: s.cookie,
        'X-CSRF-Token': s.csrf,
        ...(body === undefined ? {} : { 'Content-Type': 'application/json' }),
      },
      body: body === undefined ? undefined : JSON.stringify(body),
      signal: AbortSignal.timeout(15_000),
    });
    const text = await res.text();
    let parsed: unknown = text;
    try {
      parsed = text ? JSON.parse(text) : null;
    } catch {
      // not JSON: keep the text
    }
    return { status: res.status, body: parsed, tag, atMs: started };
  } catch (e) {
    const cause = (e as { cause?: { code?: string; message?: string } }).cause;
    const network = cause?.code ?? cause?.message ?? String(e);
    return { status: 0, body: { network, request: `${method} ${path}`, afterMs: Date.now() - started }, tag, atMs: started };
  }
}

/** Runs `clients` loops of `next(i)` until `untilMs` (absolute), at most `maxPerClient` requests each. */
export async function loadUntil(
  clients: number,
  untilMs: number,
  next: (client: number, i: number) => Promise<Answer>,
  maxPerClient = 2000,
): Promise<Answer[]> {
  const answers: Answer[] = [];
  await Promise.all(
    Array.from({ length: clients }, async (_, client) => {
      for (let i = 0; i < maxPerClient && Date.now() < untilMs; i++) answers.push(await next(client, i));
    }),
  );
  return answers;
}

/** Polls GET /api/health until it answers 200; returns the ms it took, or throws after `withinMs`. */
export async function healthyWithin(url: string, withinMs: number): Promise<number> {
  const started = Date.now();
  while (Date.now() - started < withinMs) {
    try {
      const res = await fetch(`${url}/api/health`, { signal: AbortSignal.timeout(4000) });
      if (res.status === 200) return Date.now() - started;
    } catch {
      // not answering yet
    }
    await new Promise((r) => setTimeout(r, 100));
  }
  throw new Error(`/api/health did not answer 200 within ${withinMs} ms`);
}
