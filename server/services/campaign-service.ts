import type { Knex } from 'knex';
import { NotFoundError, PayloadTooLargeError } from '../errors';
import type { Caller } from '../middleware/bearer';
import { ActivityRepository } from '../repositories/activity-repository';
import { CampaignRepository } from '../repositories/campaign-repository';
import { CampaignResultRepository, type StoredResult } from '../repositories/campaign-result-repository';
import type { ProjectRole } from '../schemas/projects';
import {
  CAMPAIGN_INVERTER_MAX_BYTES,
  type Campaign,
  type CampaignListItem,
  type CampaignResult,
  type CampaignResultPage,
  type CreateCampaignBody,
  type ListCampaignResultsQuery,
  type PostCampaignResultBody,
  type UpdateCampaignBody,
} from '../schemas/campaigns';
import { summariseInverter } from './campaign-summary';
import { ProjectPolicy } from './project-policy';

const NO_CAMPAIGN = 'Campaign not found.';

const plural = (n: number, one: string) => `${n} ${one}${n === 1 ? '' : 's'}`;

/** A stored result as the API shows it: the campaign's tags for its file, with the result's own on top. */
const withCampaignTags = (campaign: Campaign, r: StoredResult): CampaignResult => ({ ...r, tags: { ...campaign.tags[r.file], ...r.tags } });

/**
 * Test campaigns of a project and their per-file results. Members read them; engineers and leads start
 * them, change them and post results; an API token's role caps what its request may do; an archived
 * project's campaigns are read-only (409).
 */
export class CampaignService {
  private readonly campaigns: CampaignRepository;
  private readonly results: CampaignResultRepository;
  private readonly activity: ActivityRepository;
  private readonly policy: ProjectPolicy;

  constructor(private readonly db: Knex) {
    this.campaigns = new CampaignRepository(db);
    this.results = new CampaignResultRepository(db);
    this.activity = new ActivityRepository(db);
    this.policy = new ProjectPolicy(db);
  }

  private async open(caller: Caller, projectId: number, campaignId: number, min: ProjectRole, write: boolean): Promise<Campaign> {
    if (write) await this.policy.requireWritable(projectId, caller.user.id, min, caller.cap);
    else await this.policy.require(projectId, caller.user.id, min, caller.cap);
    const campaign = await this.campaigns.get(projectId, campaignId);
    if (!campaign) throw new NotFoundError(NO_CAMPAIGN);
    return campaign;
  }

  async list(caller: Caller, projectId: number): Promise<CampaignListItem[]> {
    await this.policy.require(projectId, caller.user.id, 'viewer', caller.cap);
    return this.campaigns.list(projectId);
  }

  get(caller: Caller, projectId: number, campaignId: number): Promise<Campaign> {
    return this.open(caller, projectId, campaignId, 'viewer', false);
  }

  async create(caller: Caller, projectId: number, body: CreateCampaignBody): Promise<Campaign> {
    await this.policy.requireWritable(projectId, caller.user.id, 'engineer', caller.cap);
    const id = await this.db.transaction(async (trx) => {
      const campaignId = await this.campaigns.insert(projectId, body, caller.user.id, trx);
      const files = body.total === null ? '' : ` over ${plural(body.total, 'file')}`;
      await this.activity.add(
        { projectId, actorId: caller.user.id, verb: 'started', objectType: 'campaign', objectId: campaignId, summary: `started the campaign "${body.name}"${files}` },
        trx,
      );
      return campaignId;
    });
    return (await this.campaigns.get(projectId, id))!;
  }

  async update(caller: Caller, projectId: number, campaignId: number, body: UpdateCampaignBody): Promise<Campaign> {
    await this.open(caller, projectId, campaignId, 'engineer', true);
    await this.campaigns.update(campaignId, body);
    return (await this.campaigns.get(projectId, campaignId))!;
  }

  /**
   * Stores one file's result, once: a second post for the file stores nothing and answers the first
   * (`created` false). The raw inverter object is kept up to CAMPAIGN_INVERTER_MAX_BYTES (else 413).
   */
  async postResult(caller: Caller, projectId: number, campaignId: number, body: PostCampaignResultBody): Promise<{ result: CampaignResult; created: boolean }> {
    const campaign = await this.open(caller, projectId, campaignId, 'engineer', true);
    const inverterJson = body.inverter === null ? null : JSON.stringify(body.inverter);
    const bytes = inverterJson === null ? 0 : Buffer.byteLength(inverterJson, 'utf8');
    if (bytes > CAMPAIGN_INVERTER_MAX_BYTES) {
      throw new PayloadTooLargeError(
        `The inverter object of ${body.file} is ${Math.ceil(bytes / 1024)} kB; a result keeps at most ${CAMPAIGN_INVERTER_MAX_BYTES / 1024} kB (leave out the per-frame tracks, or use a larger --block).`,
      );
    }
    const { result, created } = await this.results.insertOnce(campaignId, {
      file: body.file,
      ok: body.ok,
      error: body.error,
      tags: body.tags,
      summary: body.ok ? summariseInverter(body.inverter) : null,
      inverterJson,
    });
    if (created) await this.campaigns.touch(campaignId);
    return { result: withCampaignTags(campaign, result), created };
  }

  async listResults(caller: Caller, projectId: number, campaignId: number, query: ListCampaignResultsQuery): Promise<CampaignResultPage> {
    const campaign = await this.open(caller, projectId, campaignId, 'viewer', false);
    // the campaign's own tags (from tags.csv) are searched here: the files whose tag values contain q
    const q = query.q.toLowerCase();
    const taggedFiles = q ? Object.entries(campaign.tags).flatMap(([file, tags]) => (Object.values(tags).some((v) => String(v).toLowerCase().includes(q)) ? [file] : [])) : [];
    const { rows, total } = await this.results.page(campaignId, { ...query, taggedFiles: taggedFiles.slice(0, 5000) });
    return { results: rows.map((r) => withCampaignTags(campaign, r)), total };
  }
}
