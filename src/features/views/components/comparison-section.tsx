import type { ComparisonState } from '../../../../server/schemas/views';
import { Section } from '../../../components/ui/section';
import type { AxisSpec } from '../snapshot/axes';
import { TracksChart } from './tracks-chart';

type Series = { name: string; unit: string; points: [number, number | null][] };

const speedAxis = (rpm: number[]): AxisSpec => ({ kind: 'speed', from: Math.min(...rpm), to: Math.max(...rpm), unit: 'rpm' });

function series(name: string, unit: string, rpm: number[], values: (number | null)[]): Series {
  return { name, unit, points: rpm.map((r, k) => [r, values[k] ?? null]) };
}

const columns = [
  ['carrier', 'Carrier'],
  ['shifts', 'Shifts'],
  ['spread', 'Spread'],
  ['poles', 'Pole pairs'],
  ['families', 'Strongest families (peak)'],
] as const;

/**
 * A saved comparison of runs, as the Bench showed it: one guide's level in every run against speed with
 * its target, each run less the baseline, the carriers against speed, the exceedances and the findings.
 */
export function ComparisonSection({ comparison: c }: { comparison: ComparisonState }) {
  const names = c.runs.map((r, i) => (i === 0 ? `${r.name} (baseline)` : r.name));
  const levels = c.levels.map((v, i) => series(names[i], c.unit, c.rpm, v));
  const deltas = c.levels.slice(1).map((v, i) =>
    series(
      `${names[i + 1]} − baseline`,
      'Δ dB',
      c.rpm,
      v.map((x, k) => (x !== null && c.levels[0][k] !== null ? Number((x - c.levels[0][k]!).toFixed(2)) : null)),
    ),
  );
  const carriers = c.carrierHz.map((v, i) => series(names[i], 'Hz', c.carrierRpm, v));
  return (
    <Section title="Comparison">
      <div className="flex flex-col gap-5 text-sm" data-testid="view-comparison">
        <p className="text-xs text-mist-500">
          {c.runs.length} runs; the map above is the baseline’s. {c.track ? `Compared: ${c.track.label}.` : 'No track was compared.'}
        </p>
        {c.track && c.rpm.length > 1 && (
          <>
            <TracksChart
              tracks={c.target ? [...levels, series('target', c.unit, c.rpm, c.target)] : levels}
              xAxis={speedAxis(c.rpm)}
              testId="view-comparison-levels"
              label={`${c.track.label} in every run against speed`}
              dashedLast={c.target !== null}
            />
            <TracksChart tracks={deltas} xAxis={speedAxis(c.rpm)} testId="view-comparison-deltas" label="Each run less the baseline" />
          </>
        )}
        {c.exceedances.length > 0 ? (
          <ul className="flex flex-col gap-1 font-mono text-xs" data-testid="view-comparison-exceedances">
            {c.exceedances.map((e, i) => (
              <li key={i}>
                {e.run}: above the target from {e.fromRpm} to {e.toRpm} rpm, by up to <span className="text-danger">{e.maxExcessDb.toFixed(1)} dB</span> at {e.atRpm} rpm
              </li>
            ))}
          </ul>
        ) : (
          c.target && <p className="text-xs text-mist-500">No run exceeded the target.</p>
        )}
        {c.carrierRpm.length > 1 && <TracksChart tracks={carriers} xAxis={speedAxis(c.carrierRpm)} testId="view-comparison-carriers" label="The carrier of every run against speed" />}
        <div className="overflow-x-auto">
          <table className="w-full text-left text-xs" data-testid="view-comparison-findings">
            <thead>
              <tr className="text-[11px] uppercase tracking-wider text-mist-500">
                <th className="py-1 pr-3 font-medium">Run</th>
                {columns.map(([k, title]) => (
                  <th key={k} className="py-1 pr-3 font-medium">
                    {title}
                  </th>
                ))}
              </tr>
            </thead>
            <tbody className="font-mono">
              {c.findings.map((f, i) => (
                <tr key={i} className="border-t border-ink-800 align-top">
                  <td className="py-1.5 pr-3 text-mist-100">{names[i]}</td>
                  {columns.map(([k]) => (
                    <td key={k} className={`py-1.5 pr-3 ${i > 0 && f[k] !== c.findings[0][k] ? 'text-accent' : 'text-mist-300'}`}>
                      {f[k] || '—'}
                    </td>
                  ))}
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      </div>
    </Section>
  );
}
