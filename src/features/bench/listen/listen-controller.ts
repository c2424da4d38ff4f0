/**
 * Listening on the Bench, one player for the whole workspace (the open run and the runs compared with
 * it): what plays, how, and where the play head is. The engineer's choices and the player's state are
 * stores the bar and the maps read; the audio itself is playback-engine.ts.
 */
import { timeAtSameSpeed } from '../../../../workers/dsp/speed-match';
import { createStore, type Store } from '../session/store';
import type { PublishedRun } from '../workspace/workspace';
import { PlaybackEngine, type Hearing } from './playback-engine';
import { levelStatement, rpmAtSample, runSource, type Processing, type RunSource } from './playback-source';

/** A loop: a stretch of time of the run that plays, or a speed range (each run loops where it runs at those speeds). */
export type Loop = { kind: 'time'; t0S: number; t1S: number; label: string } | { kind: 'speed'; rpm0: number; rpm1: number; label: string };

export interface ListenSettings {
  /** The run heard (null: the open run, the comparison's baseline) */
  runId: string | null;
  /** The channel heard (null: the map's) */
  channel: number | null;
  processing: Processing;
  bandwidthHz: number;
  hearing: Hearing;
  rate: number;
  gainDb: number;
  loop: Loop | null;
}

export interface ListenStatus {
  playing: boolean;
  audio: AudioContextState | 'none';
  /** What is heard, in words; null before anything was chosen */
  heard: { runId: string; runName: string; channelName: string; lineCount: number; level: string } | null;
  message: string | null;
}

export interface PlayHead {
  runId: string;
  timeS: number;
  rpm: number;
}

/** Playback starts this low (and the bar says so): the engineer raises it. */
export const START_GAIN_DB = -20;

export const initialListenSettings: ListenSettings = {
  runId: null,
  channel: null,
  processing: 'off',
  bandwidthHz: 10,
  hearing: 'original',
  rate: 1,
  gainDb: START_GAIN_DB,
  loop: null,
};

export class ListenController {
  readonly settings: Store<ListenSettings> = createStore(initialListenSettings);
  readonly status: Store<ListenStatus> = createStore<ListenStatus>({ playing: false, audio: 'none', heard: null, message: null });
  readonly playHead: Store<PlayHead | null> = createStore<PlayHead | null>(null);
  private engine: PlaybackEngine;
  private source: RunSource | null = null;
  /** The published state the source was built from (rebuilt when the run's guides or channel change) */
  private builtFrom: unknown[] = [];

  constructor(private runs: Store<Record<string, PublishedRun>>) {
    this.engine = new PlaybackEngine({
      position: (sample) => this.showHead(sample),
      ended: () => this.status.set((s) => ({ ...s, playing: false })),
      state: (audio) => this.status.set((s) => ({ ...s, audio })),
    });
  }

  /** Follows the runs while the Bench is open; the returned function stops (and pauses the sound). */
  attach(): () => void {
    const off = this.runs.subscribe(() => this.followRun());
    return () => {
      off();
      if (this.engine.playing) this.pause();
    };
  }

  get playing(): boolean {
    return this.engine.playing;
  }

  /** The run heard: the chosen one if it is still open, else the baseline. */
  private run(): PublishedRun | null {
    const all = this.runs.get();
    const id = this.settings.get().runId;
    return (id && all[id]) || Object.values(all).find((r) => r.baseline) || null;
  }

  private build(run: PublishedRun): RunSource | null {
    const s = this.settings.get();
    const src = runSource(run, { channel: s.channel, processing: s.processing, bandwidthHz: s.bandwidthHz });
    const wanted = s.channel ?? run.state.settings.channel;
    // a channel of the file not read yet: read it now, to be heard on the next play
    const inFile = wanted >= 0 && wanted < run.state.recording.decoded.header.channels.length;
    if (!src && inFile) run.state.readChannels([wanted]);
    this.builtFrom = depsOf(run);
    this.source = src;
    src?.prepare();
    this.status.set((st) => ({
      ...st,
      heard: src ? { runId: run.id, runName: run.name, channelName: src.channelName, lineCount: src.lineCount, level: levelStatement(src, s.gainDb) } : null,
      message: src ? null : inFile ? `Reading channel ${wanted + 1} of ${run.name} from its file; press play again in a moment.` : `${run.name} has no channel ${wanted + 1}.`,
    }));
    return src;
  }

