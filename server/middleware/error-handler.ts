import type { ErrorRequestHandler, RequestHandler } from 'express';
import { AppError, NotFoundError } from '../errors';

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

export const errorHandler: ErrorRequestHandler = (err: unknown, _req, res, _next) => {
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
