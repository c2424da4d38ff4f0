import express, { Router } from 'express';
import { existsSync, statSync } from 'node:fs';
import path from 'node:path';
import { requireSession } from '../middleware/require-session';
import { demoRecordings } from '../../seeds/demo-recordings';

/** The list of the demo's recordings (files written by the launchers into the demo folder). */
export function demoRecordingListRoutes(dir: string): Router {
  const router = Router();
  router.get('/demo-recordings', requireSession, (_req, res) => {
    const recordings = demoRecordings
      .filter((r) => existsSync(path.join(dir, r.file)))
      .map((r) => ({ ...r, sizeBytes: statSync(path.join(dir, r.file)).size }));
    res.json({ recordings });
  });
  return router;
}

/** The files themselves, for signed-in users, with ranges (the Bench reads them like a dropped file). */
export function demoRecordingFiles(dir: string) {
  return express.static(dir, { index: false, fallthrough: false, maxAge: '1h' });
}
