/**
 * How the session asks workers/dsp for its findings and its tonality: pure, so a test can put the
 * Bench's numbers beside the batch CLI's for the same recording.
 */
import { carrierTonality, TONE_FAMILIES } from '../../../../workers/dsp/carrier-tonality';
import type { InverterAnalysisInput } from '../../../../workers/dsp/inverter-analysis';
import type { FamilyPattern } from '../../../../workers/dsp/pole-pairs';
import type { StftLayout } from '../../../../workers/dsp/stft';
import type { WindowName } from '../../../../workers/dsp/window';

export interface FindingsOptions {
  window: WindowName;
  enbwBins: number;
  /** Speed per frame, rpm; null without a speed source (the frames' speeds are then unknown) */
  frameRpm: Float64Array | null;
  polePairs: number | null;
  /** Order guides: a family point they cross is flagged, and not taken as its peak */
  orders: number[];
  expectedPattern: FamilyPattern | null;
  soundPressure: boolean;
}

/** The inverter analysis of a map, without its mean squares (they go as the task sends them). */
export function findingsRequest(layout: StftLayout, o: FindingsOptions): Omit<InverterAnalysisInput, 'power'> {
  return {
    layout,
    window: o.window,
    enbwBins: o.enbwBins,
    frameRpm: o.frameRpm ? o.frameRpm.slice() : new Float64Array(layout.frames).fill(NaN),
    ...(o.polePairs ? { polePairs: o.polePairs } : {}),
    orders: o.orders,
    ...(o.expectedPattern ? { expectedPattern: o.expectedPattern } : {}),
    soundPressure: o.soundPressure,
  };
}

export interface TonalityContext {
  power: Float32Array;
  layout: StftLayout;
  enbwBins: number;
  frameRpm: Float64Array | null;
  /** The detected carrier per frame, Hz */
  carrierHz: Float64Array | null;
  polePairs: number | null;
  soundPressure: boolean;
}

/** The carrier tones' tonality at a moment, judged as the batch CLI judges it (`analyze inverter --at`). */
export function tonalityAt(c: TonalityContext, atS: number) {
  const frames = c.layout.frames;
  const ctx = {
    rpm: c.frameRpm ?? new Float64Array(frames).fill(NaN),
    carrierHz: c.carrierHz ?? new Float64Array(frames).fill(NaN),
    polePairs: c.polePairs ?? NaN,
  };
  return carrierTonality(c.power, c.layout, c.enbwBins, ctx, atS, [...TONE_FAMILIES], c.soundPressure);
}
