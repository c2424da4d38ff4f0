import { Link, useParams } from 'react-router-dom';
import { Notice } from '../../components/ui/notice';
import { Section } from '../../components/ui/section';
import { linkClass } from '../../components/ui/styles';
import { paths } from '../../config/paths';
import { useCampaign } from '../../features/campaigns/api/campaigns';
import { CampaignCliHint } from '../../features/campaigns/components/campaign-cli-hint';
import { CampaignTrends } from '../../features/campaigns/components/campaign-trends';
import { CampaignProgress } from '../../features/campaigns/components/campaigns-section';
import { ResultsTable } from '../../features/campaigns/components/results-table';
import { useProject } from '../../features/projects/api/projects';
import { ApiError } from '../../lib/api-client';
import { formatDateTime } from '../../lib/format';

const wholeId = (raw: string | undefined) => (raw && /^[1-9]\d*$/.test(raw) ? Number(raw) : null);

/** One test campaign: its preset and progress, the results table, and Trends. */
export function CampaignPage() {
  const params = useParams();
  const projectId = wholeId(params.projectId);
  const campaignId = wholeId(params.campaignId);
  if (projectId === null || campaignId === null) return <CampaignNotFound projectId={projectId} />;
  return <Campaign projectId={projectId} campaignId={campaignId} />;
}

function Campaign({ projectId, campaignId }: { projectId: number; campaignId: number }) {
  const { data: campaign, isPending, error } = useCampaign(projectId, campaignId);
  const { data: project } = useProject(projectId);
  if (isPending) return <p className="px-6 py-8 text-sm text-mist-500">Loading the campaign…</p>;
  if (error instanceof ApiError && error.status === 404) return <CampaignNotFound projectId={projectId} />;
  if (error) {
    return (
      <div className="mx-auto max-w-6xl px-6 py-8">
        <Notice tone="error">{error.message}</Notice>
      </div>
    );
  }
  const tagNames = [...new Set(Object.values(campaign.tags).flatMap((t) => Object.keys(t)))];
  return (
    <div className="mx-auto flex max-w-7xl flex-col gap-6 px-6 py-8">
      <header className="flex flex-wrap items-end justify-between gap-4">
        <div>
          <p className="text-xs text-mist-500">
            <Link to={paths.project(projectId)} className={linkClass}>
              {project?.name ?? 'Project'}
            </Link>{' '}
            · Campaign
          </p>
          <h1 className="text-xl font-semibold">{campaign.name}</h1>
          <p className="text-xs text-mist-500">
            Started by {campaign.createdBy?.name ?? 'someone'} on <time dateTime={campaign.createdAt}>{formatDateTime(campaign.createdAt)}</time>
          </p>
        </div>
        <CampaignProgress campaign={campaign} />
      </header>
      <Section title="Preset">
        <pre className="overflow-x-auto rounded-md bg-ink-950 px-3 py-2 font-mono text-xs text-mist-100" data-testid="campaign-preset">
          {JSON.stringify(campaign.preset, null, 2)}
        </pre>
      </Section>
      {campaign.done === 0 ? (
        <Section title="Results">
          <p className="mb-3 text-sm text-mist-500">No results yet. They appear here as the command finishes each file.</p>
          <CampaignCliHint projectId={projectId} />
        </Section>
      ) : (
        <>
          <Section title="Results">
            <ResultsTable projectId={projectId} campaignId={campaignId} tagNames={tagNames} />
          </Section>
          <Section title="Trends">
            <CampaignTrends projectId={projectId} campaignId={campaignId} done={campaign.done} />
          </Section>
        </>
      )}
    </div>
  );
}

function CampaignNotFound({ projectId }: { projectId: number | null }) {
  return (
    <div className="mx-auto max-w-xl px-6 py-16 text-center">
      <h1 className="mb-2 text-xl font-semibold">Campaign not found</h1>
      <p className="mb-6 text-sm text-mist-500">It does not exist, or you are not a member of its project.</p>
      <Link to={projectId ? paths.project(projectId) : paths.projects} className={linkClass}>
        {projectId ? 'Back to the project' : 'Back to your projects'}
      </Link>
    </div>
  );
}
