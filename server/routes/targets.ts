import { Router } from 'express';
import { currentUser, requireSession } from '../middleware/require-session';
import { parseParams, validateBody } from '../middleware/validate';
import { projectIdParams } from '../schemas/projects';
import { createTargetBody, importTargetsBody, targetIdParams, updateTargetBody } from '../schemas/targets';
import type { TargetService } from '../services/target-service';

/** A project's targets (limit curves against speed); roles checked in TargetService. */
export function targetRoutes(targets: TargetService): Router {
  const router = Router();

  router.get('/projects/:id/targets', requireSession, async (req, res) => {
    const { id } = parseParams(projectIdParams, req.params);
    res.json({ targets: await targets.list(currentUser(req), id) });
  });

  router.post('/projects/:id/targets', requireSession, validateBody(createTargetBody), async (req, res) => {
    const { id } = parseParams(projectIdParams, req.params);
    res.status(201).json({ target: await targets.create(currentUser(req), id, req.body) });
  });

  router.post('/projects/:id/targets/import', requireSession, validateBody(importTargetsBody), async (req, res) => {
    const { id } = parseParams(projectIdParams, req.params);
    res.json(await targets.importCsv(currentUser(req), id, req.body));
  });

  router.patch('/targets/:id', requireSession, validateBody(updateTargetBody), async (req, res) => {
    const { id } = parseParams(targetIdParams, req.params);
    res.json({ target: await targets.update(currentUser(req), id, req.body) });
  });

  router.delete('/targets/:id', requireSession, async (req, res) => {
    const { id } = parseParams(targetIdParams, req.params);
    await targets.remove(currentUser(req), id);
    res.status(204).end();
  });

  return router;
}
