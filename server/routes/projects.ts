import { Router } from 'express';
import { currentUser, requireSession } from '../middleware/require-session';
import { parseParams, validateBody } from '../middleware/validate';
import { z } from 'zod';
import {
  changeMemberBody,
  createProjectBody,
  inviteBody,
  memberParams,
  projectIdParams,
  updateProjectBody,
} from '../schemas/projects';
import type { InvitationService } from '../services/invitation-service';
import type { ProjectService } from '../services/project-service';

const invitationParams = z.object({
  id: z.coerce.number().int().positive(),
  invitationId: z.coerce.number().int().positive(),
});

/** Project routes. The role each needs is checked in ProjectService/ProjectPolicy (404 non-member, 403 low role). */
export function projectRoutes(projects: ProjectService, invitations: InvitationService): Router {
  const router = Router();
  router.use('/projects', requireSession);

  router.get('/projects', async (req, res) => {
    res.json({ projects: await projects.list(currentUser(req)) });
  });

  router.post('/projects', validateBody(createProjectBody), async (req, res) => {
    res.status(201).json({ project: await projects.create(currentUser(req), req.body) });
  });

  router.get('/projects/:id', async (req, res) => {
    const { id } = parseParams(projectIdParams, req.params);
    res.json({ project: await projects.get(currentUser(req), id) });
  });

  router.patch('/projects/:id', validateBody(updateProjectBody), async (req, res) => {
    const { id } = parseParams(projectIdParams, req.params);
    res.json({ project: await projects.update(currentUser(req), id, req.body) });
  });

  router.post('/projects/:id/archive', async (req, res) => {
    const { id } = parseParams(projectIdParams, req.params);
    res.json({ project: await projects.setArchived(currentUser(req), id, true) });
  });

  router.post('/projects/:id/restore', async (req, res) => {
    const { id } = parseParams(projectIdParams, req.params);
    res.json({ project: await projects.setArchived(currentUser(req), id, false) });
  });

  router.get('/projects/:id/members', async (req, res) => {
    const { id } = parseParams(projectIdParams, req.params);
    res.json(await projects.membersOf(currentUser(req), id));
  });

  router.patch('/projects/:id/members/:userId', validateBody(changeMemberBody), async (req, res) => {
    const { id, userId } = parseParams(memberParams, req.params);
    res.json({ member: await projects.changeRole(currentUser(req), id, userId, req.body.role) });
  });

  router.delete('/projects/:id/members/:userId', async (req, res) => {
    const { id, userId } = parseParams(memberParams, req.params);
    await projects.removeMember(currentUser(req), id, userId);
    res.status(204).end();
  });

  router.post('/projects/:id/invitations', validateBody(inviteBody), async (req, res) => {
    const { id } = parseParams(projectIdParams, req.params);
    res.status(201).json(await invitations.invite(currentUser(req), id, req.body));
  });

  router.delete('/projects/:id/invitations/:invitationId', async (req, res) => {
    const { id, invitationId } = parseParams(invitationParams, req.params);
    await invitations.revoke(currentUser(req), id, invitationId);
    res.status(204).end();
  });

  router.get('/projects/:id/activity', async (req, res) => {
    const { id } = parseParams(projectIdParams, req.params);
    res.json({ activity: await projects.recentActivity(currentUser(req), id) });
  });

  return router;
}
