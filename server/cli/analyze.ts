/**
 * The batch mode: `npm run -s analyze -- <command> FILE [options]`. Prints one JSON object to stdout;
 * bad input exits with status 2 and one sentence on stderr (the same sentence the app shows).
 * The same workers/io and workers/dsp code as the browser does the work.
 */
import { readRecordingHeader } from '../../workers/io/decode-recording';
import { RecordingError } from '../../workers/io/recording-error';
import { SpeedError } from '../../workers/dsp/speed';
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

type Command = (file: string, o: Options) => Promise<unknown>;

// Each command's module loads when that command runs, so a run does not load the others' modules and
// packages (the queue client of campaign, the HDF5 reader, …): a shorter start for every command.
const commands: Record<string, () => Promise<Command>> = {
  info: async () => info,
  spectrum: async () => (await import('./commands/spectrum')).spectrumCommand,
  levels: async () => (await import('./commands/levels')).levelsCommand,
  speed: async () => (await import('./commands/speed')).speedCommand,
  map: async () => (await import('./commands/map')).mapCommand,
  inverter: async () => (await import('./commands/inverter')).inverterCommand,
  extract: async () => (await import('./commands/extract')).extractCommand,
  sound: async () => (await import('./commands/sound')).soundCommand,
};

export async function main(argv: string[]): Promise<number> {
  try {
    const parsed = parseArgs(argv, USAGE, (command) => command === 'compare' || command === 'campaign');
    const options = new Options(parsed.options, parsed.sequence);
    if (parsed.command === 'campaign') {
      // Ctrl-C stops the campaign cleanly: running files are abandoned, what is written stays
      const stop = new AbortController();
      process.once('SIGINT', () => stop.abort());
      const { campaignCommand } = await import('./commands/campaign');
      const summary = await campaignCommand(parsed.files, options, stop.signal);
      process.stdout.write(`${JSON.stringify(summary)}\n`);
      return stop.signal.aborted ? 130 : 0;
    }
    if (parsed.command === 'compare') {
      const { compareCommand } = await import('./commands/compare');
      process.stdout.write(`${JSON.stringify(await compareCommand(parsed.files, options))}\n`);
      return 0;
    }
    const load = commands[parsed.command];
    if (!load) throw new UsageError(`Unknown command "${parsed.command}". ${USAGE}`);
    const run = await load();
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
