import type { ErrorRequestHandler, RequestHandler } from 'express';
import { isDatabaseUnavailable } from '../db/db-errors';
import { AppError, DatabaseUnavailableError, NotFoundError } from '../errors';

/** Unknown /api routes answer in the error shape rather than with the client's index.html. */
export const apiNotFound: RequestHandler = (_req, _res, next) => {
  next(new NotFoundError('No such API route.'));
};

interface HttpishError {
  status?: number;
  statusCode?: number;
  type?: string;
  expose?: boolean;
}

/**
 * During an outage every request fails the same way: the first failure is logged whole, then one line every
 * few seconds says how many more answered 503, so the log stays readable.
 */
class ThrottledLog {
  private lastAt = 0;
  private suppressed = 0;
  constructor(private readonly everyMs: number) {}

  note(detail: string): void {
    const now = Date.now();
    if (now - this.lastAt < this.everyMs) {
      this.suppressed += 1;
      return;
    }
    const more = this.suppressed ? ` (and ${this.suppressed} more since the last line)` : '';
    console.warn(`fanlight: database unavailable, answered 503${more}: ${detail}`);
    this.lastAt = now;
    this.suppressed = 0;
  }
}
const dbOutageLog = new ThrottledLog(5000);

/** Seconds a client should wait before retrying when the database is away. */
const DB_RETRY_AFTER_S = 2;

export const errorHandler: ErrorRequestHandler = (err: unknown, req, res, next) => {
  if (res.headersSent) {
    if (res.writableEnded) {
      // The whole answer was written; what failed came after it (express-session's touch or save of the
      // session at the end of the request). The answer stands; the session is saved again next time.
      console.warn(`fanlight: after answering ${req.method} ${req.originalUrl}: ${(err as Error)?.message ?? String(err)}`);
      return;
    }
    // Half an answer is out: Express's own handler ends the connection, so the client sees a broken answer
    // rather than a wrong one.
    console.error(`fanlight: error while answering ${req.method} ${req.originalUrl}:`, err);
    next(err);
    return;
  }
  if (isDatabaseUnavailable(err)) {
    dbOutageLog.note(`${req.method} ${req.originalUrl}: ${(err as Error).message}`);
    res.set('Retry-After', String(DB_RETRY_AFTER_S));
    res.status(503).json(new DatabaseUnavailableError().toBody());
    return;
  }
  if (err instanceof AppError) {
    res.status(err.status).json(err.toBody());
    return;
  }
  const e = err as HttpishError;
  const status = e?.status ?? e?.statusCode;
  // body-parser errors (too large, bad JSON) carry a status and a type.
  if (status === 413 || e?.type === 'entity.too.large') {
    res.status(413).json(new AppError(413, 'PAYLOAD_TOO_LARGE', 'The request body is too large.').toBody());
    return;
  }
  if (e?.type === 'entity.parse.failed') {
    res.status(400).json(new AppError(400, 'MALFORMED_JSON', 'The request body is not valid JSON.').toBody());
    return;
  }
  if (status === 404) {
    res.status(404).json(new NotFoundError().toBody());
    return;
  }
  if (status && status >= 400 && status < 500) {
    res.status(status).json(new AppError(status, 'VALIDATION_FAILED', 'The request could not be read.').toBody());
    return;
  }
  console.error(err);
  res.status(500).json(new AppError(500, 'INTERNAL', 'Something went wrong on the server.').toBody());
};
