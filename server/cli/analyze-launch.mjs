/**
 * `npm run analyze`: starts the batch mode (analyze.ts) from a JavaScript bundle of it, so a run does
 * not compile TypeScript at start-up (through tsx that took about a second here, once per process and
 * again in every map thread). The bundle is made with esbuild (the one tsx and Vite bring along) into
 * node_modules/.cache/fanlight-cli/ when missing or when any source file it holds has changed since —
 * checked by the mtime of each bundled file, recorded at build time — so a fresh clone and an edited
 * source both just work. Packages stay outside the bundle and load from node_modules as usual.
 * Plain JavaScript, so Node runs it as it is.
 */
import { mkdirSync, readdirSync, readFileSync, renameSync, rmSync, statSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../..');
const cacheDir = path.join(root, 'node_modules/.cache/fanlight-cli');
const manifestFile = path.join(cacheDir, 'manifest.json');
/** Bump when the build options below change, so old bundles are rebuilt. */
const BUILD_VERSION = 2;
/** The CLI and the entries of its worker threads (thread-pool.ts and campaign-pool.ts start them from here). */
const ENTRIES = {
  analyze: 'server/cli/analyze.ts',
  'map-thread': 'server/cli/map-thread.ts',
  'campaign-thread': 'server/cli/campaign/campaign-thread.ts',
};

const mtimeOf = (file) => {
  try {
    return statSync(path.join(root, file)).mtimeMs;
  } catch {
    return -1;
  }
};

function freshBundle() {
  try {
    const manifest = JSON.parse(readFileSync(manifestFile, 'utf8'));
    if (manifest.version !== BUILD_VERSION) return null;
    for (const [file, mtime] of Object.entries(manifest.inputs)) if (mtimeOf(file) !== mtime) return null;
    return path.join(cacheDir, manifest.dir);
  } catch {
    return null;
  }
}

/**
 * Replaces import.meta.url in each bundled file by that source file's own URL, so paths made relative
 * to a module (worker-thread entries, package resolution) mean what they mean when run through tsx.
 */
const sourceUrls = {
  name: 'source-import-meta-url',
  setup(build) {
    build.onLoad({ filter: /\.[cm]?ts$/ }, (args) => {
      const text = readFileSync(args.path, 'utf8');
      if (!text.includes('import.meta.url')) return undefined;
      return { contents: text.replaceAll('import.meta.url', JSON.stringify(pathToFileURL(args.path).href)), loader: 'ts' };
    });
  },
};

async function build() {
  const { build: esbuild } = await import('esbuild');
  mkdirSync(cacheDir, { recursive: true });
  // Each build goes to a folder of its own and the manifest is switched by a rename, so processes that
  // start at the same time (a test suite) never load a half-written bundle.
  const dir = `build-${process.pid}-${Date.now()}`;
  const outdir = path.join(cacheDir, dir);
  const result = await esbuild({
    absWorkingDir: root,
    entryPoints: ENTRIES,
    outdir,
    bundle: true,
    splitting: true,
    format: 'esm',
    platform: 'node',
    target: 'node20',
    packages: 'external',
    metafile: true,
    logLevel: 'error',
    plugins: [sourceUrls],
  });
  const inputs = Object.fromEntries(Object.keys(result.metafile.inputs).map((file) => [file, mtimeOf(file)]));
  const tmp = `${manifestFile}.${process.pid}`;
  writeFileSync(tmp, JSON.stringify({ version: BUILD_VERSION, dir, inputs }));
  renameSync(tmp, manifestFile);
  // Older builds go once nothing can still be starting from them.
  // Another process may be removing the same old folder at the same moment: one that is gone is skipped.
  for (const old of readdirSync(cacheDir)) {
    const at = path.join(cacheDir, old);
    if (!old.startsWith('build-') || old === dir) continue;
    const mtimeMs = statSync(at, { throwIfNoEntry: false })?.mtimeMs;
    if (mtimeMs !== undefined && Date.now() - mtimeMs > 10 * 60_000) rmSync(at, { recursive: true, force: true });
  }
  return outdir;
}

const bundleDir = freshBundle() ?? (await build());
// thread-pool.ts and campaign-pool.ts start their threads from the bundle's entries when this is set.
globalThis.fanlightCliBundleDir = bundleDir;
const { main } = await import(pathToFileURL(path.join(bundleDir, 'analyze.js')).href);
process.exitCode = await main(process.argv.slice(2));
