import { useCallback, useEffect, useMemo, useRef, useState } from 'react';
import type { DecodedWithFingerprint } from '../../../../workers/decode.worker';
import { decodeInWorker, type DecodeJob } from '../../../lib/workers/decode-client';
import { SampleCount, type SampleFill } from '../../../lib/workers/analysis-pool';
import { errorMessage } from '../../../lib/error-message';
import type { OpenRecording } from '../hooks/use-recording-reader';

/** Channels being read from the file, and how far (0…1). */
export interface ChannelReading {
  indices: number[];
  fraction: number;
}

/** Channels being decoded into shared memory: their samples fill from the start as the file is read. */
export interface FillingChannels {
  indices: number[];
  samples: Float32Array[];
  fill: SampleFill;
}

export interface RecordingChannels {
  /** The recording with the channels read so far (merged into one decoded set). */
  recording: OpenRecording;
  reading: ChannelReading | null;
  /** The channels being read, while they are, where the format lets them fill as they arrive (WAV). */
  filling: FillingChannels | null;
  error: string | null;
  /** Reads the channels of these indices that are not read yet (one pass over the file for all). */
  ensure(indices: number[]): void;
}

function merge(base: DecodedWithFingerprint, added: { channelIndices: number[]; samples: Float32Array[]; nonFinite: DecodedWithFingerprint['nonFinite'] }): DecodedWithFingerprint {
  return {
    ...base,
    channelIndices: [...base.channelIndices, ...added.channelIndices],
    samples: [...base.samples, ...added.samples],
    nonFinite: [...base.nonFinite, ...added.nonFinite],
  };
}

/**
 * The open recording's channels, read on demand: a long, wide recording is opened with none of its
 * samples decoded, and the Bench reads the channels it uses (the map's, the speed's, the one heard) when
 * it first needs them, so memory holds those and not the other thirty. Mount keyed by fingerprint.
 */
export function useRecordingChannels(opened: OpenRecording): RecordingChannels {
  const [decoded, setDecoded] = useState(opened.decoded);
  const [reading, setReading] = useState<ChannelReading | null>(null);
  const [filling, setFilling] = useState<FillingChannels | null>(null);
  const [error, setError] = useState<string | null>(null);
  const asked = useRef(new Set<number>(opened.decoded.channelIndices));
  const queue = useRef<number[]>([]);
  const job = useRef<DecodeJob | null>(null);
  const live = useRef(true);

  const pump = useCallback(() => {
    if (job.current || queue.current.length === 0 || !live.current) return;
    const indices = queue.current.splice(0);
    setReading({ indices, fraction: 0 });
    setError(null);
    const { header } = opened.decoded;
    // A WAV is decoded into shared memory that the map reads as it fills: its first columns come
    // with the first megabytes read, not after the whole file (which for gigabytes takes a while).
    const streams = header.format === 'wav' && globalThis.crossOriginIsolated && typeof SharedArrayBuffer !== 'undefined';
    const into = streams ? indices.map(() => new Float32Array(new SharedArrayBuffer(header.frames * 4))) : undefined;
    const fill = new SampleCount();
    if (into) setFilling({ indices, samples: into, fill });
    let shownAt = -Infinity;
    const j = decodeInWorker(opened.file, opened.entry.name, { channels: indices, ...(into ? { into } : {}), ...(opened.entry.csv ? { csv: opened.entry.csv } : {}) }, (fraction) => {
      if (!live.current) return;
      fill.set(Math.round(fraction * header.frames));
      // the bar moves a few times a second, not for each block
      const now = performance.now();
      if (now - shownAt < 150 && fraction < 1) return;
      shownAt = now;
      setReading({ indices, fraction });
    });
    job.current = j;
    j.promise.then(
      (got) => {
        if (!live.current) return;
        // the arrays the map already reads (the same objects), not the copies of their views
        setDecoded((d) => merge(d, into ? { ...got, samples: into } : got));
        performance.mark('fanlight:channels-read');
      },
      (e: unknown) => {
        if (!live.current) return;
        // asked again later (another choice of channel) they are tried afresh
        for (const i of indices) asked.current.delete(i);
        setError(`Could not read channel ${indices.map((i) => i + 1).join(', ')} of ${opened.entry.name}: ${errorMessage(e)}`);
      },
    ).finally(() => {
      if (!live.current) return;
      job.current = null;
      setReading(null);
      setFilling(null);
      pump();
    });
  }, [opened]);

  useEffect(() => {
    live.current = true;
    return () => {
      live.current = false;
      job.current?.cancel();
    };
  }, []);

  const ensure = useCallback(
    (indices: number[]) => {
      const count = opened.decoded.header.channels.length;
      const missing = [...new Set(indices)].filter((i) => Number.isInteger(i) && i >= 0 && i < count && !asked.current.has(i));
      if (missing.length === 0) return;
      for (const i of missing) asked.current.add(i);
      queue.current.push(...missing);
      pump();
    },
    [opened, pump],
  );

  const recording = useMemo(() => (decoded === opened.decoded ? opened : { ...opened, decoded }), [opened, decoded]);
  return { recording, reading, filling, error, ensure };
}
