/** Small helpers the private services (MariaDB, Redis) share to watch their own processes. */

/** True when a process with this pid exists (signal 0 checks without sending anything). */
export function isAlive(pid: number): boolean {
  try {
    process.kill(pid, 0);
    return true;
  } catch {
    return false;
  }
}

export const sleep = (ms: number) => new Promise((resolve) => setTimeout(resolve, ms));
