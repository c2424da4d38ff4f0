/**
 * RESULTS.jsonl: one line per finished file, appended and fsync'ed before the next, so a crash loses at
 * most the files still running; a rerun reads it and skips every file already in it.
 */
import { closeSync, existsSync, fsyncSync, openSync, readFileSync, writeSync } from 'node:fs';

export interface FileResult {
  file: string;
  ok: boolean;
  inverter?: unknown;
  error?: string;
}

export class ResultsLog {
  private readonly fd: number;
  /** Every result the file holds (earlier runs' included), by file */
  readonly results = new Map<string, FileResult>();

  constructor(readonly path: string) {
    if (existsSync(path)) {
      for (const line of readFileSync(path, 'utf8').split('\n')) {
        if (!line.trim()) continue;
        try {
          const r = JSON.parse(line) as FileResult;
          if (typeof r.file === 'string' && typeof r.ok === 'boolean' && !this.results.has(r.file)) this.results.set(r.file, r);
        } catch {
          // a line cut short by a crash: that file runs again
        }
      }
    }
    this.fd = openSync(path, 'a');
    // a line cut short by a crash has no newline: start on a fresh line
    const text = existsSync(path) ? readFileSync(path, 'utf8') : '';
    if (text.length > 0 && !text.endsWith('\n')) writeSync(this.fd, '\n');
  }

  has(file: string): boolean {
    return this.results.has(file);
  }

  /** Writes a file's result once; a second result for the same file is dropped (false). */
  write(result: FileResult): boolean {
    if (this.results.has(result.file)) return false;
    this.results.set(result.file, result);
    writeSync(this.fd, `${JSON.stringify(result)}\n`);
    fsyncSync(this.fd);
    return true;
  }

  close(): void {
    closeSync(this.fd);
  }
}
