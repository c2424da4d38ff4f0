/** `npm run -s analyze -- …` as an engineer runs it, for the batch-mode tests: exit code, output and the parsed JSON. */
import { execFile } from 'node:child_process';
import { promisify } from 'node:util';
import { PROJECT_ROOT } from '../../server/config';

const run = promisify(execFile);

export interface AnalyzeRun {
  code: number;
  stdout: string;
  stderr: string;
  /** stdout parsed, or null when the command failed or printed no JSON */
  json: any; // eslint-disable-line @typescript-eslint/no-explicit-any -- each test reads its command's own shape
}

export async function analyzeCli(...args: string[]): Promise<AnalyzeRun> {
  try {
    const { stdout, stderr } = await run('npm', ['run', '-s', 'analyze', '--', ...args], { cwd: PROJECT_ROOT, maxBuffer: 64 << 20 });
    let json = null;
    try {
      json = JSON.parse(stdout);
    } catch {
      json = null;
    }
    return { code: 0, stdout, stderr, json };
  } catch (e) {
    const err = e as { code: number; stdout: string; stderr: string };
    return { code: err.code, stdout: err.stdout, stderr: err.stderr, json: null };
  }
}
