/**
 * The Bench's tracks (guideTracks, run in its worker) where two shown guides cross: with the channel's
 * samples, each tracked line's level there comes from the coupled Vold–Kalman filter (Vold & Leuridan,
 * SAE 931288, 1993) and reads its own component; without them the band sum holds both and is only
 * flagged. Known by construction: an order and a carrier family of constant, different amplitudes whose
 * frequencies cross on a run-up (levels invented for the test; a pure tone of amplitude A reads A/√2 RMS).
 */
import { describe, expect, it } from 'vitest';
import { guideTracks, type TrackedLine } from '../../../workers/dsp/guide-tracks';
import { A_FAMILY as aFam, crossingRunUp, FC, P } from '../../support/crossing-run-up';

const db = (x: number) => 20 * Math.log10(x);

describe('the Bench tracks where guides cross', async () => {
  // order 48 meets fc − fe (3000 − 4·rpm/60 Hz) at about 3460 rpm
  const { x, layout, win, power, frameRpm } = await crossingRunUp();
  const carrierHz = new Float64Array(layout.frames).fill(FC);
  const lines: TrackedLine[] = [
    { id: 'k48', guide: { kind: 'order', order: 48 }, ctx: { rpm: frameRpm } },
    { id: 'fc-fe', guide: { kind: 'family', m: 1, n: -1, per: 'electrical' }, ctx: { rpm: frameRpm, carrierHz, polePairs: P } },
  ];
  const run = (samples?: Float32Array) =>
    guideTracks({ power, layout, lines: [lines[1]], shown: lines, window: 'hann', enbwBins: win.enbwBins, against: 'time', frameRpm, rpmStep: 50, weighting: 'Z', refRms: 1, samples });

  it('with the samples, reads the family alone at the crossing (within 1 dB) and says which points the filter served', () => {
    const [fam] = run(x);
    const crossed = [...fam.crossing.keys()].filter((f) => fam.crossing[f] === 1 && Number.isFinite(fam.db[f]));
    expect(crossed.length).toBeGreaterThan(0);
    for (const f of crossed) {
      expect(fam.filtered[f]).toBe(1);
      expect(Math.abs(fam.db[f] - db(aFam / Math.SQRT2))).toBeLessThan(1);
    }
    expect([...fam.filtered.keys()].filter((f) => fam.filtered[f] === 1 && fam.crossing[f] === 0)).toEqual([]);
  });

  it('without them, the crossing points stay band sums: flagged, not filtered, several dB high', () => {
    const [fam] = run();
    expect(fam.filtered.every((v) => v === 0)).toBe(true);
    const crossed = [...fam.crossing.keys()].filter((f) => fam.crossing[f] === 1 && Number.isFinite(fam.db[f]));
    expect(Math.max(...crossed.map((f) => fam.db[f] - db(aFam / Math.SQRT2)))).toBeGreaterThan(3);
  });
});