  /** The run's guides, channel or speed changed while listening: its processing follows. */
  private followRun() {
    const run = this.run();
    if (!run || !this.source || this.source.runId !== run.id) return;
    const deps = depsOf(run);
    if (deps.every((d, i) => d === this.builtFrom[i])) return;
    const before = this.source;
    const src = this.build(run);
    if (!src) return;
    if (src.channelIndex !== before.channelIndex) this.engine.switchSource(src, this.engine.position());
    else this.engine.reprocess(src.processed);
    this.engine.setLoop(this.loopSamples(src));
  }

  /**
   * Plays from a moment: `timeS`, or the first time the run reaches `rpm`, or where it stopped (the
   * start of the loop if that is elsewhere).
   */
  async play(from: { timeS?: number; rpm?: number } = {}): Promise<void> {
    const run = this.run();
    if (!run) return;
    const before = this.source;
    let at = this.engine.position();
    const src = this.build(run);
    if (!src) return;
    if (before?.runId !== run.id || at >= src.length - 1) at = 0;
    if (from.timeS !== undefined && Number.isFinite(from.timeS)) at = from.timeS * src.fsHz;
    else if (from.rpm !== undefined && src.speed) {
      const t = timeAtSameSpeed(src.speed, from.rpm);
      if (t === null) {
        this.status.set((st) => ({ ...st, message: `${run.name} does not reach ${Math.round(from.rpm!)} rpm.` }));
        return;
      }
      at = t * src.fsHz;
    }
    if (this.engine.playing) this.engine.pause();
    const s = this.settings.get();
    this.engine.setRate(s.rate);
    this.engine.setGainDb(s.gainDb);
    this.engine.setHearing(s.hearing);
    this.engine.setLoop(this.loopSamples(src));
    this.status.set((st) => ({ ...st, playing: true }));
    try {
      await this.engine.play(src, at);
      this.status.set((st) => ({ ...st, audio: this.engine.state === 'none' ? 'none' : this.engine.state }));
    } catch (e) {
      this.status.set((st) => ({ ...st, playing: false, message: `The sound could not start: ${e instanceof Error ? e.message : String(e)}` }));
    }
  }

  pause(): void {
    const at = this.engine.pause();
    this.status.set((st) => ({ ...st, playing: false }));
    this.showHead(at);
  }

  toggle(from?: { timeS?: number; rpm?: number }): void {
    if (this.engine.playing) this.pause();
    else void this.play(from);
  }

  update(patch: Partial<ListenSettings>): void {
    const before = this.settings.get();
    this.settings.set({ ...before, ...patch });
    const s = this.settings.get();
    if (patch.gainDb !== undefined) {
      this.engine.setGainDb(s.gainDb);
      const src = this.source;
      if (src) this.status.set((st) => (st.heard ? { ...st, heard: { ...st.heard, level: levelStatement(src, s.gainDb) } } : st));
    }
    if (patch.hearing !== undefined) this.engine.setHearing(s.hearing);
    if (patch.rate !== undefined) this.engine.setRate(s.rate);
    const run = this.run();
    if (!run || !this.source) return;
    if (patch.runId !== undefined && patch.runId !== before.runId) return this.switchRun(before.runId, s.runId);
    if (patch.processing !== undefined || patch.bandwidthHz !== undefined || patch.channel !== undefined) {
      const prev = this.source;
      const src = this.build(run);
      if (!src) return;
      if (src.channelIndex !== prev.channelIndex) this.engine.switchSource(src, this.engine.position());
      else this.engine.reprocess(src.processed);
    }
    if (patch.loop !== undefined && this.source) this.engine.setLoop(this.loopSamples(this.source));
  }

