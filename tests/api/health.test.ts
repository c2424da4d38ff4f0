import { afterAll, describe, expect, it } from 'vitest';
import supertest from 'supertest';
import { createApp } from '../../server/app';
import { createDb } from '../../server/db/knex';
import { startTestApp } from '../support/test-app';
import { testConfig } from '../support/test-db';

describe('GET /api/health', () => {
  const t = startTestApp();
  afterAll(() => t.close());

  it('answers 200 {ok:true, db:true} when MariaDB answers', async () => {
    const res = await supertest(t.app).get('/api/health');
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ ok: true, db: true });
  });

  it('answers 503 {db:false} when MariaDB does not', async () => {
    const config = testConfig();
    // A port nothing listens on stands for a database that is down.
    const deadDb = createDb({ ...config.db, port: 1 });
    const dead = createApp({ config, db: deadDb });
    try {
      const res = await supertest(dead.app).get('/api/health');
      expect(res.status).toBe(503);
      expect(res.body).toEqual({ ok: false, db: false });
    } finally {
      dead.close();
      await deadDb.destroy();
    }
  });

  it('answers unknown API routes with the error shape and 404', async () => {
    const res = await supertest(t.app).get('/api/no-such-thing');
    expect(res.status).toBe(404);
    expect(res.body).toEqual({ error: { code: 'NOT_FOUND', message: 'No such API route.' } });
  });
});
