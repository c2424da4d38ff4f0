import { familyLabel } from '../../../../workers/dsp/guide-formula';
import type { InverterReport } from '../../../../workers/dsp/inverter-analysis';
import { db1 } from '../../../lib/tone-text';
import { carrierSummary, groupDigits } from '../analysis/findings-text';
import type { LevelReference } from '../map/level-reference';
import type { PublishedRun } from './workspace';

interface Row {
  carrier: string;
  shifts: string;
  spread: string;
  poles: string;
  families: string;
}

function rowOf(r: InverterReport | null, reference: LevelReference): Row | null {
  if (!r) return null;
  const top = r.strongestFamilies.filter((f) => f.peakRms > 0 && Number.isFinite(f.peakRpm)).slice(0, 3);
  return {
    carrier: carrierSummary(r),
    shifts: r.carrierShifts.length ? r.carrierShifts.map((s) => `${groupDigits(s.fromHz)} → ${groupDigits(s.toHz)} Hz at ${groupDigits(s.rpm)} rpm`).join('; ') : 'none',
    spread: r.carrierSpreadHz === null ? 'steady' : `${groupDigits(r.carrierSpreadHz)} Hz`,
    poles: r.polePairs.value === null ? '—' : `${r.polePairs.value}${r.polePairs.ambiguous ? ' (ambiguous)' : ''}`,
    families: top.map((f) => `${familyLabel(f.m, f.n)} ${db1(20 * Math.log10(f.peakRms / reference.refRms))} dB`).join(', '),
  };
}

const columns: { key: keyof Row; title: string }[] = [
  { key: 'carrier', title: 'Carrier' },
  { key: 'shifts', title: 'Shifts' },
  { key: 'spread', title: 'Spread' },
  { key: 'poles', title: 'Pole pairs' },
  { key: 'families', title: `Strongest families (peak)` },
];

/** Each run's findings in a row; what differs from the baseline's is in the accent. */
export function FindingsTable({ runs, reference }: { runs: PublishedRun[]; reference: LevelReference }) {
  const rows = runs.map((r) => rowOf(r.state.report, reference));
  const base = rows[0];
  return (
    <section aria-label="Findings compared" className="overflow-x-auto">
      <table className="w-full border-collapse text-left" data-testid="compare-findings">
        <thead>
          <tr className="text-[11px] uppercase tracking-wider text-mist-500">
            <th className="py-1 pr-3 font-medium">Run</th>
            {columns.map((c) => (
              <th key={c.key} className="py-1 pr-3 font-medium">
                {c.title}
              </th>
            ))}
          </tr>
        </thead>
        <tbody className="font-mono">
          {runs.map((r, i) => (
            <tr key={r.id} className="border-t border-ink-800 align-top" data-testid="compare-findings-row">
              <td className="py-1.5 pr-3 text-mist-100">
                {r.name}
                {r.baseline && <span className="ml-1 font-sans text-mist-500">(baseline)</span>}
              </td>
              {columns.map((c) => {
                const v = rows[i]?.[c.key];
                const changed = i > 0 && v !== undefined && base !== null && v !== base[c.key];
                return (
                  <td key={c.key} className={`py-1.5 pr-3 ${changed ? 'text-accent' : 'text-mist-300'}`} data-changed={changed || undefined}>
                    {v ?? '…'}
                  </td>
                );
              })}
            </tr>
          ))}
        </tbody>
      </table>
      <p className="mt-1 text-[11px] text-mist-500">Levels in dB re {reference.label}; what differs from the baseline is highlighted.</p>
    </section>
  );
}
