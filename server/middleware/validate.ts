import type { RequestHandler } from 'express';
import type { z } from 'zod';
import { NotFoundError, ValidationError, type FieldErrors } from '../errors';

/** Field path → first message, e.g. { email: "Enter an e-mail address." }. */
export function fieldErrors(error: z.ZodError): FieldErrors {
  const fields: FieldErrors = {};
  for (const issue of error.issues) {
    const key = issue.path.length ? issue.path.join('.') : '_';
    fields[key] ??= issue.message;
  }
  return fields;
}

/** Parses req.body with a zod schema and replaces it with the parsed value, or answers 400 naming each field. */
export function validateBody<S extends z.ZodType>(schema: S): RequestHandler {
  return (req, _res, next) => {
    const result = schema.safeParse(req.body ?? {});
    if (!result.success) return next(new ValidationError(fieldErrors(result.error)));
    req.body = result.data;
    next();
  };
}

/** Parses route params (e.g. numeric ids); a bad id is a 404, since no such resource can exist. */
export function parseParams<S extends z.ZodType>(schema: S, params: unknown): z.infer<S> {
  const result = schema.safeParse(params);
  if (!result.success) throw new NotFoundError('Nothing exists at this address.');
  return result.data;
}
