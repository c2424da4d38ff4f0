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

function decodeWorker(): Comlink.Remote<DecodeWorkerApi> {
  worker ??= Comlink.wrap<DecodeWorkerApi>(
    new Worker(new URL('../../../workers/decode.worker.ts', import.meta.url), { type: 'module', name: 'fanlight-decode' }),
  );
  return worker;
}

export function decodeInWorker(
  file: Blob,
  fileName: string,
  options: { channels?: number[]; csv?: CsvOptions; lazy?: boolean } = {},
  onProgress?: (fraction: number) => void,
): DecodeJob {
  const remote = decodeWorker();
  const jobId = `job-${++jobs}`;
  const promise = remote
    .decode(jobId, file, fileName, options, onProgress ? Comlink.proxy(onProgress) : undefined)
    .then((outcome) => {
      if (!outcome.ok) throw new DecodeFailure(outcome.code, outcome.message);
      return outcome.value;
    });
  return { promise, cancel: () => void remote.cancel(jobId) };
}
