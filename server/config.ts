/**
 * The server's settings, read once from the environment. Every value has a development default so that
 * `npm start` works on a fresh machine; production overrides them (see README, "Settings").
 */
import { randomBytes } from 'node:crypto';
import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';

export const PROJECT_ROOT = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
export const DATA_DIR = path.join(PROJECT_ROOT, '.data');

export interface DbConfig {
  host: string;
  port: number;
  database: string;
  user: string;
  password: string;
}

export interface SmtpConfig {
  host: string;
  port: number;
  secure: boolean;
  user?: string;
  password?: string;
  from: string;
  /** No SMTP_HOST set: mail goes to the local SMTP fake that the launchers start, kept in outboxDir. */
  useFake: boolean;
  outboxDir: string;
}

export interface AppConfig {
  env: 'development' | 'test' | 'production';
  host: string;
  port: number;
  /** The origin the browser uses, for links in mail and for the cross-site request check. */
  publicOrigin: string;
  /** Further origins whose pages may call the API (e.g. the Vite dev server). */
  extraOrigins: string[];
  db: DbConfig;
  smtp: SmtpConfig;
  sessionSecret: string;
  /** Value for Express's `trust proxy` (false, a hop count, or a list of addresses). */
  trustProxy: boolean | number | string;
  clientDir: string;
  /** Where the demo's synthesised recordings are kept (written by the launchers). */
  demoRecordingsDir: string;
}

function int(value: string | undefined, fallback: number, name: string): number {
  if (value === undefined || value === '') return fallback;
  const n = Number(value);
  if (!Number.isInteger(n) || n < 0 || n > 65535) throw new Error(`${name} must be a port number, got "${value}".`);
  return n;
}

function trustProxy(value: string | undefined): boolean | number | string {
  if (value === undefined || value === '' || value === 'false') return false;
  if (value === 'true') return true;
  return /^\d+$/.test(value) ? Number(value) : value;
}

/** A random secret kept under .data/ so that sessions survive restarts without a configured secret. */
function localSessionSecret(): string {
  const file = path.join(DATA_DIR, 'session-secret');
  if (existsSync(file)) return readFileSync(file, 'utf8').trim();
  mkdirSync(DATA_DIR, { recursive: true });
  const secret = randomBytes(32).toString('hex');
  writeFileSync(file, secret, { mode: 0o600 });
  return secret;
}

const LOOPBACK_NAMES = ['127.0.0.1', 'localhost'];

export const DEFAULT_DB_PASSWORD = 'fanlight-dev-db';

export function loadConfig(env: NodeJS.ProcessEnv = process.env): AppConfig {
  const mode = env.NODE_ENV === 'production' ? 'production' : env.NODE_ENV === 'test' ? 'test' : 'development';
  const host = env.HOST || '127.0.0.1';
  const port = int(env.PORT, 3000, 'PORT');
  if (mode === 'production' && !env.SESSION_SECRET) throw new Error('SESSION_SECRET must be set in production.');
  return {
    env: mode,
    host,
    port,
    publicOrigin: env.PUBLIC_ORIGIN || `http://${host}:${port}`,
    extraOrigins: [
      ...(env.ALLOWED_ORIGINS ?? '').split(',').map((o) => o.trim()).filter(Boolean),
      // With no PUBLIC_ORIGIN on a loopback host, both names of this machine open the app.
      ...(!env.PUBLIC_ORIGIN && LOOPBACK_NAMES.includes(host) ? LOOPBACK_NAMES.map((h) => `http://${h}:${port}`) : []),
    ],
    db: {
      host: env.DB_HOST || '127.0.0.1',
      port: int(env.DB_PORT, mode === 'test' ? 33307 : 33306, 'DB_PORT'),
      database: env.DB_NAME || (mode === 'test' ? 'fanlight_test' : 'fanlight'),
      user: env.DB_USER || 'fanlight',
      password: env.DB_PASSWORD || DEFAULT_DB_PASSWORD,
    },
    smtp: {
      host: env.SMTP_HOST || '127.0.0.1',
      port: int(env.SMTP_PORT, mode === 'test' ? 2526 : 2525, 'SMTP_PORT'),
      secure: env.SMTP_SECURE === 'true',
      user: env.SMTP_USER || undefined,
      password: env.SMTP_PASSWORD || undefined,
      from: env.MAIL_FROM || 'Fanlight <no-reply@fanlight.test>',
      useFake: !env.SMTP_HOST,
      outboxDir: env.OUTBOX_DIR || path.join(DATA_DIR, mode === 'test' ? 'outbox-test' : 'outbox-app'),
    },
    sessionSecret: env.SESSION_SECRET || localSessionSecret(),
    trustProxy: trustProxy(env.TRUST_PROXY),
    // The tests build into their own folder so that `npm test` never rewrites what a running `npm start` serves.
    clientDir: env.CLIENT_DIR || (mode === 'test' ? path.join(DATA_DIR, 'test-client') : path.join(PROJECT_ROOT, 'dist')),
    demoRecordingsDir: env.DEMO_RECORDINGS_DIR || path.join(DATA_DIR, 'demo-recordings'),
  };
}
