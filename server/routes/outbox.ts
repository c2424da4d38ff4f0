import { Router } from 'express';
import { OutboxStore } from '../mail/outbox-store';

/** The local mail fake's inbox, for the Outbox page. Mounted only outside production (see app.ts). */
export function outboxRoutes(outboxDir: string): Router {
  const router = Router();
  const store = new OutboxStore(outboxDir);
  router.get('/outbox', (_req, res) => {
    res.set('Cache-Control', 'no-store').json({ messages: store.list() });
  });
  return router;
}
