import { Notice } from '../../../components/ui/notice';
import { Section } from '../../../components/ui/section';
import { formatDateTime } from '../../../lib/format';
import { useActivity } from '../api/activity';

export function ActivityList({ projectId }: { projectId: number }) {
  const { data: activity, isPending, error } = useActivity(projectId);
  return (
    <Section title="Recent activity">
      {isPending && <p className="text-sm text-mist-500">Loading activity…</p>}
      {error && <Notice tone="error">{error.message}</Notice>}
      {activity && activity.length === 0 && <p className="text-sm text-mist-500">Nothing has happened here yet.</p>}
      {activity && activity.length > 0 && (
        <ol className="flex flex-col divide-y divide-ink-800 text-sm">
          {activity.map((a) => (
            <li key={a.id} className="flex flex-col gap-0.5 py-2">
              <span>
                <span className="font-medium text-mist-100">{a.actor ?? 'Someone'}</span>{' '}
                <span className="text-mist-300">{a.summary}</span>
              </span>
              <time dateTime={a.at} className="font-mono text-xs text-mist-500">
                {formatDateTime(a.at)}
              </time>
            </li>
          ))}
        </ol>
      )}
    </Section>
  );
}
