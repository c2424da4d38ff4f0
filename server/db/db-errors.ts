/**
 * Which errors mean "the database is away" (as opposed to a bad query): those answer 503 DATABASE_UNAVAILABLE,
 * and the pool replaces the connection they came from.
 */

// Socket-level codes (Node) and the client's own protocol codes (mysql2).
const CONNECTION_CODES = new Set([
  'ECONNREFUSED',
  'ECONNRESET',
  'ECONNABORTED',
  'EPIPE',
  'ETIMEDOUT',
  'EHOSTUNREACH',
  'ENETUNREACH',
  'ENOTFOUND',
  'EAI_AGAIN',
  'PROTOCOL_CONNECTION_LOST',
  'PROTOCOL_SEQUENCE_TIMEOUT',
  'PROTOCOL_ENQUEUE_AFTER_FATAL_ERROR',
  'ER_SERVER_SHUTDOWN',
  'ER_CON_COUNT_ERROR',
  'ER_CONNECTION_KILLED',
]);

// Server error numbers of the same meaning (MariaDB knowledge base, "MariaDB Error Codes"):
// 1040 too many connections, 1053 server shutdown in progress, 1927 connection was killed,
// 2002/2003 cannot connect, 2006 server has gone away, 2013 lost connection during query.
const CONNECTION_ERRNOS = new Set([1040, 1053, 1927, 2002, 2003, 2006, 2013]);

// mysql2 reports a query sent on a connection it already saw close with no code, only this text.
const CLOSED_STATE = /connection is in closed state|connection lost|server closed the connection/i;

interface DriverError {
  name?: string;
  code?: string;
  errno?: number;
  fatal?: boolean;
  message?: string;
  cause?: unknown;
}

export function isDatabaseUnavailable(err: unknown, depth = 0): boolean {
  if (!err || typeof err !== 'object' || depth > 3) return false;
  const e = err as DriverError;
  // Knex gives up waiting for a pool connection (acquireConnectionTimeout).
  if (e.name === 'KnexTimeoutError') return true;
  if (e.code && CONNECTION_CODES.has(e.code)) return true;
  if (typeof e.errno === 'number' && CONNECTION_ERRNOS.has(e.errno)) return true;
  // mysql2 marks every error that ends the connection as fatal.
  if (e.fatal === true) return true;
  if (typeof e.message === 'string' && CLOSED_STATE.test(e.message)) return true;
  // AggregateError (several addresses refused) and wrapped causes.
  const inner = (e as { errors?: unknown[] }).errors;
  if (Array.isArray(inner) && inner.some((x) => isDatabaseUnavailable(x, depth + 1))) return true;
  return e.cause !== undefined && isDatabaseUnavailable(e.cause, depth + 1);
}
