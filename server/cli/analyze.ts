/**
 * The batch mode: `npm run -s analyze -- <command> FILE [options]`. Prints one JSON object to stdout;
 * bad input exits with status 2 and one sentence on stderr (the same sentence the app shows).
 * The same workers/io and workers/dsp code as the browser does the work.
 */
import { readRecordingHeader } from '../../workers/io/decode-recording';
import { RecordingError } from '../../workers/io/recording-error';
import { SpeedError } from '../../workers/dsp/speed';
import { campaignCommand } from './commands/campaign';
import { compareCommand } from './commands/compare';
import { extractCommand } from './commands/extract';
import { inverterCommand } from './commands/inverter';
import { levelsCommand } from './commands/levels';
import { mapCommand } from './commands/map';
import { soundCommand } from './commands/sound';
import { spectrumCommand } from './commands/spectrum';
import { speedCommand } from './commands/speed';
import { openFileSource } from './node-file-source';
import { reportWarnings } from './recording-input';
import { Options, parseArgs, UsageError } from './options';

const USAGE = 'usage: npm run -s analyze -- info|spectrum|levels|speed|map|inverter|extract|sound FILE [options], compare FILE_A FILE_B [FILE…] [options], or campaign DIR|FILE… --preset PRESET.json [options] (see the README, "Batch mode")';

async function info(file: string) {
  const source = await openFileSource(file);
  try {
    const h = await readRecordingHeader(source);
    reportWarnings(h.fileName, h.warnings);
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

const commands: Record<string, (file: string, o: Options) => Promise<unknown>> = {
  info: (file) => info(file),
  spectrum: spectrumCommand,
  levels: levelsCommand,
  speed: speedCommand,
  map: mapCommand,
  inverter: inverterCommand,
  extract: extractCommand,
  sound: soundCommand,
};

export async function main(argv: string[]): Promise<number> {
  try {
    const parsed = parseArgs(argv, USAGE, (command) => command === 'compare' || command === 'campaign');
    const options = new Options(parsed.options, parsed.sequence);
    if (parsed.command === 'campaign') {
      // Ctrl-C stops the campaign cleanly: running files are abandoned, what is written stays
      const stop = new AbortController();
      process.once('SIGINT', () => stop.abort());
      const summary = await campaignCommand(parsed.files, options, stop.signal);
      process.stdout.write(`${JSON.stringify(summary)}\n`);
      return stop.signal.aborted ? 130 : 0;
    }
    if (parsed.command === 'compare') {
      process.stdout.write(`${JSON.stringify(await compareCommand(parsed.files, options))}\n`);
      return 0;
    }
    const run = commands[parsed.command];
    if (!run) throw new UsageError(`Unknown command "${parsed.command}". ${USAGE}`);
    process.stdout.write(`${JSON.stringify(await run(parsed.file, options))}\n`);
    return 0;
  } catch (e) {
    if (e instanceof RecordingError || e instanceof UsageError || e instanceof SpeedError || e instanceof RangeError) {
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
