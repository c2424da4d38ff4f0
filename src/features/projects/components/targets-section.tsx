import { useState } from 'react';
import type { Target } from '../../../../server/schemas/targets';
import { Notice } from '../../../components/ui/notice';
import { Section } from '../../../components/ui/section';
import { tableHeadRowClass } from '../../../components/ui/styles';
import { useDeleteTarget, useProjectTargets } from '../api/targets';
import { TargetImportForm } from './target-import-form';
import { TargetTableForm } from './target-table-form';

const trackName = (track: string) => {
  const [kind, a, b] = track.split(':');
  if (kind === 'order') return `order ${a}`;
  if (kind === 'family') return `family m ${a}, n ${Number(b) > 0 ? '+' : ''}${b}`;
  return 'overall level';
};

const pointsText = (t: Target) => t.points.map(([rpm, db]) => `${rpm} rpm ${db} dB`).join(' · ');

/**
 * The project's targets: a limit curve of a track's level against speed, per weighting, that the
 * Bench's comparison checks runs against. Engineers and leads add them (typed or from CSV) and remove them.
 */
export function TargetsSection({ projectId, mayEdit }: { projectId: number; mayEdit: boolean }) {
  const { data: targets, isPending, error } = useProjectTargets(projectId);
  const remove = useDeleteTarget(projectId);
  const [adding, setAdding] = useState<'none' | 'typed' | 'csv'>('none');
  return (
    <Section title="Targets">
      <div className="flex flex-col gap-3 text-sm">
        <p className="text-xs text-mist-500">
          Limit curves of a track’s level against speed, in dB re the channel’s reference, piecewise linear between their points. The Bench draws them over compared tracks and lists every
          exceedance.
        </p>
        {isPending && <p className="text-mist-500">Loading the targets…</p>}
        {error && <Notice tone="error">{error.message}</Notice>}
        {remove.error && <Notice tone="error">{remove.error.message}</Notice>}
        {targets && targets.length === 0 && <p className="text-mist-500">No targets yet.</p>}
        {targets && targets.length > 0 && (
          <table className="w-full text-left" data-testid="project-targets">
            <thead>
              <tr className={tableHeadRowClass}>
                <th className="py-1.5 pr-3">Track</th>
                <th className="py-1.5 pr-3">Weighting</th>
                <th className="py-1.5 pr-3">Points</th>
                {mayEdit && <th className="py-1.5" />}
              </tr>
            </thead>
            <tbody>
              {targets.map((t) => (
                <tr key={t.id} className="border-t border-ink-800 align-top" data-testid="project-target">
                  <td className="py-1.5 pr-3">
                    <span className="font-mono text-mist-100">{t.track}</span>
                    <span className="block text-xs text-mist-500">{t.label ?? trackName(t.track)}</span>
                  </td>
                  <td className="py-1.5 pr-3 font-mono">{t.weighting}</td>
                  <td className="py-1.5 pr-3 font-mono text-xs text-mist-300">{pointsText(t)}</td>
                  {mayEdit && (
                    <td className="py-1.5 text-right">
                      <button type="button" className="rounded px-2 py-1 text-xs text-mist-500 hover:bg-ink-800 hover:text-danger" aria-label={`Remove the target of ${t.track} (${t.weighting})`} onClick={() => remove.mutate(t.id)}>
                        Remove
                      </button>
                    </td>
                  )}
                </tr>
              ))}
            </tbody>
          </table>
        )}
        {mayEdit && (
          <div className="flex flex-wrap gap-2 border-t border-ink-800 pt-3">
            <button type="button" className="rounded-md px-2.5 py-1 text-xs text-mist-300 ring-1 ring-ink-700 hover:text-mist-100" aria-pressed={adding === 'typed'} onClick={() => setAdding(adding === 'typed' ? 'none' : 'typed')}>
              Type a target
            </button>
            <button type="button" className="rounded-md px-2.5 py-1 text-xs text-mist-300 ring-1 ring-ink-700 hover:text-mist-100" aria-pressed={adding === 'csv'} onClick={() => setAdding(adding === 'csv' ? 'none' : 'csv')}>
              Import CSV
            </button>
          </div>
        )}
        {mayEdit && adding === 'typed' && <TargetTableForm projectId={projectId} onDone={() => setAdding('none')} />}
        {mayEdit && adding === 'csv' && <TargetImportForm projectId={projectId} onDone={() => setAdding('none')} />}
      </div>
    </Section>
  );
}
