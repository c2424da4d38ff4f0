import { existsSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { buildClientIfStale } from '../../../server/ops/client-build';

describe('buildClientIfStale', () => {
  // `npm start` builds, then serves from the same process: Vite's build sets NODE_ENV=production, and
  // a server that then read it would refuse to start without a SESSION_SECRET.
  it('builds into the folder asked for, then leaves NODE_ENV as it was', async () => {
    const out = mkdtempSync(path.join(tmpdir(), 'fanlight-build-'));
    const before = process.env.NODE_ENV;
    delete process.env.NODE_ENV; // as under `npm start`, where it is not set
    try {
      expect(await buildClientIfStale(out)).toBe('built');
      expect(existsSync(path.join(out, 'index.html'))).toBe(true);
      expect(process.env.NODE_ENV).toBeUndefined();
      expect(await buildClientIfStale(out)).toBe('fresh');
    } finally {
      process.env.NODE_ENV = before;
      rmSync(out, { recursive: true, force: true });
    }
  }, 180_000);
});
