/**
 * Idempotency-Key on creates (IETF draft "The Idempotency-Key HTTP Header Field",
 * draft-ietf-httpapi-idempotency-key-header): a signed-in user's POST that carries the header is run once;
 * the same key from the same user within 24 h gets the first answer again (with `Idempotent-Replayed: true`)
 * and stores nothing new, even when the two arrive at once. A retry after a lost answer (server or network
 * died after the write was stored) thus cannot become a duplicate.
 *
 * - The key is claimed (a row, unique per user and key) before the route runs. A second request with the
 *   key waits for the first to be answered, then replays its answer.
 * - Only a 2xx answer is kept; a failed first request gives the key back, so a retry may run it again.
 * - The same key with another method, path or body answers 422 (as the draft says); one whose first request
 *   never finished answers 409 after a wait, and nothing is run a second time.
 * - Answers are stored encrypted (AES-256-GCM) under a key derived from the Idempotency-Key and the server's
 *   secret, and the Idempotency-Key itself only as a hash: an answer that carries a share link's token is
 *   not readable from the database alone.
 */
import { createCipheriv, createDecipheriv, createHash, createHmac, randomBytes } from 'node:crypto';
import type { RequestHandler, Response } from 'express';
import { AppError, ValidationError } from '../errors';
import type { IdempotencyRepository } from '../repositories/idempotency-repository';

export const IDEMPOTENCY_HEADER = 'Idempotency-Key';
export const KEEP_MS = 24 * 3600_000;
const KEY_FORM = /^[\x21-\x7e]{8,200}$/; // printable ASCII, no spaces (a UUID is the usual choice)
const WAIT_FOR_FIRST_MS = 10_000;
const POLL_MS = 100;

const sha256 = (text: string) => createHash('sha256').update(text).digest('hex');
const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

function answerKey(secret: string, idempotencyKey: string): Buffer {
  return createHmac('sha256', secret).update(`idempotent answer\0${idempotencyKey}`).digest();
}

function seal(key: Buffer, plain: string): Buffer {
  const iv = randomBytes(12);
  const cipher = createCipheriv('aes-256-gcm', key, iv);
  const body = Buffer.concat([cipher.update(plain, 'utf8'), cipher.final()]);
  return Buffer.concat([iv, cipher.getAuthTag(), body]);
}

function open(key: Buffer, sealed: Buffer): string {
  const decipher = createDecipheriv('aes-256-gcm', key, sealed.subarray(0, 12));
  decipher.setAuthTag(sealed.subarray(12, 28));
  return Buffer.concat([decipher.update(sealed.subarray(28)), decipher.final()]).toString('utf8');
}

interface StoredAnswer {
  body: unknown;
}

export interface IdempotencyGuard {
  middleware: RequestHandler;
  /** Stops the hourly sweep of expired keys. */
  close(): void;
}

export function idempotentCreates(keys: IdempotencyRepository, secret: string, now: () => Date = () => new Date()): IdempotencyGuard {
  const sweep = setInterval(() => {
    keys.removeOlderThan(new Date(now().getTime() - KEEP_MS)).catch((e: unknown) => {
      console.warn(`fanlight: could not delete expired idempotency keys (${(e as Error).message}); will try again`);
    });
  }, 3600_000).unref();

  /** Claims the key, or returns the stored answer of the first request with it. */
  async function claimOrReplay(userId: number, keyHash: string, requestHash: string) {
    const deadline = Date.now() + WAIT_FOR_FIRST_MS;
    for (;;) {
      const id = await keys.claim(userId, keyHash, requestHash);
      if (id !== null) return { id, replay: null };
      const first = await keys.find(userId, keyHash);
      if (!first) continue; // given back in the meantime: claim it now
      if (now().getTime() - first.createdAt.getTime() > KEEP_MS) {
        await keys.release(first.id); // expired: the key is free again
        continue;
      }
      if (first.requestHash !== requestHash) {
        throw new AppError(
          422,
          'IDEMPOTENCY_KEY_REUSED',
          'This Idempotency-Key was already used for a different request. Send a new key for a new request.',
        );
      }
      if (first.statusCode !== null && first.response) return { id: first.id, replay: first };
      if (Date.now() > deadline) {
        throw new AppError(
          409,
          'IDEMPOTENCY_KEY_IN_USE',
          'The first request with this Idempotency-Key has not been answered; it was not run again. Reload to see whether it was stored.',
        );
      }
      await sleep(POLL_MS);
    }
  }

  const middleware: RequestHandler = async (req, res, next) => {
    const key = req.get(IDEMPOTENCY_HEADER);
    // Only a signed-in user's POSTs: the key is scoped to its user; without a session the route answers 401.
    if (req.method !== 'POST' || key === undefined || !req.user) return next();
    if (!KEY_FORM.test(key)) {
      throw new ValidationError(
        { [IDEMPOTENCY_HEADER]: 'Use 8 to 200 printable characters without spaces, such as a UUID.' },
        'The Idempotency-Key header is not valid.',
      );
    }
    const keyHash = sha256(key);
    const requestHash = sha256(`${req.method} ${req.originalUrl}\n${JSON.stringify(req.body ?? null)}`);
    const sealKey = answerKey(secret, key);
    const claimed = await claimOrReplay(req.user.id, keyHash, requestHash);
    if (claimed.replay) {
      const { response, statusCode } = claimed.replay;
      const stored = JSON.parse(open(sealKey, response!)) as StoredAnswer;
      res.set('Idempotent-Replayed', 'true');
      res.status(statusCode!).json(stored.body);
      return;
    }
    keepFirstAnswer(res, claimed.id, keys, sealKey);
    next();
  };

  return { middleware, close: () => clearInterval(sweep) };
}

/** Stores the route's 2xx JSON answer under the claimed key before it is sent; gives the key back otherwise. */
function keepFirstAnswer(res: Response, id: number, keys: IdempotencyRepository, sealKey: Buffer): void {
  const send = res.json.bind(res);
  let settled = false;
  res.json = (body: unknown) => {
    if (settled) return send(body);
    settled = true;
    const ok = res.statusCode >= 200 && res.statusCode < 300;
    const work = ok ? keys.complete(id, res.statusCode, seal(sealKey, JSON.stringify({ body }))) : keys.release(id);
    work
      .catch((e: unknown) => console.warn(`fanlight: could not settle idempotency key ${id} (${(e as Error).message})`))
      .finally(() => send(body));
    return res;
  };
  // An answer without a JSON body (e.g. 204): keep the status only.
  res.on('finish', () => {
    if (settled) return;
    settled = true;
    const ok = res.statusCode >= 200 && res.statusCode < 300;
    (ok ? keys.complete(id, res.statusCode, seal(sealKey, JSON.stringify({ body: null }))) : keys.release(id)).catch(
      () => undefined,
    );
  });
}
