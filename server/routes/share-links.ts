import { Router, type Request } from 'express';
import { ipKeyGenerator, rateLimit } from 'express-rate-limit';
import { AppError, NotFoundError } from '../errors';
import { currentUser, requireSession } from '../middleware/require-session';
import { parseParams, validateBody } from '../middleware/validate';
import { createShareLinkBody, linkIdParams, sharedCommentBody, shareTokenParams, viewIdParams } from '../schemas/views';
import { runAfterAnswer } from '../services/notification-service';
import type { ShareLinkService } from '../services/share-link-service';
import { hashToken } from '../services/tokens';
import { sendSnapshot } from './views';

const NOT_A_LINK = 'This share link is not valid. Check that it was copied whole, or ask the person who sent it for a new one.';

/** The token from the path; one of the wrong form is a link that does not exist (404, not 400). */
function tokenOf(req: Request): string {
  const parsed = shareTokenParams.safeParse(req.params);
  if (!parsed.success) throw new NotFoundError(NOT_A_LINK);
  return parsed.data.token;
}

/** Replies through links come from people without an account: braked per link and address (they send mail). */
function replyBrake() {
  return rateLimit({
    windowMs: 10 * 60_000,
    limit: 20,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    // the hash, never the token itself, is what the limiter keeps
    keyGenerator: (req) => `${hashToken(String(req.params.token ?? ''))}:${ipKeyGenerator(req.ip ?? '')}`,
    handler: (_req, _res, next) => next(new AppError(429, 'RATE_LIMITED', 'Too many replies through this link. Wait a few minutes and try again.')),
  });
}

/** Share links: managed by engineers and leads; opened by whoever holds one, without an account. */
export function shareLinkRoutes(links: ShareLinkService): Router {
  const router = Router();
  const brake = replyBrake(); // per app: its counters live in this process's memory

  router.get('/views/:id/links', requireSession, async (req, res) => {
    const { id } = parseParams(viewIdParams, req.params);
    res.set('Cache-Control', 'no-store').json({ links: await links.list(currentUser(req), id) });
  });

  router.post('/views/:id/links', requireSession, validateBody(createShareLinkBody), async (req, res) => {
    const { id } = parseParams(viewIdParams, req.params);
    // the one answer that carries the token: not to be cached anywhere
    res.set('Cache-Control', 'no-store').status(201).json(await links.create(currentUser(req), id, req.body));
  });

  router.delete('/links/:id', requireSession, async (req, res) => {
    const { id } = parseParams(linkIdParams, req.params);
    await links.revoke(currentUser(req), id);
    res.status(204).end();
  });

  router.get('/shared/:token', async (req, res) => {
    res.set('Cache-Control', 'no-store').json(await links.open(tokenOf(req)));
  });

  router.get('/shared/:token/snapshot', async (req, res) => {
    await sendSnapshot(req, res, await links.snapshot(tokenOf(req)));
  });

  router.post('/shared/:token/comments', brake, validateBody(sharedCommentBody), async (req, res) => {
    const { comment, followUp } = await links.comment(tokenOf(req), req.body);
    res.status(201).json({ comment });
    runAfterAnswer(followUp);
  });

  return router;
}
