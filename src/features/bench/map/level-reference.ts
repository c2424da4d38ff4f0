/**
 * The reference a channel's map levels are given against, from its quantity and unit: 20 µPa for sound
 * pressure, 1 µm/s² for acceleration and 1 nm/s for velocity (ISO 1683:2015, via dbReference), else one
 * of the channel's own unit.
 */
import type { ChannelSetup } from '../../../../workers/io/channel-setup';
import { dbReference } from '../../../../workers/dsp/levels';
import type { Weighting } from '../../../../workers/dsp/weighting';

export interface LevelReference {
  /** Reference RMS value in the channel's unit */
  refRms: number;
  /** "20 µPa", "1 µm/s²", "1 V" */
  label: string;
  unit: string;
}

const norm = (unit: string) => unit.trim().replace('^2', '²').replace(/2$/, '²');

export function levelReference(setup: Pick<ChannelSetup, 'quantity' | 'unit'>): LevelReference {
  const unit = setup.unit.trim();
  const u = norm(unit);
  if (setup.quantity === 'sound-pressure') {
    if (u === 'Pa') return { refRms: dbReference('sound-pressure'), label: '20 µPa', unit };
    if (u === 'mPa') return { refRms: dbReference('sound-pressure') * 1e3, label: '20 µPa', unit };
  }
  if (setup.quantity === 'acceleration' && u === 'm/s²') return { refRms: dbReference('acceleration-iso'), label: '1 µm/s²', unit };
  if (setup.quantity === 'velocity') {
    if (u === 'm/s') return { refRms: dbReference('velocity-iso'), label: '1 nm/s', unit };
    if (u === 'mm/s') return { refRms: dbReference('velocity-iso') * 1e3, label: '1 nm/s', unit };
  }
  return { refRms: 1, label: unit ? `1 ${unit}` : '1', unit };
}

/** The unit of a weighted level: dB, dB(A), dB(C). */
export const dbUnit = (w: Weighting) => (w === 'Z' ? 'dB' : `dB(${w})`);
