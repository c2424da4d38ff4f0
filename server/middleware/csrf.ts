/**
 * Refuses cross-site request forgery on every state-changing route, in two layers:
 * 1. the browser's Origin (or Sec-Fetch-Site) must say the request came from our own pages;
 * 2. once signed in, the request must carry X-CSRF-Token with the session's token (GET /api/auth/csrf).
 * Sign-in needs only the first: it has no session to bind a token to yet.
 */
import type { Request, RequestHandler } from 'express';
import { ForbiddenError } from '../errors';
import { newToken, sameToken } from '../services/tokens';

const SAFE_METHODS = new Set(['GET', 'HEAD', 'OPTIONS']);
const TOKEN_FREE_PATHS = new Set(['/auth/signin']);

/**
 * The allowed origins come from configuration only (PUBLIC_ORIGIN, ALLOWED_ORIGINS), never from the request:
 * a request's own Host header is whatever the sender wrote, so `Host: evil.example` with
 * `Origin: http://evil.example` must not pass.
 */
export function csrfProtection(configuredOrigins: string[]): RequestHandler {
  const allowed = new Set(configuredOrigins.map(normaliseOrigin));
  return (req, _res, next) => {
    if (SAFE_METHODS.has(req.method)) return next();
    const origin = req.get('origin');
    if (origin !== undefined && !allowed.has(normaliseOrigin(origin))) {
      return next(new ForbiddenError('This request came from another site and was refused.', 'CSRF_REJECTED'));
    }
    if (origin === undefined && req.get('sec-fetch-site') === 'cross-site') {
      return next(new ForbiddenError('This request came from another site and was refused.', 'CSRF_REJECTED'));
    }
    if (req.user && !TOKEN_FREE_PATHS.has(req.path)) {
      if (!sameToken(req.get('x-csrf-token'), req.session.csrfToken)) {
        return next(
          new ForbiddenError(
            'The request token is missing or stale: fetch GET /api/auth/csrf and send it as X-CSRF-Token.',
            'CSRF_REJECTED',
          ),
        );
      }
    }
    next();
  };
}

/** "http://Example.test:80/" and "http://example.test" are one origin (RFC 6454 §4 serialisation). */
export function normaliseOrigin(origin: string): string {
  try {
    const u = new URL(origin);
    return u.origin;
  } catch {
    return origin;
  }
}

/** The session's token, made on first use. */
export function csrfTokenFor(req: Request): string {
  req.session.csrfToken ??= newToken();
  return req.session.csrfToken;
}
