/**
 * The summary a campaign's results table shows, read from `analyze inverter` output of two demo
 * recordings (tests/fixtures/campaigns/*-inverter.json, made as each file's `_madeBy` says). The expected
 * values are those the demo's recordings were synthesised with (seeds/demo-recordings.ts and the demo
 * manifest: carrier 8 kHz switching to 12 kHz at 6000 rpm, 4 pole pairs; a 10 kHz carrier swept ±600 Hz).
 */
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { rmsToDb, summariseInverter, SUMMARY_FAMILIES } from '../../../server/services/campaign-summary';

const fixture = (name: string) => JSON.parse(readFileSync(path.join(__dirname, '../../fixtures/campaigns', name), 'utf8')) as Record<string, unknown>;

describe('summariseInverter', () => {
  it('reads the run-up\'s carrier schedule, its shift near 6000 rpm and its 4 pole pairs', () => {
    const s = summariseInverter(fixture('run-up-inverter.json'))!;
    expect(s.carrierScheduleHz).toEqual([8000, 12000]);
    expect(s.shifts).toHaveLength(1);
    // the shift is seen on the first frame at the new carrier: within 1 % of the synthesised 6000 rpm
    expect(Math.abs(s.shifts[0].rpm - 6000)).toBeLessThan(60);
    expect(s.polePairs).toBe(4);
    expect(s.spread).toEqual({ spread: false, widthHz: null });
    expect(s.overallDb).toBeNull();
  });

  it('keeps the strongest families, loudest first, as levels in dB re 1 unit', () => {
    const inverter = fixture('run-up-inverter.json');
    const s = summariseInverter(inverter)!;
    expect(s.strongestFamilies).toHaveLength(SUMMARY_FAMILIES);
    const ranked = (inverter.strongestFamilies as { m: number; n: number; peakRms: number; peakRpm: number }[]).slice().sort((a, b) => b.peakRms - a.peakRms);
    s.strongestFamilies.forEach((f, i) => {
      expect({ m: f.m, n: f.n }).toEqual({ m: ranked[i].m, n: ranked[i].n });
      // L = 20·log10(x / 1 unit) for an RMS amplitude (IEC 60027-3), kept to 0.01 dB: back as an
      // amplitude it is within 10^(0.005/20) − 1 = 0.058 % of the peak
      expect(Math.abs(10 ** (f.peakDb / 20) / ranked[i].peakRms - 1)).toBeLessThan(0.00058);
    });
  });

  it('sees the coast-down\'s spread-spectrum carrier around 10 kHz', () => {
    const s = summariseInverter(fixture('spread-coast-down-inverter.json'))!;
    expect(s.spread.spread).toBe(true);
    expect(s.spread.widthHz).toBeGreaterThan(0);
    expect(s.shifts).toEqual([]);
    expect(s.carrierScheduleHz).toHaveLength(1);
    // the detected centre of a carrier swept ±600 Hz about 10 kHz
    expect(Math.abs(s.carrierScheduleHz[0] - 10_000)).toBeLessThanOrEqual(600);
  });

  it('levels follow the definition: 1 unit is 0 dB, 0.1 is −20 dB, nothing is no level', () => {
    expect(rmsToDb(1)).toBe(0);
    expect(rmsToDb(0.1)).toBe(-20);
    expect(rmsToDb(2)).toBeCloseTo(6.02, 2); // 20·log10 2 = 6.0206 (the "6 dB per doubling" of acoustics texts)
    expect(rmsToDb(0)).toBeNull();
  });

  it('leaves out what a script sent malformed instead of failing, and takes overallDb where `levels` puts it', () => {
    const s = summariseInverter({ carrier: 'none', carrierShifts: [{ rpm: 'fast' }], polePairs: { value: null }, strongestFamilies: [null, { m: 1, n: 1, peakRms: -1, peakRpm: 100 }], levels: { overallDb: 71.5 } })!;
    expect(s).toEqual({ carrierScheduleHz: [], shifts: [], spread: { spread: false, widthHz: null }, polePairs: null, strongestFamilies: [], overallDb: 71.5 });
    expect(summariseInverter(null)).toBeNull();
  });
});
