/**
 * The demo's test campaign: twelve run-ups of the CA-7 over three inverter firmware builds (tag `build`),
 * one of which failed. Its results are invented, made here by code and not by analysing recordings (that
 * would make the seed slow); each build has its own carrier scheme and sideband level, so the campaign
 * table has something to sort and group. Invented data, for the demo only.
 */
import type { Knex } from 'knex';
import { ActivityRepository } from '../server/repositories/activity-repository';
import { CampaignRepository } from '../server/repositories/campaign-repository';
import { CampaignResultRepository } from '../server/repositories/campaign-result-repository';
import { summariseInverter } from '../server/services/campaign-summary';
import { seededRandom } from './synthetic-drive';

export const DEMO_CAMPAIGN_NAME = 'Firmware builds B1–B3, full-load run-ups';

interface Build {
  build: string;
  /** the carrier steps: [Hz before, Hz after, rpm of the step], or a steady carrier swept by spreadHz */
  carrier: { steps: [number, number, number] } | { hz: number; spreadHz: number };
  /** RMS of the first sideband pair fc ± fe at its peak, in g */
  sidebandG: number;
}

const BUILDS: Build[] = [
  { build: 'B1', carrier: { steps: [8000, 12000, 6000] }, sidebandG: 0.125 },
  { build: 'B2', carrier: { steps: [10000, 12000, 7000] }, sidebandG: 0.062 },
  { build: 'B3', carrier: { hz: 10000, spreadHz: 1200 }, sidebandG: 0.041 },
];
const RUNS_PER_BUILD = 4;
const PRESET = { channel: 0, cal: 10, tacho: 2, ppr: 60, quantity: 'acceleration', block: 8192, families: ['1:1', '1:-1', '2:0'] };
const FAILED = { file: 'B3/run-04.wav', error: 'B3/run-04.wav has no tacho pulses on channel 2 (the tacho cable came loose).' };

/** An inverter object shaped as `analyze inverter` prints it, with invented values around the build's. */
function inventedInverter(b: Build, rnd: () => number): Record<string, unknown> {
  const jitter = () => 1 + 0.15 * (rnd() - 0.5);
  const peakRpm = Math.round(11_700 + 300 * rnd());
  const steps = 'steps' in b.carrier ? b.carrier.steps : null;
  const steadyHz = 'hz' in b.carrier ? b.carrier.hz : null;
  return {
    carrier: { t: [0.1, 29.9], hz: steps ? [steps[0], steps[1]] : [steadyHz, steadyHz] },
    carrierShifts: steps ? [{ t: Number((steps[2] / 400).toFixed(2)), rpm: steps[2] + Math.round(10 * (rnd() - 0.5)), fromHz: steps[0], toHz: steps[1] }] : [],
    carrierSpreadHz: 'spreadHz' in b.carrier ? b.carrier.spreadHz : null,
    polePairs: { value: 4, source: 'inferred', pattern: 'm+n even', ambiguous: false, settledByChannel: true },
    orders: [],
    families: [],
    strongestFamilies: [
      { m: 1, n: 1, peakRms: b.sidebandG * jitter(), peakRpm, explained: true },
      { m: 1, n: -1, peakRms: 0.9 * b.sidebandG * jitter(), peakRpm, explained: true },
      { m: 2, n: 0, peakRms: 0.035 * jitter(), peakRpm: Math.round(7000 + 800 * rnd()), explained: true },
    ],
    levels: { overallDb: Number((-6 + 20 * Math.log10(b.sidebandG / 0.125) / 3 + rnd()).toFixed(1)) },
  };
}

/** Adds the demo campaign unless the project has it; true when it was added. */
export async function seedDemoCampaign(db: Knex, projectId: number, engineerId: number): Promise<boolean> {
  if (await db('campaigns').where({ project_id: projectId, name: DEMO_CAMPAIGN_NAME }).first('id')) return false;
  const rnd = seededRandom(18).uniform;
  const files = BUILDS.flatMap((b) => Array.from({ length: RUNS_PER_BUILD }, (_, i) => ({ b, file: `${b.build}/run-0${i + 1}.wav` })));
  const tags = Object.fromEntries(files.map(({ b, file }) => [file, { build: b.build, load: 'full' }]));
  const campaignId = await new CampaignRepository(db).insert(projectId, { name: DEMO_CAMPAIGN_NAME, preset: PRESET, total: files.length, tags }, engineerId);
  await new ActivityRepository(db).add({
    projectId,
    actorId: engineerId,
    verb: 'started',
    objectType: 'campaign',
    objectId: campaignId,
    summary: `started the campaign "${DEMO_CAMPAIGN_NAME}" over ${files.length} files`,
  });
  const results = new CampaignResultRepository(db);
  for (const { b, file } of files) {
    const failed = file === FAILED.file;
    const inverter = failed ? null : inventedInverter(b, rnd);
    await results.insertOnce(campaignId, {
      file,
      ok: !failed,
      error: failed ? FAILED.error : null,
      tags: {},
      summary: summariseInverter(inverter),
      inverterJson: inverter && JSON.stringify(inverter),
    });
  }
  return true;
}
