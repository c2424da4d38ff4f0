import { Router } from 'express';
import { currentUser, requireSession } from '../middleware/require-session';
import { validateBody } from '../middleware/validate';
import { updateNotificationsBody } from '../schemas/views';
import type { NotificationService } from '../services/notification-service';

/** The signed-in user's choice of mails: replies, mentions, shares. */
export function notificationRoutes(notifications: NotificationService): Router {
  const router = Router();

  router.get('/me/notifications', requireSession, async (req, res) => {
    res.json(await notifications.get(currentUser(req)));
  });

  router.patch('/me/notifications', requireSession, validateBody(updateNotificationsBody), async (req, res) => {
    res.json(await notifications.update(currentUser(req), req.body));
  });

  return router;
}
