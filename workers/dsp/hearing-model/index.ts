/** The hearing model of ECMA-418-2: its public entry, tonality.ts (the other modules are its steps). */
export { hearingModelTonality, type HearingModelTonality } from './tonality';
