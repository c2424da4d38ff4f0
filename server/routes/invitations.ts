import { Router } from 'express';
import { parseParams, validateBody } from '../middleware/validate';
import { acceptInvitationBody, invitationTokenParams } from '../schemas/projects';
import type { InvitationService } from '../services/invitation-service';
import { startSession } from './session-helpers';

/** Open to anyone holding the link: the token is the credential. */
export function invitationRoutes(invitations: InvitationService): Router {
  const router = Router();

  router.get('/invitations/:token', async (req, res) => {
    const { token } = parseParams(invitationTokenParams, req.params);
    res.json({ invitation: await invitations.preview(token) });
  });

  router.post('/invitations/:token/accept', validateBody(acceptInvitationBody), async (req, res) => {
    const { token } = parseParams(invitationTokenParams, req.params);
    const result = await invitations.accept(token, req.user, req.body);
    if (result.created) await startSession(req, result.user.id);
    res.json({ user: result.user, projectId: result.projectId });
  });

  return router;
}
