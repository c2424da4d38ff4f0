/**
 * Playback with Web Audio: the recording is played in short chunks, each an AudioBufferSourceNode
 * started back to back on the context's clock a little ahead of time. Every chunk plays twice in
 * parallel, as read and as processed (the worker's Vold–Kalman output for the same samples), each into
 * a gain of its own: switching between them is a gain change at the same position, with no gap.
 * Then one master gain, a limiter (a fast compressor) and a hard clip at −1 dBFS protect the ears from
 * clipping and sudden loud sound (common practice for monitoring chains).
 * Nothing here decodes: chunks are copied from the samples the decode worker handed over.
 */

/** What plays: one channel of one run. */
export interface PlaybackSource {
  /** Identity of the samples (run and channel): a new id is a new source */
  id: string;
  fsHz: number;
  /** Samples in the channel */
  length: number;
  /** Samples [from, to) as played (scaled to playback units) */
  original(from: number, to: number): Float32Array;
  /** The processed samples [from, to) in playback units; null when nothing is processed */
  processed: ((from: number, to: number) => Promise<Float32Array>) | null;
}

export type Hearing = 'original' | 'processed';

interface Chunk {
  from: number;
  to: number;
  /** Context time its first sample plays, and its last ends */
  when: number;
  end: number;
  original: AudioBufferSourceNode;
  processed: AudioBufferSourceNode | null;
}

/** A chunk's length, s of the recording; scheduled this far ahead of the play head, s of context time. */
const CHUNK_S = 0.5;
const AHEAD_S = 1.0;
const TICK_MS = 40;
/** A gain change takes this time constant, s (fast enough to sound instant, slow enough not to click). */
const GAIN_TC_S = 0.004;
/** The hard clip's level: −1 dBFS. */
const CLIP = 10 ** (-1 / 20);

export interface EngineEvents {
  /** The play head, in samples of the source (called about 25 times a second while playing) */
  position?(sample: number): void;
  /** Played to the end (no loop) */
  ended?(): void;
  /** The context's state changed (running, suspended, closed) */
  state?(state: AudioContextState): void;
}

/** Sample rates an AudioContext can run at (Web Audio API, AudioContext constructor, sampleRate). */
const contextRateFor = (fsHz: number) => (fsHz >= 3000 && fsHz <= 768000 ? fsHz : undefined);

export class PlaybackEngine {
  private ctx: AudioContext | null = null;
  private gains: { original: GainNode; processed: GainNode; master: GainNode } | null = null;
  private source: PlaybackSource | null = null;
  private chunks: Chunk[] = [];
  private cursor = 0;
  private nextWhen = 0;
  private rate = 1;
  private loop: [number, number] | null = null;
  private hearing: Hearing = 'original';
  private gainDb = -20;
  private timer: ReturnType<typeof setInterval> | null = null;
  private cache = new Map<string, Promise<Float32Array>>();
  private generation = 0;
  private lastPosition = 0;
  playing = false;

  constructor(private events: EngineEvents = {}) {}

  get state(): AudioContextState | 'none' {
    return this.ctx?.state ?? 'none';
  }

  /** Where the play head is, in samples of the source (where it stopped when paused). */
  position(): number {
    if (!this.playing || !this.ctx) return this.lastPosition;
    const now = this.ctx.currentTime;
    const c = this.chunks.find((k) => now >= k.when && now < k.end) ?? (this.chunks.length && now < this.chunks[0].when ? this.chunks[0] : null);
    if (!c || !this.source) return this.lastPosition;
    const at = c.from + Math.max(0, now - c.when) * this.source.fsHz * this.rate;
    this.lastPosition = Math.min(c.to, at);
    return this.lastPosition;
  }

  /** Starts playing `source` at sample `at`. */
  async play(source: PlaybackSource, at: number): Promise<void> {
    const ctx = this.contextFor(source.fsHz);
    this.setSourceOnly(source);
    this.stopChunks();
    this.cursor = this.clampStart(at);
    this.lastPosition = this.cursor;
    this.playing = true;
    await ctx.resume();
    if (!this.playing) return;
    this.nextWhen = ctx.currentTime + 0.03;
    this.applyHearing(true);
    this.tick();
    this.timer ??= setInterval(() => this.tick(), TICK_MS);
  }

