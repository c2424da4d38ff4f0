/**
 * `npm run db:backup [FILE]` and `npm run db:restore FILE`: a consistent dump of the app's database
 * (mariadb-dump in one transaction, so a dump taken while the app writes is a single point in time) to a
 * dated, gzip-compressed file, and its restore into an empty database. Both use the connection settings
 * the app uses (DB_HOST, DB_PORT, DB_NAME, DB_USER, DB_PASSWORD); the password travels in the environment,
 * never on a command line.
 */
import { spawn } from 'node:child_process';
import { createReadStream, createWriteStream, existsSync, mkdirSync, renameSync, rmSync, statSync } from 'node:fs';
import path from 'node:path';
import { pipeline } from 'node:stream/promises';
import { createGunzip, createGzip } from 'node:zlib';
import mysql from 'mysql2/promise';
import { DATA_DIR, loadConfig, type DbConfig } from '../config';

export const BACKUP_DIR = path.join(DATA_DIR, 'backups');

function clientEnv(db: DbConfig): NodeJS.ProcessEnv {
  return { ...process.env, MYSQL_PWD: db.password };
}

const connectionArgs = (db: DbConfig) => ['--no-defaults', `--host=${db.host}`, `--port=${db.port}`, `--user=${db.user}`, '--protocol=TCP'];

function stamp(d = new Date()): string {
  return d.toISOString().replace(/[:]/g, '').replace(/\..*$/, 'Z');
}

/** Writes the dump to `file` (default: .data/backups/<db>-<UTC time>.sql.gz); returns its path and size. */
export async function backupDatabase(db: DbConfig, file = path.join(BACKUP_DIR, `${db.database}-${stamp()}.sql.gz`)): Promise<{ file: string; bytes: number }> {
  mkdirSync(path.dirname(file), { recursive: true });
  const partial = `${file}.partial`;
  const dump = spawn(
    'mariadb-dump',
    [
      ...connectionArgs(db),
      '--single-transaction', // one consistent snapshot of InnoDB tables, without locking the app out
      '--quick',
      '--skip-lock-tables',
      '--no-tablespaces',
      '--hex-blob', // snapshots are binary
      '--triggers',
      '--routines',
      db.database,
    ],
    { env: clientEnv(db), stdio: ['ignore', 'pipe', 'pipe'] },
  );
  let stderr = '';
  dump.stderr.on('data', (d: Buffer) => (stderr += d.toString()));
  const exited = new Promise<number>((resolve) => dump.on('close', (code) => resolve(code ?? 1)));
  try {
    await pipeline(dump.stdout, createGzip(), createWriteStream(partial));
    const code = await exited;
    if (code !== 0) throw new Error(`mariadb-dump failed (exit ${code}): ${stderr.trim()}`);
  } catch (e) {
    rmSync(partial, { force: true }); // a failed dump leaves no file that looks like a backup
    throw e;
  }
  renameSync(partial, file);
  return { file, bytes: statSync(file).size };
}

/** Restores a dump made by backupDatabase into `db`, which must exist and hold no tables. */
export async function restoreDatabase(db: DbConfig, file: string): Promise<{ tables: number }> {
  if (!existsSync(file)) throw new Error(`No backup file at ${file}.`);
  const conn = await mysql.createConnection({ host: db.host, port: db.port, user: db.user, password: db.password, database: db.database });
  try {
    const [rows] = await conn.query('SELECT COUNT(*) AS n FROM information_schema.TABLES WHERE TABLE_SCHEMA = ?', [db.database]);
    const existing = Number((rows as { n: number }[])[0].n);
    if (existing > 0) {
      throw new Error(
        `The database ${db.database} on ${db.host}:${db.port} already holds ${existing} tables; nothing was changed. ` +
          'A backup is restored into an empty database: set DB_NAME to a new one, or drop this one first.',
      );
    }
  } finally {
    await conn.end();
  }
  const client = spawn('mariadb', [...connectionArgs(db), '--binary-mode', db.database], {
    env: clientEnv(db),
    stdio: ['pipe', 'ignore', 'pipe'],
  });
  let stderr = '';
  client.stderr.on('data', (d: Buffer) => (stderr += d.toString()));
  const exited = new Promise<number>((resolve) => client.on('close', (code) => resolve(code ?? 1)));
  const gzipped = file.endsWith('.gz');
  if (gzipped) await pipeline(createReadStream(file), createGunzip(), client.stdin);
  else await pipeline(createReadStream(file), client.stdin);
  const code = await exited;
  if (code !== 0) throw new Error(`Restoring ${path.basename(file)} failed (exit ${code}): ${stderr.trim()}`);
  const check = await mysql.createConnection({ host: db.host, port: db.port, user: db.user, password: db.password, database: db.database });
  try {
    const [rows] = await check.query('SELECT COUNT(*) AS n FROM information_schema.TABLES WHERE TABLE_SCHEMA = ?', [db.database]);
    return { tables: Number((rows as { n: number }[])[0].n) };
  } finally {
    await check.end();
  }
}

if (import.meta.url === `file://${process.argv[1]}`) {
  const [command, file] = process.argv.slice(2);
  const { db } = loadConfig();
  try {
    if (command === 'backup') {
      const out = await backupDatabase(db, file ? path.resolve(file) : undefined);
      console.log(`fanlight: backed up ${db.database} to ${out.file} (${(out.bytes / 1024).toFixed(0)} KiB)`);
    } else if (command === 'restore' && file) {
      const out = await restoreDatabase(db, path.resolve(file));
      console.log(`fanlight: restored ${path.basename(file)} into ${db.database} (${out.tables} tables)`);
    } else {
      console.error('usage: npm run db:backup [FILE]  |  npm run db:restore FILE');
      process.exitCode = 2;
    }
  } catch (e) {
    console.error(`fanlight: ${(e as Error).message}`);
    process.exitCode = 1;
  }
}
