/** One campaign file through the `inverter` command's code, as a result line or one sentence why not. */
import { RecordingError } from '../../../workers/io/recording-error';
import { SpeedError } from '../../../workers/dsp/speed';
import { inverterCommand } from '../commands/inverter';
import { Options, UsageError } from '../options';
import type { MapThreadPool } from '../thread-pool';

export type Outcome = { ok: true; inverter: unknown } | { ok: false; error: string; /** the file itself is at fault: trying again gives the same */ final: boolean };

function sentence(message: string): string {
  return message.replace(/\s+/g, ' ').trim();
}

export async function analyseOne(file: string, options: Record<string, string | true>, pool: MapThreadPool): Promise<Outcome> {
  try {
    return { ok: true, inverter: await inverterCommand(file, new Options(options), pool) };
  } catch (e) {
    // the same errors that exit the CLI with status 2: the file (or the preset on it) is at fault
    if (e instanceof RecordingError || e instanceof UsageError || e instanceof SpeedError || e instanceof RangeError) {
      return { ok: false, error: sentence(e.message), final: true };
    }
    return { ok: false, error: sentence(`analysis failed: ${e instanceof Error ? e.message : String(e)}`), final: false };
  }
}
