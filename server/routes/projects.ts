import { Router } from 'express';
import type { Knex } from 'knex';
import { currentUser, requireSession } from '../middleware/require-session';
import { ProjectRepository } from '../repositories/project-repository';

export function projectRoutes(db: Knex): Router {
  const router = Router();
  const projects = new ProjectRepository(db);

  router.get('/projects', requireSession, async (req, res) => {
    res.json({ projects: await projects.listForUser(currentUser(req).id) });
  });

  return router;
}
