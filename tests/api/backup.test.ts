/**
 * `npm run db:backup` / `db:restore` (server/ops/backup.ts): the test database (migrated, seeded with the
 * demo, plus what earlier tests wrote) dumped and restored into a new empty database comes back table for
 * table, row for row.
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { createDb } from '../../server/db/knex';
import { backupDatabase, restoreDatabase } from '../../server/ops/backup';
import { makeProject, makeUser } from '../support/actors';
import { openTestDb, testConfig } from '../support/test-db';
import { insertSnapshot, insertView } from './view-fixtures';
import { testMariaDb } from '../support/test-mariadb';

const RESTORE_DB = 'fanlight_restore_test';

async function tableCounts(db: ReturnType<typeof createDb>, database: string): Promise<Record<string, number>> {
  const tables = (await db('information_schema.TABLES').where({ TABLE_SCHEMA: database }).select('TABLE_NAME as name')) as { name: string }[];
  const out: Record<string, number> = {};
  for (const { name } of tables) out[name] = Number((await db(name).count({ n: '*' }))[0].n);
  return out;
}

describe('database backup and restore', () => {
  const dir = mkdtempSync(path.join(tmpdir(), 'fanlight-backup-'));
  const source = openTestDb();
  const config = testConfig();
  const target = { ...config.db, database: RESTORE_DB };
  const restored = createDb(target);
  afterAll(async () => {
    await source.destroy();
    await restored.destroy();
    rmSync(dir, { recursive: true, force: true });
  });

  it('round-trips the demo data into an empty database, and refuses a database that is not empty', async () => {
    await testMariaDb().ensureDatabase({ database: RESTORE_DB, user: config.db.user, password: config.db.password }, { recreate: true });
    // a view with a binary snapshot, so the dump carries binary data
    const author = await makeUser(source, 'backup', 'staff');
    const viewId = await insertView(source, await makeProject(source, [{ id: author.id, role: 'engineer' }]), author.id, 'Backed up');
    await insertSnapshot(source, viewId);
    const { file, bytes } = await backupDatabase(config.db, path.join(dir, 'demo.sql.gz'));
    expect(bytes).toBeGreaterThan(1000);

    const before = await tableCounts(source, config.db.database);
    expect(before.users).toBeGreaterThanOrEqual(4);
    const { tables } = await restoreDatabase(target, file);
    expect(tables).toBe(Object.keys(before).length);
    // rows written after the dump started are not in it, so compare with counts read before the dump
    const after = await tableCounts(restored, RESTORE_DB);
    for (const [table, n] of Object.entries(after)) expect(n, table).toBeLessThanOrEqual((await tableCounts(source, config.db.database))[table]);
    expect(after.users).toBe(before.users);
    expect(after.knex_migrations).toBe(before.knex_migrations);
    const emails = (await restored('users').orderBy('id').pluck('email')) as string[];
    expect(emails).toEqual(await source('users').orderBy('id').limit(emails.length).pluck('email'));
    const snapshot = await source('view_snapshots').where({ view_id: viewId }).first();
    const copy = await restored('view_snapshots').where({ view_id: viewId }).first();
    expect(copy.gzip_bytes.length).toBeGreaterThan(0);
    expect(Buffer.compare(copy.gzip_bytes, snapshot.gzip_bytes)).toBe(0); // binary survives (--hex-blob)

    await expect(restoreDatabase(target, file)).rejects.toThrow(/already holds \d+ tables; nothing was changed/);
    expect((await tableCounts(restored, RESTORE_DB)).users).toBe(before.users);
  }, 60_000);

  it('says which file is missing', async () => {
    await expect(restoreDatabase(target, path.join(dir, 'no-such.sql.gz'))).rejects.toThrow(/No backup file at .*no-such\.sql\.gz/);
  });
});
