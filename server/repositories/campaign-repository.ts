import type { Knex } from 'knex';
import type { Campaign, CampaignListItem, TagValues } from '../schemas/campaigns';
import { parseJson, toIso } from './view-repository';

interface CampaignRow {
  id: number;
  project_id: number;
  name: string;
  preset: string | Record<string, unknown>;
  total: number | null;
  done: number | string;
  failed: number | string;
  tags?: string | Record<string, TagValues>;
  created_by: number | null;
  created_by_name: string | null;
  created_at: Date;
  updated_at: Date;
}

const listItem = (r: CampaignRow): CampaignListItem => ({
  id: r.id,
  projectId: r.project_id,
  name: r.name,
  preset: parseJson(r.preset),
  total: r.total,
  done: Number(r.done),
  failed: Number(r.failed),
  createdBy: r.created_by ? { id: r.created_by, name: r.created_by_name ?? '' } : null,
  createdAt: toIso(r.created_at),
  updatedAt: toIso(r.updated_at),
});

export interface NewCampaign {
  name: string;
  preset: Record<string, unknown>;
  total: number | null;
  tags: Record<string, TagValues>;
}

export class CampaignRepository {
  constructor(private readonly db: Knex) {}

  /** Campaigns with their counts of results (all, failed), read by subqueries on (campaign_id, ok). */
  private select(withTags: boolean) {
    const db = this.db;
    return db('campaigns as c')
      .leftJoin('users as u', 'u.id', 'c.created_by')
      .select(
        'c.id',
        'c.project_id',
        'c.name',
        'c.preset',
        'c.total',
        ...(withTags ? ['c.tags'] : []),
        'c.created_by',
        'u.name as created_by_name',
        'c.created_at',
        'c.updated_at',
        db.raw('(SELECT COUNT(*) FROM campaign_results r WHERE r.campaign_id = c.id) AS done'),
        db.raw('(SELECT COUNT(*) FROM campaign_results r WHERE r.campaign_id = c.id AND r.ok = 0) AS failed'),
      );
  }

  /** The campaign if it belongs to the project. */
  async get(projectId: number, id: number): Promise<Campaign | null> {
    const row: CampaignRow | undefined = await this.select(true).where({ 'c.id': id, 'c.project_id': projectId }).first();
    return row ? { ...listItem(row), tags: parseJson(row.tags ?? '{}') } : null;
  }

  /** The project's campaigns, newest first. */
  async list(projectId: number): Promise<CampaignListItem[]> {
    const rows: CampaignRow[] = await this.select(false)
      .where('c.project_id', projectId)
      .orderBy([{ column: 'c.created_at', order: 'desc' }, { column: 'c.id', order: 'desc' }]);
    return rows.map(listItem);
  }

  async insert(projectId: number, c: NewCampaign, createdBy: number, db: Knex = this.db): Promise<number> {
    const [id] = await db('campaigns').insert({
      project_id: projectId,
      name: c.name,
      preset: JSON.stringify(c.preset),
      total: c.total,
      tags: JSON.stringify(c.tags),
      created_by: createdBy,
    });
    return id;
  }

  async update(id: number, changes: Partial<Omit<NewCampaign, 'preset'>>): Promise<void> {
    const row: Record<string, unknown> = { updated_at: this.db.fn.now() };
    if (changes.name !== undefined) row.name = changes.name;
    if (changes.total !== undefined) row.total = changes.total;
    if (changes.tags !== undefined) row.tags = JSON.stringify(changes.tags);
    await this.db('campaigns').where({ id }).update(row);
  }

  /** A result came in: the campaign's list order and "updated" follow its latest activity. */
  async touch(id: number): Promise<void> {
    await this.db('campaigns').where({ id }).update({ updated_at: this.db.fn.now() });
  }
}
