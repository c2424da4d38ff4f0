/**
 * Starts decodes in the decode worker: progress as it reads, a cancel that stops the read, and the
 * channels arriving as transferred buffers. One worker, created on first use and kept.
 */
import * as Comlink from 'comlink';
import type { DecodeWorkerApi, DecodedWithFingerprint } from '../../../workers/decode.worker';
import type { CsvOptions } from '../../../workers/io/recording';

export class DecodeFailure extends Error {
  constructor(
    readonly code: string,
    message: string,
  ) {
    super(message);
    this.name = 'DecodeFailure';
  }
}

export interface DecodeJob {
  promise: Promise<DecodedWithFingerprint>;
  cancel(): void;
}

let worker: Comlink.Remote<DecodeWorkerApi> | null = null;
let jobs = 0;
let running = 0;
const busyListeners = new Set<(busy: boolean) => void>();

function setRunning(delta: number) {
  const was = running > 0;
  running += delta;
  if (was !== running > 0) for (const l of [...busyListeners]) l(running > 0);
}

/**
 * Told when the decode worker starts or stops having reads to do (and at once, how it is now). The
 * library's copy of a big file waits while the Bench reads channels from it: both read the same file,
 * and the read the engineer waits for goes first.
 */
export function onDecodeBusy(listener: (busy: boolean) => void): () => void {
  busyListeners.add(listener);
  listener(running > 0);
  return () => busyListeners.delete(listener);
}

function decodeWorker(): Comlink.Remote<DecodeWorkerApi> {
  worker ??= Comlink.wrap<DecodeWorkerApi>(
    new Worker(new URL('../../../workers/decode.worker.ts', import.meta.url), { type: 'module', name: 'fanlight-decode' }),
  );
  return worker;
}

export function decodeInWorker(
  file: Blob,
  fileName: string,
  options: { channels?: number[]; csv?: CsvOptions; lazy?: boolean; into?: Float32Array[] } = {},
  onProgress?: (fraction: number) => void,
): DecodeJob {
  const remote = decodeWorker();
  const jobId = `job-${++jobs}`;
  setRunning(1);
  const promise = remote
    .decode(jobId, file, fileName, options, onProgress ? Comlink.proxy(onProgress) : undefined)
    .finally(() => setRunning(-1))
    .then((outcome) => {
      if (!outcome.ok) throw new DecodeFailure(outcome.code, outcome.message);
      return outcome.value;
    });
  return { promise, cancel: () => void remote.cancel(jobId) };
}
