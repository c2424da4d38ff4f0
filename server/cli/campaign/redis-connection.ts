/** A Redis connection for BullMQ from a redis://HOST:PORT[/DB] URL (ioredis; BullMQ 6 takes the client). */
import { Redis } from 'ioredis';
import { UsageError } from '../options';

/** The queue every campaign shares; jobs carry their campaign's id. */
export const QUEUE_NAME = 'fanlight-campaign';

export function checkRedisUrl(url: string): URL {
  let u: URL;
  try {
    u = new URL(url);
  } catch {
    throw new UsageError(`--queue "${url}" is not a URL; give redis://HOST:PORT.`);
  }
  if (u.protocol !== 'redis:' && u.protocol !== 'rediss:') throw new UsageError(`--queue "${url}" must start with redis:// (or rediss://).`);
  return u;
}

/**
 * A client that waits for Redis rather than failing a command (BullMQ's workers need
 * maxRetriesPerRequest: null), reconnecting at most every 2 s.
 */
export function redisClient(url: string): Redis {
  checkRedisUrl(url);
  return new Redis(url, { maxRetriesPerRequest: null, retryStrategy: (times) => Math.min(times * 200, 2000) });
}
