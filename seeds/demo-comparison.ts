/**
 * The demo's saved comparison: the CA-7 run-up after the firmware change against the first one, as an
 * engineer would have saved it from the Bench's Comparison panel. Everything in it is computed here from
 * the demo files, the way the batch CLI's `compare` does it (server/cli/commands/compare.ts): the housing
 * accelerometer's map with the Bench's default settings (Hann, 8192, 75 %), analyseInverter on each run,
 * the family fc − fe of each on one speed grid (workers/dsp/compare.ts), checked against the demo target,
 * and each run's carrier against speed. The view's map (its snapshot) is the baseline's.
 */
import { deltaDb, exceedances, levelsDb, medianOnSpeedGrid, onSpeedGrid, speedGrid, speedRange } from '../workers/dsp/compare';
import { familyLabel } from '../workers/dsp/guide-formula';
import { analyseInverter, patternOfQuantity, type InverterReport } from '../workers/dsp/inverter-analysis';
import { targetAt, type TargetPoint } from '../workers/io/target-csv';
import { comparisonState, viewState, type ComparisonState, type ViewStateV1 } from '../server/schemas/views';
import { DEMO_TACHO_PPR, demoChannelMap } from './demo-analysis';
import { demoRecordings } from './demo-recordings';
import { RUN_UP_FILE } from './demo-view';

export const DEMO_COMPARISON_TITLE = 'CA-7 firmware B against A: fc − fe on the housing';
export const FIRMWARE_B_FILE = 'ca7-run-up-30s-firmware-b.wav';
/** The baseline first, as the Bench keeps them. */
export const COMPARED_FILES = [RUN_UP_FILE, FIRMWARE_B_FILE] as const;

const CHANNEL = 0; // the accelerometer on the inverter housing
const FAMILY = { m: 1, n: -1 };
// The Bench's default map for a 30 s recording (src/features/bench/session/use-map-settings.ts), and the
// CLI's and the Bench's speed bins
const MAP = { window: 'hann' as const, blockSize: 8192, overlap: 0.75 };
const RPM_STEP = 50;
const FREQ_TO_HZ = 20000;
const TOP_DB = -10;
const RANGE_DB = 70;

/** "10 000": thousands parted by a narrow no-break space, as the Bench writes numbers. */
const digits = (v: number) => `${v < 0 ? '−' : ''}${Math.abs(Math.round(v)).toString().replace(/\B(?=(\d{3})+(?!\d))/g, '\u202f')}`;
const db1 = (v: number) => `${v < 0 ? '−' : ''}${Math.abs(v).toFixed(1)}`;
const nullable = (v: Float64Array) => Array.from(v, (x) => (Number.isFinite(x) ? Number(x.toPrecision(6)) : null));

/** A run's findings in words, in the columns of the Bench's comparison table (carrier, shifts, spread, pole pairs, strongest families). */
function findingsOf(r: InverterReport, refRms: number) {
  const levels = r.carrierShifts.length ? [r.carrierShifts[0].fromHz, ...r.carrierShifts.map((s) => s.toHz)] : [];
  const top = r.strongestFamilies.filter((f) => f.peakRms > 0 && Number.isFinite(f.peakRpm)).slice(0, 3);
  return {
    carrier: levels.length ? `Carrier ${levels.map((h) => `${digits(h)} Hz`).join(', then ')}` : 'Carrier found, steady',
    shifts: r.carrierShifts.length ? r.carrierShifts.map((s) => `${digits(s.fromHz)} → ${digits(s.toHz)} Hz at ${digits(s.rpm)} rpm`).join('; ') : 'none',
    spread: r.carrierSpreadHz === null ? 'steady' : `${digits(r.carrierSpreadHz)} Hz`,
    poles: r.polePairs.value === null ? '—' : `${r.polePairs.value}${r.polePairs.ambiguous ? ' (ambiguous)' : ''}`,
    families: top.map((f) => `${familyLabel(f.m, f.n)} ${db1(20 * Math.log10(f.peakRms / refRms))} dB`).join(', '),
  };
}

export interface DemoComparison {
  comparison: ComparisonState;
  /** The view's whole state (the baseline's map settings, the guides, the comparison), parsed by the server's schema */
  state: ViewStateV1;
  marks: { kind: 'point' | 'guide'; geometry: Record<string, unknown>; text: string }[];
  thread: { who: 'engineer' | 'lead'; mark: number; body: string }[];
  /** The numbers the marks and thread quote */
  facts: { fcMinusFeDeltaDb: number; firmwareBMarginDb: number; firmwareBMarginRpm: number };
}

