/**
 * Where a recording's speed comes from, as the engineer sets it on the Bench and the library keeps it:
 * a tacho channel, a speed channel, a typed ramp, or none. Pure: the page, the library and tests share it.
 */
import type { ChannelSetup } from './channel-setup';

export type SpeedSource =
  | { kind: 'none' }
  | { kind: 'tacho'; channel: number; ppr: number; triggerLevel: number | null }
  | { kind: 'channel'; channel: number; rpmPerUnit: number }
  | { kind: 'ramp'; startRpm: number; endRpm: number };

export const DEFAULT_PPR = 60;

/** A tacho channel, if the setup has one, at 60 pulses per revolution; else none. */
export function defaultSpeedSource(setup: ChannelSetup[]): SpeedSource {
  const tacho = setup.find((c) => c.quantity === 'tacho');
  return tacho ? { kind: 'tacho', channel: tacho.index, ppr: DEFAULT_PPR, triggerLevel: null } : { kind: 'none' };
}

/** What keeps a source from giving a speed, in the engineer's words; null when it is usable. */
export function speedSourceProblem(s: SpeedSource, setup: ChannelSetup[]): string | null {
  switch (s.kind) {
    case 'none':
      return null;
    case 'tacho':
      if (!setup.some((c) => c.index === s.channel)) return 'Choose the tacho channel.';
      if (!(Number.isInteger(s.ppr) && s.ppr >= 1)) return 'Pulses per revolution must be a whole number of at least 1.';
      if (s.triggerLevel !== null && !Number.isFinite(s.triggerLevel)) return 'The trigger level must be a number (or left empty for automatic).';
      return null;
    case 'channel':
      if (!setup.some((c) => c.index === s.channel)) return 'Choose the speed channel.';
      if (!(Number.isFinite(s.rpmPerUnit) && s.rpmPerUnit !== 0)) return 'The scale must be a number of rpm per unit other than 0.';
      return null;
    case 'ramp':
      if (!(Number.isFinite(s.startRpm) && s.startRpm >= 0 && Number.isFinite(s.endRpm) && s.endRpm >= 0)) return 'Type the start and end speed in rpm (0 or more).';
      return null;
  }
}
