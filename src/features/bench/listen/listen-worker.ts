/**
 * The listening worker (workers/listen.worker.ts): one, created on first use and kept. Each channel is
 * handed over once (a copy: the page keeps its samples for the original sound); blocks and ranges are
 * then asked by id. Where no worker can start, the same functions run on this thread.
 */
import * as Comlink from 'comlink';
import type { ListenBlockRequest, ListenWorkerApi } from '../../../../workers/listen.worker';

let remote: Comlink.Remote<ListenWorkerApi> | null = null;
let unavailable = typeof Worker === 'undefined';
const loaded = new Map<string, Promise<void>>();
/** On this thread when there is no worker: the samples by id. */
const local = new Map<string, { samples: Float32Array; fsHz: number }>();

function worker(): Comlink.Remote<ListenWorkerApi> | null {
  if (unavailable) return null;
  if (remote) return remote;
  try {
    const w = new Worker(new URL('../../../../workers/listen.worker.ts', import.meta.url), { type: 'module', name: 'fanlight-listen' });
    w.addEventListener('error', (e) => {
      e.preventDefault();
      unavailable = true;
      remote = null;
      loaded.clear();
    });
    remote = Comlink.wrap<ListenWorkerApi>(w);
    return remote;
  } catch {
    unavailable = true;
    return null;
  }
}

/** Hands the channel to the worker under `id` once. */
function ensureLoaded(id: string, samples: Float32Array, fsHz: number): Promise<void> {
  local.set(id, { samples, fsHz });
  const w = worker();
  if (!w) return Promise.resolve();
  let job = loaded.get(id);
  if (!job) {
    const copy = Float32Array.from(samples);
    job = w.load(id, Comlink.transfer(copy, [copy.buffer]), fsHz);
    loaded.set(id, job);
    job.catch(() => loaded.delete(id));
  }
  return job;
}

type Request = ListenBlockRequest & { samples: Float32Array; fsHz: number };

async function inline(kind: 'block' | 'range', req: Request): Promise<Float32Array> {
  const dsp = await import('../../../../workers/dsp/playback-filter');
  const fn = kind === 'block' ? dsp.filterBlock : dsp.filterRange;
  return fn(req.samples, req.fsHz, req.lines, req.layout, req.from, req.to, req.options);
}

async function run(kind: 'block' | 'range', req: Request): Promise<Float32Array> {
  await ensureLoaded(req.id, req.samples, req.fsHz);
  const w = worker();
  const { samples: _s, fsHz: _f, ...sent } = req;
  if (!w) return inline(kind, req);
  return kind === 'block' ? w.block(sent) : w.range(sent);
}

/** Hands the channel over now, so the first processed block does not wait for the copy. */
export const prepareChannel = (id: string, samples: Float32Array, fsHz: number) => void ensureLoaded(id, samples, fsHz).catch(() => undefined);

/** The processed samples [from, to) of a channel (in the channel's file units, as the samples given). */
export const processBlock = (req: Request) => run('block', req);
/** The processed samples of a whole range, for an export. */
export const processRange = (req: Request) => run('range', req);
