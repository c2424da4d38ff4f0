/**
 * The server's errors. Each carries an HTTP status and a stable code; error-handler.ts turns any of them
 * into the one wire shape `{ error: { code, message, fields? } }`.
 */
export type ErrorCode =
  | 'VALIDATION_FAILED'
  | 'MALFORMED_JSON'
  | 'UNAUTHENTICATED'
  | 'TOKEN_INVALID'
  | 'INVALID_CREDENTIALS'
  | 'FORBIDDEN'
  | 'CSRF_REJECTED'
  | 'NOT_FOUND'
  | 'CONFLICT'
  | 'PAYLOAD_TOO_LARGE'
  | 'UNSUPPORTED_MEDIA_TYPE'
  | 'RATE_LIMITED'
  | 'SERVICE_UNAVAILABLE'
  | 'DATABASE_UNAVAILABLE'
  | 'IDEMPOTENCY_KEY_REUSED'
  | 'IDEMPOTENCY_KEY_IN_USE'
  | 'INTERNAL';

export type FieldErrors = Record<string, string>;

export class AppError extends Error {
  constructor(
    readonly status: number,
    readonly code: ErrorCode,
    message: string,
    readonly fields?: FieldErrors,
  ) {
    super(message);
    this.name = 'AppError';
  }

  toBody() {
    return { error: { code: this.code, message: this.message, ...(this.fields ? { fields: this.fields } : {}) } };
  }
}

export class ValidationError extends AppError {
  constructor(fields: FieldErrors, message = 'Some fields are not valid.') {
    super(400, 'VALIDATION_FAILED', message, fields);
  }
}

export class UnauthenticatedError extends AppError {
  constructor(message = 'Sign in first.') {
    super(401, 'UNAUTHENTICATED', message);
  }
}

/** An API token (Authorization: Bearer) that is unknown, revoked or expired, or whose user is disabled. */
export class TokenInvalidError extends AppError {
  constructor(message: string) {
    super(401, 'TOKEN_INVALID', message);
  }
}

export class ForbiddenError extends AppError {
  constructor(message = 'You may not do that here.', code: ErrorCode = 'FORBIDDEN') {
    super(403, code, message);
  }
}

export class NotFoundError extends AppError {
  constructor(message = 'Not found.') {
    super(404, 'NOT_FOUND', message);
  }
}

export class ConflictError extends AppError {
  constructor(message: string, fields?: FieldErrors) {
    super(409, 'CONFLICT', message, fields);
  }
}

/**
 * An edit made against an old version of a record (someone else saved in between). The body keeps the
 * one error shape and adds the record as it is now beside it, `{ error: {...}, current: {...} }`, so the
 * client can show the newer text and let the user decide.
 */
export class StaleVersionError extends ConflictError {
  constructor(
    message: string,
    readonly current: unknown,
  ) {
    super(message, { version: 'Someone changed this in the meantime.' });
    this.name = 'StaleVersionError';
  }

  override toBody() {
    return { ...super.toBody(), current: this.current };
  }
}

export class UnsupportedMediaTypeError extends AppError {
  constructor(message: string) {
    super(415, 'UNSUPPORTED_MEDIA_TYPE', message);
  }
}

export class PayloadTooLargeError extends AppError {
  constructor(message = 'The request body is too large.') {
    super(413, 'PAYLOAD_TOO_LARGE', message);
  }
}

/**
 * The database did not answer (refused, dropped, killed, or no pool connection within the acquire timeout).
 * A 503 that says so: the request may be retried once the database is back.
 */
export class DatabaseUnavailableError extends AppError {
  constructor(message = 'The database is not reachable just now; try again in a few seconds.') {
    super(503, 'DATABASE_UNAVAILABLE', message);
    this.name = 'DatabaseUnavailableError';
  }
}
