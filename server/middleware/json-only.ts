import type { RequestHandler } from 'express';
import { UnsupportedMediaTypeError } from '../errors';

const WRITES = new Set(['POST', 'PUT', 'PATCH', 'DELETE']);

/**
 * The API reads JSON bodies only: a write that carries a body of another type answers 415 rather than being
 * read as an empty body (and then failing validation with a misleading 400). Routes that take a file say so
 * in `fileRoutes`: they also take multipart/form-data, and the snapshot route checks its own types.
 */
export function jsonBodiesOnly(fileRoutes: RegExp[], ownTypeRoutes: RegExp[] = []): RequestHandler {
  return (req, _res, next) => {
    if (!WRITES.has(req.method)) return next();
    // no body at all (e.g. POST …/archive with nothing to say, sent with or without Content-Length: 0)
    if (req.get('content-length') === '0') return next();
    const type = req.is(['application/json', 'application/*+json']);
    if (type === null || type) return next();
    if (ownTypeRoutes.some((r) => r.test(req.path))) return next();
    if (req.is('multipart/form-data') && fileRoutes.some((r) => r.test(req.path))) return next();
    next(
      new UnsupportedMediaTypeError(
        `Send the request body as application/json, not ${req.get('content-type') || 'an untyped body'}.`,
      ),
    );
  };
}
