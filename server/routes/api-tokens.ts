import { Router } from 'express';
import { currentUser, requireSession } from '../middleware/require-session';
import { parseParams, validateBody } from '../middleware/validate';
import { apiTokenIdParams, createApiTokenBody } from '../schemas/api-tokens';
import type { ApiTokenService } from '../services/api-token-service';

/** The signed-in user's personal API tokens. A token cannot reach these (bearer.ts): only a session. */
export function apiTokenRoutes(tokens: ApiTokenService): Router {
  const router = Router();

  router.get('/me/tokens', requireSession, async (req, res) => {
    res.json({ tokens: await tokens.list(currentUser(req)) });
  });

  router.post('/me/tokens', requireSession, validateBody(createApiTokenBody), async (req, res) => {
    res.status(201).json(await tokens.create(currentUser(req), req.body));
  });

  router.delete('/me/tokens/:tokenId', requireSession, async (req, res) => {
    const { tokenId } = parseParams(apiTokenIdParams, req.params);
    await tokens.revoke(currentUser(req), tokenId);
    res.status(204).end();
  });

  return router;
}
