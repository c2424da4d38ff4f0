/**
 * The Bench's single, longer analysis tasks (speed, the map against speed, the inverter findings, the
 * tracks), each in its own lane: a worker of its own, so a long task never holds up the map's chunks,
 * and a newer task on the same lane ends the older one (its worker is stopped). Where no worker can start (blocked,
 * or none in this browser) the task runs on this thread after a yield, from a fresh copy of its input.
 */
import * as Comlink from 'comlink';
import type { AnalysisWorkerApi } from '../../../workers/analysis.worker';

export type TaskLane = 'speed' | 'speed-map' | 'findings' | 'tracks' | 'loudness' | 'tonality';

export interface TaskJob<T> {
  promise: Promise<T>;
  cancel(): void;
}

interface Lane {
  worker: Worker;
  remote: Comlink.Remote<AnalysisWorkerApi>;
  answered: boolean;
  /** The tasks sent to this worker and not yet answered, each told if the worker fails */
  inFlight: Set<(e: Error) => void>;
}

const lanes = new Map<TaskLane, Lane>();
let noWorkers = typeof Worker === 'undefined';

function abortError(): Error {
  const e = new Error('The task was cancelled.');
  e.name = 'AbortError';
  return e;
}

function laneFor(name: TaskLane): Lane | null {
  if (noWorkers) return null;
  const lane = lanes.get(name);
  if (lane) return lane;
  try {
    const worker = new Worker(new URL('../../../workers/analysis.worker.ts', import.meta.url), { type: 'module', name: `fanlight-${name}` });
    const created: Lane = { worker, remote: Comlink.wrap<AnalysisWorkerApi>(worker), answered: false, inFlight: new Set() };
    worker.addEventListener('error', (e) => {
      e.preventDefault();
      if (!created.answered) noWorkers = true;
      stop(name, created);
      for (const fail of [...created.inFlight]) fail(new WorkerUnavailable());
    });
    lanes.set(name, created);
    return created;
  } catch {
    noWorkers = true;
    return null;
  }
}

class WorkerUnavailable extends Error {
  constructor() {
    super('No analysis worker could start.');
    this.name = 'WorkerUnavailable';
  }
}

function stop(name: TaskLane, lane: Lane) {
  if (lanes.get(name) === lane) lanes.delete(name);
  lane.worker.terminate();
}

/** The running task of each lane and owner (each session of the Bench is an owner). */
const current = new Map<string, () => void>();

/**
 * Runs a task: `viaWorker` with the lane's worker (it sends its input, transferred), or `inline` on
 * this thread. Each builds its input afresh, since a transfer empties the buffers it sends. A newer
 * task of the same lane and owner cancels the older; the sessions compared on the Bench are owners of
 * their own, whose tasks queue in the lane's one worker.
 */
export function runTask<T>(name: TaskLane, viaWorker: (remote: Comlink.Remote<AnalysisWorkerApi>) => Promise<T>, inline: () => T, owner = ''): TaskJob<T> {
  const slot = `${name}:${owner}`;
  current.get(slot)?.();
  let cancelled = false;
  let reject!: (e: Error) => void;
  let lane: Lane | null = null;
  let fail: ((e: Error) => void) | null = null;
  const runInline = () =>
    new Promise<T>((res, rej) =>
      setTimeout(() => {
        if (cancelled) return rej(abortError());
        try {
          res(inline());
        } catch (e) {
          rej(e);
        }
      }, 0),
    );
  const promise = new Promise<T>((resolve, rej) => {
    reject = rej;
    lane = laneFor(name);
    if (!lane) {
      runInline().then(resolve, rej);
      return;
    }
    const mine = lane;
    const done = () => {
      mine.answered = true;
      if (fail) mine.inFlight.delete(fail);
    };
    fail = (e) => {
      if (fail) mine.inFlight.delete(fail);
      if (cancelled) return;
      if (e instanceof WorkerUnavailable) runInline().then(resolve, rej);
      else rej(e);
    };
    mine.inFlight.add(fail);
    viaWorker(mine.remote).then(
      (v) => {
        done();
        if (!cancelled) resolve(v);
      },
      (e: unknown) => {
        done();
        if (!cancelled) rej(e instanceof Error ? e : new Error(String(e)));
      },
    );
  });
  promise.catch(() => undefined);
  const cancel = () => {
    if (cancelled) return;
    cancelled = true;
    if (current.get(slot) === cancel) current.delete(slot);
    // A worker busy with the stale task alone is stopped (the next task gets a fresh one); one that
    // holds other owners' tasks too finishes it, and its answer is dropped.
    if (lane && fail && lane.inFlight.has(fail)) {
      lane.inFlight.delete(fail);
      if (lane.inFlight.size === 0) stop(name, lane);
    }
    reject(abortError());
  };
  current.set(slot, cancel);
  promise.then(
    () => current.get(slot) === cancel && current.delete(slot),
    () => current.get(slot) === cancel && current.delete(slot),
  );
  return { promise, cancel };
}

export const isAbort = (e: unknown) => e instanceof Error && e.name === 'AbortError';

/**
 * The map's mean squares as a task sends them: shared memory goes as it is (every thread reads the one
 * copy); otherwise a copy, transferred, since a transfer empties what it sends.
 */
export function powerForTask(power: Float32Array): { power: Float32Array; transfer: ArrayBuffer[] } {
  if (typeof SharedArrayBuffer !== 'undefined' && power.buffer instanceof SharedArrayBuffer) return { power, transfer: [] };
  const copy = power.slice();
  return { power: copy, transfer: [copy.buffer as ArrayBuffer] };
}
