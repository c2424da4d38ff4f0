/// <reference lib="webworker" />
/**
 * The decode worker: reads a dropped file in slices and returns its channels as transferred
 * Float32Arrays. Only wiring here; the parsing is workers/io (shared with Node and tests).
 */
import * as Comlink from 'comlink';
import { blobSource } from './io/byte-source';
import { decodeRecording } from './io/decode-recording';
import { fingerprint } from './io/fingerprint';
import type { CsvOptions, DecodedRecording, ProgressCallback } from './io/recording';
import { toOutcomeError, type Outcome } from './io/recording-error';

export interface DecodedWithFingerprint extends DecodedRecording {
  fingerprint: string;
}

const cancelled = new Set<string>();

const api = {
  async decode(
    jobId: string,
    file: Blob,
    fileName: string,
    options: { channels?: number[]; csv?: CsvOptions; lazy?: boolean; into?: Float32Array[] },
    onProgress?: ProgressCallback,
  ): Promise<Outcome<DecodedWithFingerprint>> {
    try {
      const source = blobSource(file, fileName);
      const decoded = await decodeRecording(source, {
        ...options,
        onProgress,
        isCancelled: () => cancelled.has(jobId),
      });
      const value = { ...decoded, fingerprint: await fingerprint(source) };
      // shared arrays (decoded into) are seen by the page as they are: only the page's own are moved
      const movable = decoded.samples.map((s) => s.buffer).filter((b): b is ArrayBuffer => b instanceof ArrayBuffer);
      return Comlink.transfer({ ok: true, value }, movable);
    } catch (e) {
      return toOutcomeError(e);
    } finally {
      cancelled.delete(jobId);
    }
  },
  cancel(jobId: string) {
    cancelled.add(jobId);
  },
};

export type DecodeWorkerApi = typeof api;
Comlink.expose(api);
