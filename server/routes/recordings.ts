import { Router } from 'express';
import { currentUser, requireSession } from '../middleware/require-session';
import { parseParams, validateBody } from '../middleware/validate';
import { projectIdParams } from '../schemas/projects';
import { registerRecordingBody } from '../schemas/recordings';
import type { RecordingService } from '../services/recording-service';

/** Metadata only: the samples stay in the engineer's browser. */
export function recordingRoutes(recordings: RecordingService): Router {
  const router = Router();

  router.get('/projects/:id/recordings', requireSession, async (req, res) => {
    const { id } = parseParams(projectIdParams, req.params);
    res.json({ recordings: await recordings.list(currentUser(req), id) });
  });

  router.post('/projects/:id/recordings', requireSession, validateBody(registerRecordingBody), async (req, res) => {
    const { id } = parseParams(projectIdParams, req.params);
    const { recording, created } = await recordings.register(currentUser(req), id, req.body);
    res.status(created ? 201 : 200).json({ recording, created });
  });

  return router;
}
