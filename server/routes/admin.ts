import { Router } from 'express';
import { currentUser, requireSession } from '../middleware/require-session';
import { parseParams, validateBody } from '../middleware/validate';
import { createUserBody, updateUserBody, updateUserFields, userIdParams } from '../schemas/admin';
import { AdminService } from '../services/admin-service';

export function adminRoutes(admin: AdminService): Router {
  const router = Router();
  router.use('/admin', requireSession, (req, _res, next) => {
    AdminService.assertAdmin(currentUser(req));
    next();
  });

  router.get('/admin/users', async (_req, res) => {
    res.json({ users: await admin.list() });
  });

  router.post('/admin/users', validateBody(createUserBody), async (req, res) => {
    res.status(201).json({ user: await admin.create(req.body) });
  });

  // Both forms change one user: the id in the body (the contract's PATCH /api/admin/users) or in the path.
  router.patch('/admin/users', validateBody(updateUserBody), async (req, res) => {
    const { id, ...changes } = req.body;
    res.json({ user: await admin.update(id, changes) });
  });

  router.patch('/admin/users/:id', validateBody(updateUserFields), async (req, res) => {
    const { id } = parseParams(userIdParams, req.params);
    res.json({ user: await admin.update(id, req.body) });
  });

  return router;
}
