/**
 * A stand-in for a launcher (server/ops/start.ts): installs the process rules of server/ops/shutdown.ts,
 * registers one stopper, then provokes an unhandled rejection and an uncaught exception. The test checks
 * that the process outlives both and stops only on SIGTERM, running its stopper.
 */
import { loggedBugCount, onShutdown } from '../../server/ops/shutdown';

onShutdown(() => {
  console.log('stopper ran');
});
void Promise.reject(new Error('a forgotten promise'));
setTimeout(() => {
  throw new Error('a throwing timer');
}, 10);
setTimeout(() => console.log(`alive after ${loggedBugCount()} bugs`), 200);
setInterval(() => undefined, 1000); // stands for the server's open socket
