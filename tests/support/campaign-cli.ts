/** Running `analyze campaign` and `analyze-worker` as a user does, for the campaign tests and bench. */
import { spawn, type ChildProcess } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { PROJECT_ROOT } from '../../server/config';

export interface CliRun {
  code: number | null;
  stdout: string;
  stderr: string;
}

/**
 * Starts `node --import tsx server/cli/analyze.ts ARGS` (no npm wrapper, so a signal reaches the CLI
 * itself), or with `launcher` the way `npm run analyze` starts it, from the JavaScript bundle.
 */
export function startAnalyze(
  args: string[],
  env: NodeJS.ProcessEnv = {},
  launcher = false,
): { child: ChildProcess; done: Promise<CliRun>; stderrLines: (listener: (line: string) => void) => void } {
  return launcher ? startNode('server/cli/analyze-launch.mjs', args, env, false) : startNode('server/cli/analyze.ts', args, env);
}

export function startWorker(args: string[]): { child: ChildProcess; done: Promise<CliRun>; stderrLines: (listener: (line: string) => void) => void } {
  return startNode('server/cli/analyze-worker.ts', args, {});
}

function startNode(entry: string, args: string[], env: NodeJS.ProcessEnv, tsx = true) {
  const child = spawn(process.execPath, [...(tsx ? ['--import', 'tsx'] : []), entry, ...args], { cwd: PROJECT_ROOT, env: { ...process.env, ...env } });
  let stdout = '';
  let stderr = '';
  const listeners: ((line: string) => void)[] = [];
  let partial = '';
  child.stdout!.on('data', (d: Buffer) => (stdout += d.toString()));
  child.stderr!.on('data', (d: Buffer) => {
    stderr += d.toString();
    partial += d.toString();
    const lines = partial.split('\n');
    partial = lines.pop()!;
    for (const line of lines) for (const l of listeners) l(line);
  });
  const done = new Promise<CliRun>((resolve) => child.once('close', (code) => resolve({ code, stdout, stderr })));
  return { child, done, stderrLines: (listener: (line: string) => void) => listeners.push(listener) };
}

export async function runAnalyze(args: string[], env: NodeJS.ProcessEnv = {}, launcher = false): Promise<CliRun> {
  return startAnalyze(args, env, launcher).done;
}

export interface ResultLine {
  file: string;
  ok: boolean;
  error?: string;
  inverter?: { carrier: { hz: (number | null)[] } };
}

export function readResults(file: string): ResultLine[] {
  return readFileSync(file, 'utf8')
    .split('\n')
    .filter((l) => l.trim())
    .map((l) => JSON.parse(l) as ResultLine);
}
