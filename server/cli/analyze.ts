/**
 * The batch mode: `npm run -s analyze -- <command> FILE [options]`. Prints one JSON object to stdout;
 * bad input exits with status 2 and one sentence on stderr (the same sentence the app shows).
 * The same workers/io and workers/dsp code as the browser does the work.
 */
import path from 'node:path';
import { readRecordingHeader } from '../../workers/io/decode-recording';
import { RecordingError } from '../../workers/io/recording-error';
import { openFileSource } from './node-file-source';

class UsageError extends Error {}

const USAGE = 'usage: npm run -s analyze -- info FILE';

interface Parsed {
  command: string;
  file: string;
  options: Record<string, string | true>;
}

export function parseArgs(argv: string[]): Parsed {
  const [command, ...rest] = argv;
  if (!command) throw new UsageError(`Name a command. ${USAGE}`);
  const positional: string[] = [];
  const options: Record<string, string | true> = {};
  for (let i = 0; i < rest.length; i++) {
    const a = rest[i];
    if (a.startsWith('--')) {
      const key = a.slice(2);
      const next = rest[i + 1];
      if (next !== undefined && !next.startsWith('--')) {
        options[key] = next;
        i++;
      } else options[key] = true;
    } else positional.push(a);
  }
  if (positional.length !== 1) throw new UsageError(`Give exactly one FILE. ${USAGE}`);
  // npm runs scripts from the package folder; a relative path means the caller's folder.
  const file = path.resolve(process.env.INIT_CWD ?? process.cwd(), positional[0]);
  return { command, file, options };
}

async function info(file: string) {
  const source = await openFileSource(file);
  try {
    const h = await readRecordingHeader(source);
    return {
      format: h.format,
      sampleRate: h.sampleRateHz,
      frames: h.frames,
      durationS: h.durationS,
      channels: h.channels.map((c) => ({ index: c.index, name: c.name, unit: c.unit })),
    };
  } finally {
    await source.close();
  }
}

const commands: Record<string, (p: Parsed) => Promise<unknown>> = {
  info: (p) => info(p.file),
};

export async function main(argv: string[]): Promise<number> {
  try {
    const parsed = parseArgs(argv);
    const run = commands[parsed.command];
    if (!run) throw new UsageError(`Unknown command "${parsed.command}". ${USAGE}`);
    process.stdout.write(`${JSON.stringify(await run(parsed))}\n`);
    return 0;
  } catch (e) {
    if (e instanceof RecordingError || e instanceof UsageError) {
      process.stderr.write(`${e.message.replace(/\s+/g, ' ')}\n`);
      return 2;
    }
    process.stderr.write(`analyze failed: ${e instanceof Error ? e.message : String(e)}\n`);
    return 1;
  }
}

if (import.meta.url === `file://${process.argv[1]}`) {
  process.exitCode = await main(process.argv.slice(2));
}
