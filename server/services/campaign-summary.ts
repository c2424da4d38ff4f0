/**
 * What a campaign's results table shows of one file, read from the raw object `analyze inverter` prints
 * (README "Batch mode"): the carrier schedule and its shifts, spread, pole pairs, the strongest families
 * and the overall level. The object comes from a script, so every field is read defensively: what is
 * missing or malformed is left out rather than refused.
 */
import type { CampaignResultSummary } from '../schemas/campaigns';

/** How many of the strongest families the summary keeps. */
export const SUMMARY_FAMILIES = 3;

type Loose = Record<string, unknown>;

const isObject = (v: unknown): v is Loose => typeof v === 'object' && v !== null && !Array.isArray(v);
const finite = (v: unknown): number | null => (typeof v === 'number' && Number.isFinite(v) ? v : null);
const round = (x: number, digits: number) => Number(x.toFixed(digits));

/**
 * Level of an RMS amplitude in dB re 1 unit: L = 20·log10(x / x0) for a root-power quantity
 * (IEC 60027-3 / ISO 80000-3 definition of the level of a field quantity). Null when x ≤ 0.
 */
export function rmsToDb(rms: number): number | null {
  return rms > 0 ? round(20 * Math.log10(rms), 2) : null;
}

function shiftsOf(inv: Loose): CampaignResultSummary['shifts'] {
  if (!Array.isArray(inv.carrierShifts)) return [];
  return inv.carrierShifts.flatMap((s) => {
    if (!isObject(s)) return [];
    const rpm = finite(s.rpm);
    const fromHz = finite(s.fromHz);
    const toHz = finite(s.toHz);
    return rpm !== null && fromHz !== null && toHz !== null ? [{ rpm: round(rpm, 1), fromHz, toHz }] : [];
  });
}

/** The median of the carrier track's known values: the carrier of a run that never shifts. */
function steadyCarrierHz(inv: Loose): number | null {
  const hz = isObject(inv.carrier) && Array.isArray(inv.carrier.hz) ? inv.carrier.hz.map(finite).filter((v): v is number => v !== null && v > 0) : [];
  if (!hz.length) return null;
  hz.sort((a, b) => a - b);
  return round(hz[hz.length >> 1], 1);
}

function carrierSchedule(inv: Loose, shifts: CampaignResultSummary['shifts']): number[] {
  if (shifts.length) return [shifts[0].fromHz, ...shifts.map((s) => s.toHz)];
  const steady = steadyCarrierHz(inv);
  return steady === null ? [] : [steady];
}

function strongest(inv: Loose): CampaignResultSummary['strongestFamilies'] {
  if (!Array.isArray(inv.strongestFamilies)) return [];
  const families = inv.strongestFamilies.flatMap((f) => {
    if (!isObject(f)) return [];
    const m = finite(f.m);
    const n = finite(f.n);
    const peakRms = finite(f.peakRms);
    const peakRpm = finite(f.peakRpm);
    const peakDb = peakRms === null ? null : rmsToDb(peakRms);
    return m !== null && n !== null && peakDb !== null && peakRpm !== null ? [{ m, n, peakDb, peakRpm: round(peakRpm, 1) }] : [];
  });
  return families.sort((a, b) => b.peakDb - a.peakDb).slice(0, SUMMARY_FAMILIES);
}

/** `overallDb` at the top (the inverter report gives it: the RMS over the run in dB re 1 unit) or under `levels`. */
function overallDb(inv: Loose): number | null {
  const direct = finite(inv.overallDb);
  if (direct !== null) return direct;
  return isObject(inv.levels) ? finite(inv.levels.overallDb) : null;
}

export function summariseInverter(inverter: Loose | null): CampaignResultSummary | null {
  if (!inverter) return null;
  const shifts = shiftsOf(inverter);
  const spreadHz = finite(inverter.carrierSpreadHz);
  const polePairs = isObject(inverter.polePairs) ? finite(inverter.polePairs.value) : finite(inverter.polePairs);
  return {
    carrierScheduleHz: carrierSchedule(inverter, shifts),
    shifts,
    spread: { spread: spreadHz !== null && spreadHz > 0, widthHz: spreadHz !== null && spreadHz > 0 ? spreadHz : null },
    polePairs,
    strongestFamilies: strongest(inverter),
    overallDb: overallDb(inverter),
  };
}