/**
 * The comparison of the two demo run-ups on fc − fe of the housing accelerometer against the project's
 * target. `fingerprints`: each compared file's fingerprint (workers/io/fingerprint.ts), as the project
 * registered it; `target`: the target's points (dB re 1 g against rpm, Z).
 */
export async function demoComparison(demoDir: string, fingerprints: ReadonlyMap<string, string>, target: TargetPoint[]): Promise<DemoComparison> {
  const channel = demoRecordings.find((r) => r.file === RUN_UP_FILE)!.channels[CHANNEL];
  const refRms = 1; // dB re 1 g: a channel in g is referred to one of its own unit, as on the Bench
  const runs: { file: string; frameRpm: Float64Array; durationS: number; report: InverterReport }[] = [];
  for (const file of COMPARED_FILES) {
    const map = await demoChannelMap(demoDir, file, CHANNEL, MAP);
    // as analyseFile does for the CLI: the carrier families by default, the samples for crossings
    const report = analyseInverter({
      power: map.power,
      layout: map.layout,
      window: MAP.window,
      enbwBins: map.enbwBins,
      frameRpm: map.frameRpm,
      orders: [],
      samples: map.samples,
      rpmStep: RPM_STEP,
      expectedPattern: patternOfQuantity(channel.quantity) ?? undefined,
    });
    runs.push({ file, frameRpm: map.frameRpm, durationS: map.samples.length / map.layout.fsHz, report });
  }

  const grid = speedGrid(
    runs.map((r) => speedRange(r.frameRpm, r.frameRpm)),
    RPM_STEP,
  );
  const db = runs.map((r) => {
    const t = r.report.families.find((f) => f.m === FAMILY.m && f.n === FAMILY.n);
    if (!t) throw new Error(`The analysis of ${r.file} has no ${familyLabel(FAMILY.m, FAMILY.n)} track.`);
    return levelsDb(onSpeedGrid(t.rpm, t.rms, grid, RPM_STEP), refRms);
  });
  const limit = (rpm: number) => targetAt(target, rpm);
  const found = runs.flatMap((r, i) => exceedances(grid, db[i], limit).map((e) => ({ ...e, run: r.file })));
  const carriers = runs.map((r) => medianOnSpeedGrid(r.frameRpm, r.report.carrier.hz, grid, RPM_STEP));

  const comparison = comparisonState.parse({
    runs: runs.map((r) => ({ name: r.file, fingerprint: fingerprints.get(r.file) })),
    track: { label: familyLabel(FAMILY.m, FAMILY.n), guide: { kind: 'family', ...FAMILY } },
    unit: `dB re 1 ${channel.unit}`,
    rpm: nullable(grid).map((v) => v ?? 0),
    levels: db.map(nullable),
    target: nullable(Float64Array.from(grid, limit)),
    exceedances: found.map((e) => ({ run: e.run, fromRpm: Math.round(e.fromRpm), toRpm: Math.round(e.toRpm), maxExcessDb: Number(e.maxExcessDb.toFixed(2)), atRpm: Math.round(e.atRpm) })),
    carrierRpm: nullable(grid).map((v) => v ?? 0),
    carrierHz: carriers.map(nullable),
    findings: runs.map((r) => findingsOf(r.report, refRms)),
  });

  // What the marks and the thread say, from the numbers above
  const delta = Array.from(deltaDb(db[1], db[0])).filter(Number.isFinite).sort((a, b) => a - b);
  const medianDelta = delta[delta.length >> 1];
  let margin = Infinity;
  let marginRpm = NaN;
  grid.forEach((rpm, k) => {
    const m = limit(rpm) - db[1][k];
    if (Number.isFinite(m) && m < margin) {
      margin = m;
      marginRpm = rpm;
    }
  });
  const baseline = comparison.exceedances.filter((e) => e.run === RUN_UP_FILE);
  const changed = comparison.exceedances.filter((e) => e.run === FIRMWARE_B_FILE);
  const first = baseline[0];
  const shift = runs[0].report.carrierShifts[0];
  const carrierAt = (rpm: number) => (shift && rpm >= shift.rpm ? shift.toHz : (shift?.fromHz ?? runs[0].report.carrier.hz.find(Number.isFinite) ?? 0));
  const polePairs = runs[0].report.polePairs.value ?? NaN;
  const fe = (rpm: number) => (polePairs * rpm) / 60;

  const marks: DemoComparison['marks'] = [];
  const thread: DemoComparison['thread'] = [];
  if (first) {
    const worst = baseline.reduce((a, b) => (b.maxExcessDb > a.maxExcessDb ? b : a));
    marks.push({
      kind: 'point',
      geometry: { x: first.fromRpm, y: Math.round(carrierAt(first.fromRpm) - fe(first.fromRpm)) },
      text: `Firmware A: fc − fe goes above the target from ${digits(first.fromRpm)} rpm, by up to ${db1(worst.maxExcessDb)} dB at ${digits(worst.atRpm)} rpm.`,
    });
  }
  marks.push({
    kind: 'guide',
    geometry: { guide: { kind: 'family', ...FAMILY } },
    text:
      changed.length === 0
        ? `Firmware B: fc − fe stays under the target over the whole run-up, ${db1(margin)} dB below it at the closest (${digits(marginRpm)} rpm).`
        : `Firmware B: fc − fe still goes above the target from ${digits(changed[0].fromRpm)} rpm.`,
  });
  const last = marks.length - 1;
  thread.push(
    {
      who: 'engineer',
      mark: last,
      body:
        changed.length === 0
          ? `@lead fc − fe now stays under the target over the whole run-up: ${db1(-medianDelta)} dB below firmware A on the median.`
          : `@lead fc − fe is ${db1(-medianDelta)} dB lower with firmware B on the median, but still above the target in places.`,
    },
    {
      who: 'lead',
      mark: last,
      body: first
        ? `Good: firmware A was above it from ${digits(first.fromRpm)} rpm. Firmware B goes to the next test; attach this comparison to the change request.`
        : 'Good. Firmware B goes to the next test; attach this comparison to the change request.',
    },
  );

  const state = viewState.parse({
    stateVersion: 1,
    processing: { channelIndex: CHANNEL, ...MAP, scaling: 'rms', weighting: 'Z', levelScale: 'db', dbReference: refRms, against: 'speed' },
    axes: { swapped: false, x: { kind: 'speed', from: grid[0] - RPM_STEP / 2, to: grid[grid.length - 1] + RPM_STEP / 2, unit: 'rpm' }, y: { kind: 'frequency', from: 0, to: FREQ_TO_HZ, unit: 'Hz' } },
    colourRange: { scale: 'ember', topDb: TOP_DB, rangeDb: RANGE_DB },
    guides: [
      { kind: 'family', m: 1, n: 1, visible: true },
      { kind: 'family', ...FAMILY, visible: true },
    ],
    carrierSchedule: baselineSchedule(runs[0].report, runs[0].durationS),
    polePairs: runs[0].report.polePairs.value,
    polePairsSource: 'inferred',
    selectedTracks: [{ kind: 'family', ...FAMILY }],
    carrierGuides: [{ source: 'detected', centreHz: carriers[0].find(Number.isFinite) ?? 0, per: 'electrical', families: [{ m: 1, n: 1 }, FAMILY], visible: true }],
    speedSource: { kind: 'tacho', channel: demoRecordings.find((r) => r.file === RUN_UP_FILE)!.channels.findIndex((c) => c.quantity === 'tacho'), ppr: DEMO_TACHO_PPR, triggerLevel: null },
    comparison,
  }) as ViewStateV1;

  return { comparison, state, marks, thread, facts: { fcMinusFeDeltaDb: medianDelta, firmwareBMarginDb: margin, firmwareBMarginRpm: marginRpm } };
}

/** The baseline's carrier over the run, split at its shifts (as the Bench saves a view's schedule). */
function baselineSchedule(r: InverterReport, durationS: number) {
  const shifts = r.carrierShifts.filter((s) => s.t > 0 && s.t < durationS);
  if (shifts.length === 0) return [];
  const out: { fromS: number; toS: number; carrierHz: number }[] = [];
  let from = 0;
  for (const s of shifts) {
    out.push({ fromS: from, toS: s.t, carrierHz: Math.round(s.fromHz) });
    from = s.t;
  }
  out.push({ fromS: from, toS: durationS, carrierHz: Math.round(shifts[shifts.length - 1].toHz) });
  return out;
}