  /** Stops, keeping the position. */
  pause(): number {
    const at = this.position();
    this.playing = false;
    this.stopChunks();
    if (this.timer) clearInterval(this.timer);
    this.timer = null;
    void this.ctx?.suspend().then(() => this.events.state?.(this.ctx!.state));
    return at;
  }

  /** Plays another source (another channel, or another run) from `at`, without stopping. */
  switchSource(source: PlaybackSource, at: number): void {
    if (!this.playing) {
      this.setSourceOnly(source);
      this.lastPosition = this.clampStart(at);
      return;
    }
    void this.play(source, at);
  }

  /** The processing of the current source changed (other guides, or isolate ↔ remove). */
  reprocess(processed: PlaybackSource['processed']): void {
    if (!this.source) return;
    this.source = { ...this.source, processed };
    this.cache.clear();
    this.generation++;
    for (const c of this.chunks) {
      c.processed?.stop();
      c.processed?.disconnect();
      c.processed = null;
      this.requestProcessed(c);
    }
    this.applyHearing(false);
  }

  setHearing(h: Hearing): void {
    this.hearing = h;
    this.applyHearing(false);
  }

  setGainDb(db: number): void {
    this.gainDb = db;
    if (this.ctx && this.gains) this.gains.master.gain.setTargetAtTime(10 ** (db / 20), this.ctx.currentTime, GAIN_TC_S * 5);
  }

  /** Playback rate (1 = as recorded); the play head restarts from where it is. */
  setRate(rate: number): void {
    if (rate === this.rate) return;
    const at = this.position();
    this.rate = rate;
    if (this.playing && this.source) void this.play(this.source, at);
  }

  /** Loops samples [a, b) (null: no loop); the play head moves into the range if outside it. */
  setLoop(range: [number, number] | null): void {
    const valid = range && range[1] - range[0] > 16 ? range : null;
    this.loop = valid;
    if (!this.playing || !this.source) return;
    const at = this.position();
    if (valid && (at < valid[0] || at >= valid[1])) void this.play(this.source, valid[0]);
    else void this.play(this.source, at);
  }

  async close(): Promise<void> {
    this.pause();
    const ctx = this.ctx;
    this.ctx = null;
    this.gains = null;
    await ctx?.close();
  }

  private setSourceOnly(source: PlaybackSource) {
    if (this.source?.id !== source.id || this.source.processed !== source.processed) {
      this.cache.clear();
      this.generation++;
    }
    this.source = source;
  }

  private clampStart(at: number): number {
    const len = this.source?.length ?? 0;
    let s = Math.max(0, Math.min(len - 1, Math.round(at)));
    if (this.loop && (s < this.loop[0] || s >= this.loop[1])) s = this.loop[0];
    return s;
  }

  private contextFor(fsHz: number): AudioContext {
    if (this.ctx && this.ctx.state !== 'closed' && (this.ctx.sampleRate === fsHz || contextRateFor(fsHz) === undefined)) return this.ctx;
    void this.ctx?.close();
    const ctx = new AudioContext({ sampleRate: contextRateFor(fsHz), latencyHint: 'playback' });
    ctx.addEventListener('statechange', () => this.events.state?.(ctx.state));
    const original = new GainNode(ctx, { gain: 1 });
    const processed = new GainNode(ctx, { gain: 0 });
    const master = new GainNode(ctx, { gain: 10 ** (this.gainDb / 20) });
    const limiter = new DynamicsCompressorNode(ctx, { threshold: -6, knee: 0, ratio: 20, attack: 0.001, release: 0.08 });
    const curve = new Float32Array(2049);
    for (let i = 0; i < curve.length; i++) curve[i] = Math.max(-CLIP, Math.min(CLIP, (2 * i) / (curve.length - 1) - 1));
    const clip = new WaveShaperNode(ctx, { curve });
    original.connect(master);
    processed.connect(master);
    master.connect(limiter).connect(clip).connect(ctx.destination);
    this.ctx = ctx;
    this.gains = { original, processed, master };
    return ctx;
  }

