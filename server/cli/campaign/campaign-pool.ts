/** A pool of campaign worker threads (campaign-thread.ts), each analysing one file at a time. */
import { existsSync } from 'node:fs';
import { availableParallelism } from 'node:os';
import path from 'node:path';
import { Worker } from 'node:worker_threads';
import type { Outcome } from './analyse-one';

interface Slot {
  worker: Worker;
  busy: boolean;
}

export class CampaignPool {
  private readonly slots: Slot[];
  private nextId = 0;
  private readonly pending = new Map<number, { resolve: (o: Outcome) => void; reject: (e: Error) => void; slot: Slot }>();
  private readonly waiting: (() => void)[] = [];
  private closed = false;

  constructor(size = availableParallelism()) {
    this.slots = Array.from({ length: Math.max(1, size) }, () => {
      const slot = { busy: false } as Slot;
      this.spawn(slot);
      return slot;
    });
  }

  /** Starts the slot's thread; one that dies (out of memory, a crash in native code) fails its file and is replaced. */
  private spawn(slot: Slot): void {
    // Run from the CLI's JavaScript bundle (analyze-launch.mjs) when it holds this thread's entry; its map
    // thread then comes from the bundle too.
    const bundleDir = (globalThis as { fanlightCliBundleDir?: string }).fanlightCliBundleDir;
    const bundled = bundleDir && existsSync(path.join(bundleDir, 'campaign-thread.js')) ? path.join(bundleDir, 'campaign-thread.js') : null;
    // A worker thread does not inherit the tsx loader: register it there, then load the TypeScript entry.
    const entry = new URL('./campaign-thread.ts', import.meta.url).href;
    const worker = bundled
      ? new Worker(bundled, { workerData: { bundleDir } })
      : new Worker(`import('tsx/esm/api').then((t) => { t.register(); return import(${JSON.stringify(entry)}); });`, { eval: true });
    slot.worker = worker;
    worker.on('message', (m: { id: number; outcome: Outcome }) => this.settle(m.id, (p) => p.resolve(m.outcome)));
    const fail = (e: Error) => {
      if (this.closed || slot.worker !== worker) return;
      this.spawn(slot);
      for (const [id, p] of this.pending) if (p.slot === slot) this.settle(id, (q) => q.reject(e));
    };
    worker.on('error', fail);
    worker.on('exit', (code) => fail(new Error(`it stopped (exit ${code})`)));
  }

  get size(): number {
    return this.slots.length;
  }

  private settle(id: number, how: (p: { resolve: (o: Outcome) => void; reject: (e: Error) => void }) => void): void {
    const p = this.pending.get(id);
    if (!p) return;
    this.pending.delete(id);
    p.slot.busy = false;
    how(p);
    this.waiting.shift()?.();
  }

  /** Analyses one file on the first free thread (waiting for one when all are busy). */
  async run(file: string, options: Record<string, string | true>): Promise<Outcome> {
    let slot = this.slots.find((s) => !s.busy);
    while (!slot) {
      await new Promise<void>((resolve) => this.waiting.push(resolve));
      if (this.closed) throw new Error('The campaign pool is closed.');
      slot = this.slots.find((s) => !s.busy);
    }
    slot.busy = true;
    const id = this.nextId++;
    const chosen = slot;
    return new Promise<Outcome>((resolve, reject) => {
      this.pending.set(id, { resolve, reject, slot: chosen });
      chosen.worker.postMessage({ id, file, options });
    });
  }

  /** Ends every thread at once; files still running are abandoned (their promises never settle). */
  async close(): Promise<void> {
    this.closed = true;
    this.pending.clear();
    for (const w of this.waiting.splice(0)) w();
    await Promise.all(this.slots.map((s) => s.worker.terminate()));
  }
}
