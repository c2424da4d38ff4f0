/**
 * Stops what a launcher started, last started first, on Ctrl-C, SIGTERM or a fatal error.
 */
type Stopper = () => Promise<void> | void;
const stoppers: Stopper[] = [];
let stopping = false;

export function onShutdown(stop: Stopper): void {
  stoppers.unshift(stop);
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

for (const signal of ['SIGINT', 'SIGTERM', 'SIGHUP'] as const) {
  process.on(signal, () => {
    console.log(`\nfanlight: stopping (${signal})`);
    void shutdown(0);
  });
}
process.on('uncaughtException', (e) => {
  console.error(e);
  void shutdown(1);
});
process.on('unhandledRejection', (e) => {
  console.error(e);
  void shutdown(1);
});
