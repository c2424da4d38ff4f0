/**
 * The demo's finished finding: a view of the CA-7 run-up against speed, as an engineer would have saved it
 * from the Bench (the map of the inverter-housing accelerometer with the slot order and the carrier families
 * on the detected carrier), with its snapshot computed here by the engine itself. Where the carrier steps and
 * which family is strongest are facts of the invented scenario (seeds/demo-recordings.ts), not measured.
 */
import { mapAgainstSpeed } from '../workers/dsp/speed-map';
import { viewState, type ViewStateV1 } from '../server/schemas/views';
import type { SnapshotHeader } from '../workers/io/snapshot-format';
import { encodeSnapshot, quantiseDb } from '../workers/io/snapshot-codec';
import { demoChannelMap } from './demo-analysis';

export const DEMO_VIEW_TITLE = 'CA-7 run-up: the carrier steps from 8 to 12 kHz at 6000 rpm';
export const RUN_UP_FILE = 'ca7-run-up-30s.wav';

// The invented scenario (seeds/demo-recordings.ts): 500 → 12 000 rpm in 30 s, 4 pole pairs, 60-pulse tacho
// on channel 2, the accelerometer on channel 0 at 10 g full scale, carrier 8 kHz below 6000 rpm, 12 kHz above.
const RPM_FROM = 500;
const RPM_TO = 12000;
const POLE_PAIRS = 4;
const SHIFT_RPM = 6000;
const SHIFT_S = ((SHIFT_RPM - RPM_FROM) / (RPM_TO - RPM_FROM)) * 30;
const FREQ_TO_HZ = 20000;
const SNAPSHOT_ROWS = 640;
const RPM_STEP = 50;
const TOP_DB = -10;
const RANGE_DB = 70;

export const demoMarks = [
  {
    kind: 'point' as const,
    geometry: { x: SHIFT_RPM, y: 12000 },
    text: 'The carrier steps from 8 kHz to 12 kHz at 6000 rpm; the sideband families move with it.',
  },
  {
    kind: 'point' as const,
    // fc + fe at the top speed: 12 000 + 4 · 11 800 / 60 Hz
    geometry: { x: 11800, y: 12000 + (POLE_PAIRS * 11800) / 60 },
    text: 'fc + fe is the strongest family and peaks at the top speed (about 12.8 kHz at 11 800 rpm).',
  },
];

export const demoThread = [
  { who: 'engineer' as const, mark: 0, body: '@lead the step at 6000 rpm is the firmware carrier schedule. Worth a listen before we sign off?' },
  { who: 'lead' as const, mark: 0, body: 'Agreed. Compare the 2fc family before and after the step in the next firmware run.' },
  { who: 'engineer' as const, mark: 1, body: 'fc + fe sits about 6 dB above fc − fe across the run.' },
];

export function demoViewState(): ViewStateV1 {
  return viewState.parse({
    stateVersion: 1,
    processing: { channelIndex: 0, window: 'hann', blockSize: 4096, overlap: 0.5, scaling: 'rms', weighting: 'Z', levelScale: 'db', against: 'speed' },
    axes: { swapped: false, x: { kind: 'speed', from: RPM_FROM, to: RPM_TO, unit: 'rpm' }, y: { kind: 'frequency', from: 0, to: FREQ_TO_HZ, unit: 'Hz' } },
    colourRange: { scale: 'ember', topDb: TOP_DB, rangeDb: RANGE_DB },
    guides: [
      { kind: 'order', order: 48, label: 'slot order', visible: true },
      { kind: 'family', m: 1, n: 1, visible: true },
      { kind: 'family', m: 1, n: -1, visible: true },
      { kind: 'family', m: 2, n: 0, visible: true },
    ],
    carrierSchedule: [
      { fromS: 0, toS: SHIFT_S, carrierHz: 8000 },
      { fromS: SHIFT_S, toS: 30, carrierHz: 12000 },
    ],
    polePairs: POLE_PAIRS,
    selectedTracks: [
      { kind: 'family', m: 1, n: 1 },
      { kind: 'order', order: 48 },
    ],
    carrierGuides: [
      { source: 'detected', centreHz: 8000, per: 'electrical', families: [{ m: 1, n: 1 }, { m: 1, n: -1 }, { m: 2, n: 0 }], visible: true },
    ],
    speedSource: { kind: 'tacho', channel: 2, ppr: 60, triggerLevel: null },
    polePairsSource: 'inferred',
  }) as ViewStateV1;
}

/**
 * The snapshot of the demo view: the accelerometer's RMS map (Hann, 4096, 50 %) against speed in 50 rpm
 * bins, 0–20 kHz reduced to 640 rows by keeping each group's maximum, quantised over the colour range.
 */
export async function demoSnapshot(demoDir: string): Promise<Uint8Array> {
  const { layout, power, frameRpm } = await demoChannelMap(demoDir, RUN_UP_FILE, 0, { window: 'hann', blockSize: 4096, overlap: 0.5 });
  const bySpeed = mapAgainstSpeed(power, layout, frameRpm, { rpmStep: RPM_STEP, rpmMin: RPM_FROM, rpmMax: RPM_TO });

  const width = bySpeed.rpm.length;
  const binsTo = Math.min(layout.bins, Math.ceil(FREQ_TO_HZ / layout.binHz));
  const map = new Uint8Array(width * SNAPSHOT_ROWS);
  for (let col = 0; col < width; col++) {
    for (let row = 0; row < SNAPSHOT_ROWS; row++) {
      const b0 = Math.floor((row * binsTo) / SNAPSHOT_ROWS);
      const b1 = Math.max(b0 + 1, Math.floor(((row + 1) * binsTo) / SNAPSHOT_ROWS));
      let p = 0;
      for (let b = b0; b < b1; b++) {
        const v = bySpeed.power[col * layout.bins + b];
        if (v > p) p = v; // max-hold keeps narrow lines visible at the reduced height
      }
      map[row * width + col] = quantiseDb(10 * Math.log10(Math.max(p, 1e-30)), TOP_DB, RANGE_DB);
    }
  }
  const header: SnapshotHeader = {
    width,
    height: SNAPSHOT_ROWS,
    encoding: 'u8-db',
    dbTop: TOP_DB,
    dbRange: RANGE_DB,
    axes: {
      x: { kind: 'speed', from: bySpeed.rpm[0] - RPM_STEP / 2, to: bySpeed.rpm[width - 1] + RPM_STEP / 2, unit: 'rpm' },
      y: { kind: 'frequency', from: 0, to: binsTo * layout.binHz, unit: 'Hz' },
    },
    findings: [
      { kind: 'carrier-shift', summary: 'Carrier 8000 Hz → 12000 Hz at 6000 rpm', at: { x: SHIFT_RPM, y: 12000 } },
      { kind: 'pole-pairs', summary: '4 pole pairs (force pattern, m + n even)' },
    ],
  };
  return encodeSnapshot(header, map);
}
