import type { InverterReport } from '../../../../workers/dsp/inverter-analysis';

/** "10 000" with a narrow no-break space between thousands. */
export const groupDigits = (v: number, decimals = 0) => {
  const [i, d] = Math.abs(v).toFixed(decimals).split('.');
  return `${v < 0 ? '−' : ''}${i.replace(/\B(?=(\d{3})+(?!\d))/g, '\u202f')}${d ? `.${d}` : ''}`;
};


/** The carrier's levels over the run: before and after each shift, else the median found. */
export function carrierLevels(r: InverterReport): number[] {
  if (r.carrierShifts.length) return [r.carrierShifts[0].fromHz, ...r.carrierShifts.map((s) => s.toHz)];
  const found = r.carrier.hz.filter((h) => Number.isFinite(h)).sort((a, b) => a - b);
  return found.length ? [found[found.length >> 1]] : [];
}

/** "Carrier 8 000 Hz, then 12 000 Hz" */
export function carrierSummary(r: InverterReport): string {
  const levels = carrierLevels(r);
  if (!levels.length) return 'No carrier found';
  return `Carrier ${levels.map((h) => `${groupDigits(h)} Hz`).join(', then ')}`;
}

