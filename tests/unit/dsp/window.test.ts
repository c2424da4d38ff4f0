import { describe, expect, it } from 'vitest';
import { makeWindow, windowNames } from '../../../workers/dsp/window';

// Coherent gain and equivalent noise bandwidth (bins):
// F. J. Harris, Proc. IEEE 66(1) (1978), Table 1 (two decimals) for rect, Hann, Hamming and the 4-term
// −92 dB Blackman-Harris; flat-top from scipy.signal.windows.flattop (D'Antona & Ferrero 2006), whose
// values (and four-decimal ones for the others) come from scipy — references.md §3 [computed].
const TABLE: Record<string, { cg: number; enbw: number; cgTol: number; enbwTol: number }> = {
  rect: { cg: 1.0, enbw: 1.0, cgTol: 1e-9, enbwTol: 1e-9 },
  hann: { cg: 0.5, enbw: 1.5, cgTol: 1e-6, enbwTol: 1e-6 },
  hamming: { cg: 0.54, enbw: 1.3628, cgTol: 1e-6, enbwTol: 1e-4 },
  'blackman-harris': { cg: 0.35875, enbw: 2.0044, cgTol: 1e-6, enbwTol: 1e-4 },
  flattop: { cg: 0.21558, enbw: 3.7702, cgTol: 1e-5, enbwTol: 1e-4 },
};

describe('windows', () => {
  it.each(windowNames)('%s: coherent gain and noise bandwidth as tabulated', (name) => {
    const w = makeWindow(name, 4096);
    expect(Math.abs(w.coherentGain - TABLE[name].cg)).toBeLessThan(TABLE[name].cgTol);
    expect(Math.abs(w.enbwBins - TABLE[name].enbw)).toBeLessThan(TABLE[name].enbwTol);
  });

  it('Harris 1978 Table 1 to its printed two decimals', () => {
    expect(makeWindow('hamming', 4096).enbwBins.toFixed(2)).toBe('1.36');
    expect(makeWindow('blackman-harris', 4096).enbwBins.toFixed(2)).toBe('2.00');
    expect(makeWindow('blackman-harris', 4096).coherentGain.toFixed(2)).toBe('0.36');
  });

  it('is periodic: w[0] of Hann is 0 and w[N/2] is 1 (DFT-even form, Harris 1978 §III)', () => {
    const w = makeWindow('hann', 1024).w;
    expect(w[0]).toBe(0);
    expect(w[512]).toBe(1);
    expect(w[1]).toBeCloseTo(w[1023], 7);
  });
});
