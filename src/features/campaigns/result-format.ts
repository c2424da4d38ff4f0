import type { ResultSummary } from './api/campaigns';
import { familyKey, trendKeyLabel } from './trends';

const plain = new Intl.NumberFormat('en-GB', { maximumFractionDigits: 1, useGrouping: false });
const fixed1 = new Intl.NumberFormat('en-GB', { minimumFractionDigits: 1, maximumFractionDigits: 1, useGrouping: false });

export const formatDb = (db: number) => `${fixed1.format(db)} dB`;
export const formatRpm = (rpm: number) => `${plain.format(rpm)} rpm`;

/** "8000 → 10000 Hz" */
export const carrierScheduleText = (s: ResultSummary) => (s.carrierScheduleHz.length ? `${s.carrierScheduleHz.map((hz) => plain.format(hz)).join(' → ')} Hz` : '—');

/** "2 (at 3000, 5200 rpm)" */
export const shiftsText = (s: ResultSummary) => (s.shifts.length ? `${s.shifts.length} (at ${s.shifts.map((x) => plain.format(x.rpm)).join(', ')} rpm)` : 'none');

export const spreadText = (s: ResultSummary) => (s.spread.spread ? (s.spread.widthHz !== null ? `${plain.format(s.spread.widthHz)} Hz wide` : 'spread') : 'no');

export const familyText = (f: ResultSummary['strongestFamilies'][number]) => `${trendKeyLabel(familyKey(f.m, f.n))}: ${formatDb(f.peakDb)} at ${formatRpm(f.peakRpm)}`;

/** The file's own name, without the folders of its path in the campaign. */
export const baseName = (file: string) => file.split(/[\\/]/).pop() ?? file;
