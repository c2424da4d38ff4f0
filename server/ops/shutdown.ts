/**
 * Stops what a launcher started, last started first, on Ctrl-C (SIGINT) or SIGTERM.
 *
 * Once the app serves (markServing), an unhandled rejection or an uncaught exception is a bug in one
 * request's code, not a reason to take the server (and the team's database with it) down: it is logged
 * loudly with what is known, and the server keeps answering. Before that, while a launcher is still setting
 * up (or in `npm test`, which never serves), the same error means the set-up failed: it stops what was
 * started and exits 1, so a failed start can never look like success.
 */
type Stopper = () => Promise<void> | void;
const stoppers: Stopper[] = [];
let stopping = false;
let serving = false;
let bugsLogged = 0;

/** The app is up: from now on a stray error is logged, not fatal. */
export function markServing(): void {
  serving = true;
}

export function onShutdown(stop: Stopper): void {
  stoppers.unshift(stop);
}

export function isShuttingDown(): boolean {
  return stopping;
}

/** How many unhandled rejections and uncaught exceptions this process has logged. */
export function loggedBugCount(): number {
  return bugsLogged;
}

export async function shutdown(code = 0): Promise<never> {
  if (!stopping) {
    stopping = true;
    for (const stop of stoppers) {
      try {
        await stop();
      } catch (e) {
        console.error('fanlight: while stopping:', e);
      }
    }
  }
  process.exit(code);
}

function describe(e: unknown): string {
  if (e instanceof Error) {
    const extra = Object.entries(e as unknown as Record<string, unknown>)
      .filter(([k, v]) => ['code', 'errno', 'sql', 'fatal'].includes(k) && v !== undefined)
      .map(([k, v]) => `${k}=${String(v)}`)
      .join(' ');
    return `${e.stack ?? e.message}${extra ? `\n  (${extra})` : ''}`;
  }
  return String(e);
}

export function logBug(kind: 'unhandled rejection' | 'uncaught exception', e: unknown): void {
  bugsLogged += 1;
  console.error(
    `\nfanlight: BUG #${bugsLogged} (${kind}, pid ${process.pid}, ${new Date().toISOString()}); the server keeps running.\n` +
      `${describe(e)}\n`,
  );
}

for (const signal of ['SIGINT', 'SIGTERM'] as const) {
  process.on(signal, () => {
    console.log(`\nfanlight: stopping (${signal})`);
    void shutdown(0);
  });
}
// A closed terminal must not leave the database half-stopped: say how to stop instead.
process.on('SIGHUP', () => console.log('fanlight: SIGHUP ignored; stop with Ctrl-C or SIGTERM'));
function onStrayError(kind: 'uncaught exception' | 'unhandled rejection', e: unknown): void {
  if (serving) {
    logBug(kind, e);
    return;
  }
  console.error(`\nfanlight: set-up failed (${kind}):\n${describe(e)}\n`);
  void shutdown(1);
}
process.on('uncaughtException', (e) => onStrayError('uncaught exception', e));
process.on('unhandledRejection', (e) => onStrayError('unhandled rejection', e));
