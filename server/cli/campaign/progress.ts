/** The campaign's progress on stderr: one line per finished file with done/total, files per minute and ETA. */
export class Progress {
  private readonly started = Date.now();
  done = 0;
  failed = 0;

  constructor(
    private readonly total: number,
    private readonly write: (line: string) => void = (l) => process.stderr.write(`${l}\n`),
  ) {}

  /** Counts a finished file and says where the campaign stands. */
  finished(file: string, ok: boolean): void {
    this.done++;
    if (!ok) this.failed++;
    const minutes = (Date.now() - this.started) / 60_000;
    const rate = minutes > 0 ? this.done / minutes : 0;
    const left = this.total - this.done;
    const eta = rate > 0 ? formatDuration((left / rate) * 60) : '?';
    this.write(`campaign: ${this.done}/${this.total} done${this.failed ? ` (${this.failed} failed)` : ''}, ${rate.toFixed(1)} files/min, ETA ${eta} — ${ok ? 'ok' : 'FAILED'} ${file}`);
  }

  get seconds(): number {
    return (Date.now() - this.started) / 1000;
  }
}

function formatDuration(s: number): string {
  const m = Math.floor(s / 60);
  const sec = Math.round(s % 60);
  return m >= 60 ? `${Math.floor(m / 60)}h${String(m % 60).padStart(2, '0')}m` : `${m}:${String(sec).padStart(2, '0')}`;
}
