import { Link } from 'react-router-dom';
import { Notice } from '../../../components/ui/notice';
import { Section } from '../../../components/ui/section';
import { linkClass, tableHeadRowClass } from '../../../components/ui/styles';
import { paths } from '../../../config/paths';
import { formatDateTime } from '../../../lib/format';
import { useCampaigns, type CampaignListRow } from '../api/campaigns';
import { CampaignCliHint } from './campaign-cli-hint';

/** done/total with the failed ones named; a campaign that was not told its total shows the count alone. */
export function CampaignProgress({ campaign }: { campaign: Pick<CampaignListRow, 'done' | 'total' | 'failed'> }) {
  const { done, total, failed } = campaign;
  const fraction = total ? Math.min(1, done / total) : null;
  return (
    <div className="flex min-w-40 flex-col gap-1" data-testid="campaign-progress">
      <span className="font-mono text-xs text-mist-100">
        {done}
        {total !== null && ` / ${total}`} done
        {failed > 0 && <span className="text-danger"> · {failed} failed</span>}
      </span>
      {fraction !== null && (
        <div className="h-1.5 w-full rounded bg-ink-800" role="progressbar" aria-label="Files analysed" aria-valuemin={0} aria-valuemax={total ?? 0} aria-valuenow={done}>
          <div className="h-full rounded bg-accent" style={{ width: `${(fraction * 100).toFixed(1)}%` }} />
        </div>
      )}
    </div>
  );
}

/** The project's test campaigns: one preset over many recordings, their results registered by the batch command. */
export function CampaignsSection({ projectId }: { projectId: number }) {
  const { data: campaigns, isPending, error } = useCampaigns(projectId);
  return (
    <Section title="Campaigns">
      <div className="flex flex-col gap-3 text-sm">
        {isPending && <p className="text-mist-500">Loading the campaigns…</p>}
        {error && <Notice tone="error">{error.message}</Notice>}
        {campaigns && campaigns.length === 0 && (
          <>
            <p className="text-mist-500">No campaigns yet.</p>
            <CampaignCliHint projectId={projectId} />
          </>
        )}
        {campaigns && campaigns.length > 0 && (
          <div className="overflow-x-auto">
            <table className="w-full text-left" data-testid="project-campaigns">
              <thead>
                <tr className={tableHeadRowClass}>
                  <th className="py-1.5 pr-3">Campaign</th>
                  <th className="py-1.5 pr-3">Progress</th>
                  <th className="py-1.5 pr-3">Started by</th>
                  <th className="py-1.5 pr-3">Updated</th>
                </tr>
              </thead>
              <tbody>
                {campaigns.map((c) => (
                  <tr key={c.id} className="border-t border-ink-800 align-top" data-testid="project-campaign">
                    <td className="py-2 pr-3">
                      <Link to={paths.campaign(projectId, c.id)} className={linkClass}>
                        {c.name}
                      </Link>
                    </td>
                    <td className="py-2 pr-3">
                      <CampaignProgress campaign={c} />
                    </td>
                    <td className="py-2 pr-3 text-xs text-mist-300">
                      {c.createdBy?.name ?? 'Someone'}
                      <br />
                      <time dateTime={c.createdAt} className="font-mono text-mist-500">
                        {formatDateTime(c.createdAt)}
                      </time>
                    </td>
                    <td className="py-2 pr-3 text-xs">
                      <time dateTime={c.updatedAt} className="font-mono text-mist-500">
                        {formatDateTime(c.updatedAt)}
                      </time>
                    </td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
        )}
        {campaigns && campaigns.length > 0 && (
          <details className="text-xs">
            <summary className="cursor-pointer text-mist-500 hover:text-mist-300">How to run a campaign</summary>
            <div className="pt-2">
              <CampaignCliHint projectId={projectId} />
            </div>
          </details>
        )}
      </div>
    </Section>
  );
}
