/**
 * A stand-in for a launcher (server/ops/start.ts): installs the process rules of server/ops/shutdown.ts and
 * registers one stopper. Serving, it provokes an unhandled rejection and an uncaught exception, which it
 * must outlive (stopping only on SIGTERM); with the argument `setting-up` it fails before it serves, which
 * must stop it with exit 1.
 */
import { loggedBugCount, markServing, onShutdown } from '../../server/ops/shutdown';

onShutdown(() => {
  console.log('stopper ran');
});
if (process.argv[2] === 'setting-up') {
  void Promise.reject(new Error('the database did not start'));
} else {
  markServing();
  void Promise.reject(new Error('a forgotten promise'));
}
setTimeout(() => {
  throw new Error('a throwing timer');
}, 10);
setTimeout(() => console.log(`alive after ${loggedBugCount()} bugs`), 200);
setInterval(() => undefined, 1000); // stands for the server's open socket
