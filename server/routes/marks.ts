import { Router } from 'express';
import { currentUser, requireSession } from '../middleware/require-session';
import { parseParams, validateBody } from '../middleware/validate';
import { createCommentBody, createMarkBody, markIdParams, updateMarkBody, viewIdParams } from '../schemas/views';
import type { MarkService } from '../services/mark-service';
import { runAfterAnswer } from '../services/notification-service';

/** Marks on a view and the threads under marks and views (roles checked in MarkService). */
export function markRoutes(marks: MarkService): Router {
  const router = Router();

  router.get('/views/:id/marks', requireSession, async (req, res) => {
    const { id } = parseParams(viewIdParams, req.params);
    res.json({ marks: await marks.list(currentUser(req), id) });
  });

  router.post('/views/:id/marks', requireSession, validateBody(createMarkBody), async (req, res) => {
    const { id } = parseParams(viewIdParams, req.params);
    const { mark, followUp } = await marks.create(currentUser(req), id, req.body);
    res.status(201).json({ mark });
    runAfterAnswer(followUp);
  });

  router.patch('/marks/:id', requireSession, validateBody(updateMarkBody), async (req, res) => {
    const { id } = parseParams(markIdParams, req.params);
    const { mark, followUp } = await marks.update(currentUser(req), id, req.body);
    res.json({ mark });
    runAfterAnswer(followUp);
  });

  router.delete('/marks/:id', requireSession, async (req, res) => {
    const { id } = parseParams(markIdParams, req.params);
    await marks.remove(currentUser(req), id);
    res.status(204).end();
  });

  router.get('/marks/:id/comments', requireSession, async (req, res) => {
    const { id } = parseParams(markIdParams, req.params);
    res.json({ comments: await marks.markThread(currentUser(req), id) });
  });

  router.post('/marks/:id/comments', requireSession, validateBody(createCommentBody), async (req, res) => {
    const { id } = parseParams(markIdParams, req.params);
    const { comment, followUp } = await marks.commentOnMark(currentUser(req), id, req.body.body);
    res.status(201).json({ comment });
    runAfterAnswer(followUp);
  });

  router.get('/views/:id/comments', requireSession, async (req, res) => {
    const { id } = parseParams(viewIdParams, req.params);
    res.json({ comments: await marks.viewThread(currentUser(req), id) });
  });

  router.post('/views/:id/comments', requireSession, validateBody(createCommentBody), async (req, res) => {
    const { id } = parseParams(viewIdParams, req.params);
    const { comment, followUp } = await marks.commentOnView(currentUser(req), id, req.body.body);
    res.status(201).json({ comment });
    runAfterAnswer(followUp);
  });

  return router;
}
