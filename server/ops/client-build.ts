/** Builds the client with Vite unless dist/ is already newer than every source that goes into it. */
import { existsSync, readdirSync, statSync } from 'node:fs';
import path from 'node:path';
import { PROJECT_ROOT } from '../config';

const INPUTS = ['src', 'workers', 'public', 'server/schemas', 'vite.config.ts', 'tailwind.config.ts', 'package-lock.json'];

function newestMtime(p: string): number {
  if (!existsSync(p)) return 0;
  const st = statSync(p);
  if (!st.isDirectory()) return st.mtimeMs;
  let newest = st.mtimeMs;
  for (const entry of readdirSync(p)) newest = Math.max(newest, newestMtime(path.join(p, entry)));
  return newest;
}

export async function buildClientIfStale(outDir: string): Promise<'built' | 'fresh'> {
  const marker = path.join(outDir, 'index.html');
  const builtAt = existsSync(marker) ? statSync(marker).mtimeMs : 0;
  const sourcesAt = Math.max(...INPUTS.map((p) => newestMtime(path.join(PROJECT_ROOT, p))));
  if (builtAt > sourcesAt) return 'fresh';
  const { build } = await import('vite');
  // Vite's build sets NODE_ENV=production for the process; the server that starts next must not inherit it.
  const nodeEnv = process.env.NODE_ENV;
  // Always a production bundle: Vite takes NODE_ENV from the process when it is set, and `npm test` runs
  // with NODE_ENV=test, which gave the test client React's development build (several times slower).
  process.env.NODE_ENV = 'production';
  try {
    await build({ configFile: path.join(PROJECT_ROOT, 'vite.config.ts'), mode: 'production', logLevel: 'warn', build: { outDir } });
  } finally {
    if (nodeEnv === undefined) delete process.env.NODE_ENV;
    else process.env.NODE_ENV = nodeEnv;
  }
  return 'built';
}
