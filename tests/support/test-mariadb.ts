/**
 * The test MariaDB that `npm test` started (server/ops/test.ts), reached as root over its private socket, for
 * tests of how the app behaves when its database connections are killed or the database itself stops.
 */
import path from 'node:path';
import { DATA_DIR } from '../../server/config';
import { PrivateMariaDb } from '../../server/ops/mariadb';
import { testConfig } from './test-db';

export function testMariaDb(): PrivateMariaDb {
  return new PrivateMariaDb({ baseDir: path.join(DATA_DIR, 'mariadb-test'), port: testConfig().db.port });
}

/** Ends, from the server side (KILL CONNECTION), every connection the application user has open. */
export async function killAppConnections(mariadb: PrivateMariaDb): Promise<number> {
  const root = await mariadb.rootConnection();
  if (!root) throw new Error('the test MariaDB does not answer');
  try {
    const [rows] = await root.query('SELECT ID AS id FROM information_schema.PROCESSLIST WHERE USER = ? AND ID <> CONNECTION_ID()', [
      testConfig().db.user,
    ]);
    let killed = 0;
    for (const { id } of rows as { id: number }[]) {
      try {
        await root.query('KILL CONNECTION ?', [id]);
        killed += 1;
      } catch {
        // it ended on its own in the meantime
      }
    }
    return killed;
  } finally {
    await root.end();
  }
}
