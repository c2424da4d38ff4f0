/** Loudness of ISO 532-1:2017 (Zwicker): stationary (clause 5) and time-varying (clause 6). */
export { loudnessLevelPhon, stationaryLoudness, type SoundField, type StationaryLoudness } from './stationary';
export { timeVaryingLoudness, type TimeVaryingLoudness } from './time-varying';