  private applyHearing(immediate: boolean) {
    if (!this.ctx || !this.gains) return;
    const processed = this.hearing === 'processed' && this.source?.processed ? 1 : 0;
    const t = this.ctx.currentTime;
    for (const [g, v] of [
      [this.gains.original.gain, 1 - processed],
      [this.gains.processed.gain, processed],
    ] as const) {
      g.cancelScheduledValues(t);
      if (immediate) g.setValueAtTime(v, t);
      else g.setTargetAtTime(v, t, GAIN_TC_S);
    }
  }

  private tick() {
    const ctx = this.ctx;
    const src = this.source;
    if (!ctx || !src || !this.playing) return;
    const now = ctx.currentTime;
    this.chunks = this.chunks.filter((c) => c.end > now - 0.05);
    const end = this.loop ? this.loop[1] : src.length;
    while (this.nextWhen - now < AHEAD_S) {
      if (this.loop && (this.cursor >= this.loop[1] || this.cursor < this.loop[0])) this.cursor = this.loop[0];
      if (this.cursor >= end) break;
      this.schedule(src, this.cursor, Math.min(end, this.cursor + Math.round(CHUNK_S * src.fsHz)));
    }
    if (!this.loop && this.cursor >= src.length && this.chunks.every((c) => c.end <= now)) {
      this.lastPosition = src.length - 1;
      this.pause();
      this.events.ended?.();
      return;
    }
    this.events.position?.(this.position());
  }

  private schedule(src: PlaybackSource, from: number, to: number) {
    const ctx = this.ctx!;
    // a late tick (a busy page) starts the next chunk now rather than in the past
    const when = Math.max(this.nextWhen, ctx.currentTime + 0.005);
    const original = this.bufferSource(src.original(from, to), src.fsHz, this.gains!.original);
    original.start(when);
    const chunk: Chunk = { from, to, when, end: when + (to - from) / (src.fsHz * this.rate), original, processed: null };
    this.chunks.push(chunk);
    this.requestProcessed(chunk);
    this.nextWhen = chunk.end;
    this.cursor = to;
  }

  private bufferSource(samples: Float32Array, fsHz: number, into: GainNode): AudioBufferSourceNode {
    const ctx = this.ctx!;
    const buffer = new AudioBuffer({ numberOfChannels: 1, length: Math.max(1, samples.length), sampleRate: fsHz });
    buffer.copyToChannel(samples as Float32Array<ArrayBuffer>, 0);
    const node = new AudioBufferSourceNode(ctx, { buffer, playbackRate: this.rate });
    node.connect(into);
    return node;
  }

  /** The processed twin of a chunk: started at the chunk's time, or part-way in if it came late. */
  private requestProcessed(chunk: Chunk) {
    const src = this.source;
    if (!src?.processed) return;
    const key = `${src.id}:${chunk.from}:${chunk.to}`;
    let job = this.cache.get(key);
    if (!job) {
      job = src.processed(chunk.from, chunk.to);
      this.cache.set(key, job);
      if (this.cache.size > 64) this.cache.delete(this.cache.keys().next().value!);
      job.catch(() => this.cache.delete(key));
    }
    const generation = this.generation;
    job.then(
      (samples) => {
        if (generation !== this.generation || !this.ctx || !this.chunks.includes(chunk) || chunk.processed) return;
        const now = this.ctx.currentTime + 0.005;
        if (now >= chunk.end) return;
        const node = this.bufferSource(samples, src.fsHz, this.gains!.processed);
        if (now <= chunk.when) node.start(chunk.when);
        else node.start(now, (now - chunk.when) * this.rate);
        chunk.processed = node;
      },
      () => undefined,
    );
  }

  private stopChunks() {
    for (const c of this.chunks) {
      for (const n of [c.original, c.processed]) {
        if (!n) continue;
        try {
          n.stop();
        } catch {
          // never started
        }
        n.disconnect();
      }
    }
    this.chunks = [];
  }
}