  /** Hears processed ↔ original at the same position. */
  toggleHearing(): void {
    this.update({ hearing: this.settings.get().hearing === 'original' ? 'processed' : 'original' });
  }

  /** Hears the next run of the workspace at the speed heard now. */
  nextRun(): void {
    const ids = Object.values(this.runs.get())
      .sort((a, b) => Number(b.baseline) - Number(a.baseline))
      .map((r) => r.id);
    if (ids.length < 2) return;
    const current = this.run()?.id ?? ids[0];
    this.update({ runId: ids[(ids.indexOf(current) + 1) % ids.length] });
  }

  /** The play head moves to the other run at the same speed (each run by its own speed curve). */
  private switchRun(fromId: string | null, toId: string | null) {
    const prev = this.source;
    const all = this.runs.get();
    const target = (toId && all[toId]) || Object.values(all).find((r) => r.baseline);
    if (!target || !prev) return;
    const src = this.build(target);
    if (!src) return;
    const sample = this.engine.position();
    const rpm = rpmAtSample(prev, sample);
    let at = (sample / prev.fsHz) * src.fsHz;
    if (Number.isFinite(rpm) && src.speed) {
      const t = timeAtSameSpeed(src.speed, rpm, sample / prev.fsHz);
      if (t === null) this.status.set((st) => ({ ...st, message: `${target.name} does not reach ${Math.round(rpm)} rpm: it plays from the same time instead.` }));
      else at = t * src.fsHz;
    }
    void fromId;
    this.engine.setLoop(this.loopSamples(src));
    this.engine.switchSource(src, at);
    this.showHead(at);
  }

  /** The loop in samples of this source (a speed range where this run runs at those speeds). */
  private loopSamples(src: RunSource): [number, number] | null {
    const loop = this.settings.get().loop;
    if (!loop) return null;
    let t0: number | null;
    let t1: number | null;
    if (loop.kind === 'time') [t0, t1] = [loop.t0S, loop.t1S];
    else {
      if (!src.speed) return null;
      t0 = timeAtSameSpeed(src.speed, loop.rpm0);
      t1 = t0 === null ? null : timeAtSameSpeed(src.speed, loop.rpm1, t0);
    }
    if (t0 === null || t1 === null) return null;
    const [a, b] = t0 <= t1 ? [t0, t1] : [t1, t0];
    return [Math.max(0, Math.round(a * src.fsHz)), Math.min(src.length, Math.round(b * src.fsHz))];
  }

  /** The processed sound of the loop (else the whole run), in the channel's units, for a WAV. */
  async processedForExport(): Promise<{ samples: Float32Array; fsHz: number; name: string; unit: string } | null> {
    const run = this.run();
    if (!run) return null;
    const src = this.source?.runId === run.id ? this.source : this.build(run);
    if (!src?.processedRange) return null;
    const [from, to] = this.loopSamples(src) ?? [0, src.length];
    const samples = await src.processedRange(from, to);
    const mode = this.settings.get().processing === 'remove' ? 'without-guides' : 'guides-alone';
    const span = `${(from / src.fsHz).toFixed(1)}-${(to / src.fsHz).toFixed(1)}s`;
    const base = run.name.replace(/\.[^.]+$/, '').replace(/[^\w.-]+/g, '-');
    return { samples, fsHz: src.fsHz, name: `${base}-${src.channelName.replace(/[^\w.-]+/g, '-')}-${mode}-${span}.wav`, unit: src.unit };
  }

  private showHead(sample: number) {
    const src = this.source;
    if (!src) return;
    this.playHead.set({ runId: src.runId, timeS: sample / src.fsHz, rpm: rpmAtSample(src, sample) });
  }
}

/** What a run's source is built from: a change in any of these rebuilds it. */
const depsOf = (run: PublishedRun): unknown[] => [run.state.selected, run.state.map.layout, run.state.setup, run.state.settings.channel, run.state.speed];
