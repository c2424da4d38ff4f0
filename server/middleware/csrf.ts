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

/** Our own origin as this request addressed us, plus the configured public one and any extras. */
function allowedOrigins(req: Request, configured: string[]): Set<string> {
  return new Set([`${req.protocol}://${req.get('host')}`, ...configured]);
}

export function csrfProtection(configuredOrigins: string[]): RequestHandler {
  return (req, _res, next) => {
    if (SAFE_METHODS.has(req.method)) return next();
    const origin = req.get('origin');
    if (origin !== undefined && !allowedOrigins(req, configuredOrigins).has(origin)) {
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

/** The session's token, made on first use. */
export function csrfTokenFor(req: Request): string {
  req.session.csrfToken ??= newToken();
  return req.session.csrfToken;
}
