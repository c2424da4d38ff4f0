/**
 * Brute-force brakes. Failed sign-ins are counted per e-mail and per address; password-reset requests
 * per e-mail and per address (they send mail). The counters live in this process's memory: behind a
 * load balancer with several copies, give express-rate-limit a shared store.
 */
import type { Request, RequestHandler } from 'express';
import { ipKeyGenerator, rateLimit } from 'express-rate-limit';
import { AppError } from '../errors';

const MINUTE = 60_000;

const emailKey = (req: Request) => `email:${String(req.body?.email ?? '').trim().toLowerCase()}`;
const addressKey = (req: Request) => `ip:${ipKeyGenerator(req.ip ?? '')}`;

function limiter(opts: { windowMs: number; limit: number; key: (req: Request) => string; failuresOnly: boolean }): RequestHandler {
  return rateLimit({
    windowMs: opts.windowMs,
    limit: opts.limit,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    skipSuccessfulRequests: opts.failuresOnly,
    keyGenerator: opts.key,
    handler: (_req, _res, next, options) => {
      const minutes = Math.ceil(options.windowMs / MINUTE);
      next(new AppError(429, 'RATE_LIMITED', `Too many attempts. Wait up to ${minutes} minutes and try again.`));
    },
  });
}

export function signInLimits(): RequestHandler[] {
  return [
    limiter({ windowMs: 15 * MINUTE, limit: 5, key: emailKey, failuresOnly: true }),
    limiter({ windowMs: 15 * MINUTE, limit: 30, key: addressKey, failuresOnly: true }),
  ];
}

export function passwordResetLimits(): RequestHandler[] {
  return [
    limiter({ windowMs: 60 * MINUTE, limit: 5, key: emailKey, failuresOnly: false }),
    limiter({ windowMs: 60 * MINUTE, limit: 30, key: addressKey, failuresOnly: false }),
  ];
}
