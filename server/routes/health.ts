import { Router } from 'express';
import type { Knex } from 'knex';

const DB_CHECK_TIMEOUT_MS = 3000;

export function healthRoutes(db: Knex): Router {
  const router = Router();
  router.get('/health', async (_req, res) => {
    let timer: NodeJS.Timeout | undefined;
    const timeout = new Promise<never>((_, reject) => {
      timer = setTimeout(() => reject(new Error('timeout')), DB_CHECK_TIMEOUT_MS);
    });
    try {
      await Promise.race([db.raw('SELECT 1'), timeout]);
      res.json({ ok: true, db: true });
    } catch {
      res.status(503).json({ ok: false, db: false });
    } finally {
      clearTimeout(timer);
    }
  });
  return router;
}
