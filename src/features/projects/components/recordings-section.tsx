import { Link } from 'react-router-dom';
import { Notice } from '../../../components/ui/notice';
import { Section } from '../../../components/ui/section';
import { linkClass, tableHeadRowClass } from '../../../components/ui/styles';
import { paths } from '../../../config/paths';
import { formatDateTime, formatHz, formatSeconds } from '../../../lib/format';
import { useProjectRecordings } from '../api/recordings';

export function RecordingsSection({ projectId }: { projectId: number }) {
  const { data: recordings, isPending, error } = useProjectRecordings(projectId);
  return (
    <Section title="Recordings">
      <div className="flex flex-col gap-3">
        {isPending && <p className="text-sm text-mist-500">Loading recordings…</p>}
        {error && <Notice tone="error">{error.message}</Notice>}
        {recordings && recordings.length === 0 && (
          <p className="text-sm text-mist-500">No recordings are registered with this project yet.</p>
        )}
        {recordings && recordings.length > 0 && (
          <div className="overflow-x-auto">
            <table className="w-full border-collapse text-sm" data-testid="project-recordings">
              <thead>
                <tr className={tableHeadRowClass}>
                  <th className="py-2 pr-3 font-medium">Name</th>
                  <th className="py-2 pr-3 font-medium">Format</th>
                  <th className="py-2 pr-3 text-right font-medium">Sample rate</th>
                  <th className="py-2 pr-3 text-right font-medium">Duration</th>
                  <th className="py-2 pr-3 text-right font-medium">Channels</th>
                  <th className="py-2 font-medium">Registered</th>
                </tr>
              </thead>
              <tbody>
                {recordings.map((r) => (
                  <tr key={r.id} className="border-b border-ink-800 align-top">
                    <td className="break-all py-2 pr-3 text-mist-100">{r.name}</td>
                    <td className="py-2 pr-3 font-mono text-mist-300">{r.format.toUpperCase()}</td>
                    <td className="whitespace-nowrap py-2 pr-3 text-right font-mono">{formatHz(r.sampleRateHz)}</td>
                    <td className="whitespace-nowrap py-2 pr-3 text-right font-mono">{formatSeconds(r.durationS)}</td>
                    <td className="py-2 pr-3 text-right font-mono">{r.channels.length}</td>
                    <td className="py-2 text-xs text-mist-300">
                      {r.registeredBy ?? 'Someone'}
                      <br />
                      <time dateTime={r.registeredAt} className="font-mono text-mist-500">
                        {formatDateTime(r.registeredAt)}
                      </time>
                    </td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
        )}
        <p className="text-sm">
          <Link to={`${paths.bench}?project=${projectId}`} className={linkClass}>
            Open the Bench
          </Link>
        </p>
      </div>
    </Section>
  );
}
