import type { FindingsRow } from './comparison';

const columns: { key: keyof FindingsRow; title: string }[] = [
  { key: 'carrier', title: 'Carrier' },
  { key: 'shifts', title: 'Shifts' },
  { key: 'spread', title: 'Spread' },
  { key: 'poles', title: 'Pole pairs' },
  { key: 'families', title: `Strongest families (peak)` },
];

/** Each run's findings in a row; what differs from the baseline's is in the accent. */
export function FindingsTable({ runs, rows, referenceLabel }: { runs: { id: string; name: string; baseline: boolean }[]; rows: (FindingsRow | null)[]; referenceLabel: string }) {
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
      <p className="mt-1 text-[11px] text-mist-500">Levels in dB re {referenceLabel}; what differs from the baseline is highlighted.</p>
    </section>
  );
}
