import { useMemo } from 'react';
import { Link } from 'react-router-dom';
import { linkClass } from '../../../components/ui/styles';
import { benchFor } from '../../../config/paths';
import { useLibrary } from '../../library/api/library';
import type { ResultRow } from '../api/campaigns';
import { libraryEntryFor } from '../library-match';
import { baseName, carrierScheduleText, familyText, formatDb, shiftsText, spreadText } from '../result-format';

/** The clicked recording's row of the results, and the way to its comparison with the baseline on the Bench when both files are in this browser. */
export function TrendPointCard({ result, level, baseline, projectId }: { result: ResultRow; level: string; baseline: ResultRow | null; projectId: number }) {
  const { data: library } = useLibrary();
  const entry = useMemo(() => libraryEntryFor(library, result.file), [library, result.file]);
  const baselineEntry = useMemo(() => (baseline ? libraryEntryFor(library, baseline.file) : null), [library, baseline]);
  const s = result.summary;
  const tags = Object.entries(result.tags);
  return (
    <div className="flex flex-col gap-2 rounded-md border border-ink-700 p-3 text-xs" data-testid="trend-point">
      <p className="font-mono text-sm text-mist-100">{result.file}</p>
      <p className="text-mist-300">
        {level}
        {tags.length > 0 && <span className="text-mist-500"> · {tags.map(([k, v]) => `${k} ${v}`).join(' · ')}</span>}
      </p>
      {s && (
        <dl className="grid grid-cols-[max-content_1fr] gap-x-3 gap-y-0.5 font-mono">
          <dt className="text-mist-500">carrier</dt>
          <dd>{carrierScheduleText(s)}</dd>
          <dt className="text-mist-500">shifts</dt>
          <dd>{shiftsText(s)}</dd>
          <dt className="text-mist-500">spread</dt>
          <dd>{spreadText(s)}</dd>
          <dt className="text-mist-500">pole pairs</dt>
          <dd>{s.polePairs ?? '—'}</dd>
          <dt className="text-mist-500">strongest</dt>
          <dd>{s.strongestFamilies.map(familyText).join('; ') || '—'}</dd>
          <dt className="text-mist-500">overall</dt>
          <dd>{s.overallDb !== null ? formatDb(s.overallDb) : '—'}</dd>
        </dl>
      )}
      <p data-testid="trend-point-compare">
        {!baseline ? (
          <span className="text-mist-500">Choose a baseline above to compare this run with it.</span>
        ) : baseline.id === result.id ? (
          <span className="text-mist-500">This run is the baseline.</span>
        ) : entry && baselineEntry ? (
          <Link to={benchFor({ fingerprint: baselineEntry.fingerprint, projectId, compare: { fingerprints: [entry.fingerprint], demoFiles: [] } })} className={linkClass}>
            Compare {baseName(result.file)} with the baseline {baseName(baseline.file)} on the Bench
          </Link>
        ) : (
          <span className="text-mist-500">
            To compare {baseName(result.file)} with the baseline {baseName(baseline.file)}, add {[!entry && baseName(result.file), !baselineEntry && baseName(baseline.file)].filter(Boolean).join(' and ')} to
            this browser’s library on the Bench (the raw recordings stay on the machine that analysed them).
          </span>
        )}
      </p>
    </div>
  );
}
