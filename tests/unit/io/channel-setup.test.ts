import { describe, expect, it } from 'vitest';
import { calibrationProblem, defaultSetup, guessQuantity, unitsPerFileUnit } from '../../../workers/io/channel-setup';

describe('channel calibration', () => {
  it('turns a sensitivity and an input range into units per full scale', () => {
    // A 100 mV/g accelerometer on a ±10 V input: full scale (1.0) is 10 V = 100 g (transducer chain, common practice).
    expect(unitsPerFileUnit({ kind: 'sensitivity', sensitivityMvPerUnit: 100, inputRangeV: 10 })).toBeCloseTo(100, 12);
    // A 50 mV/Pa microphone on a ±1 V input: full scale is 20 Pa.
    expect(unitsPerFileUnit({ kind: 'sensitivity', sensitivityMvPerUnit: 50, inputRangeV: 1 })).toBeCloseTo(20, 12);
    expect(unitsPerFileUnit({ kind: 'scale', factor: 3.2 })).toBe(3.2);
  });

  it('names what is wrong with a calibration', () => {
    expect(calibrationProblem({ kind: 'scale', factor: 0 })).toMatch(/other than 0/);
    expect(calibrationProblem({ kind: 'sensitivity', sensitivityMvPerUnit: 0, inputRangeV: 10 })).toMatch(/sensitivity/);
    expect(calibrationProblem({ kind: 'sensitivity', sensitivityMvPerUnit: 10, inputRangeV: -1 })).toMatch(/input range/);
    expect(calibrationProblem({ kind: 'sensitivity', sensitivityMvPerUnit: 10, inputRangeV: 5 })).toBeNull();
  });

  it('guesses the quantity from the unit first, then the name', () => {
    expect(guessQuantity('ch1', 'Pa')).toBe('sound-pressure');
    expect(guessQuantity('acc housing', null)).toBe('acceleration');
    expect(guessQuantity('Tacho 60 ppr', null)).toBe('tacho');
    expect(guessQuantity('motor speed', 'rpm')).toBe('speed');
    expect(guessQuantity('x', null)).toBe('other');
    expect(defaultSetup([{ index: 0, name: 'mic', unit: null }])[0]).toEqual({
      index: 0,
      name: 'mic',
      quantity: 'sound-pressure',
      unit: 'Pa',
      calibration: { kind: 'scale', factor: 1 },
    });
  });
});
