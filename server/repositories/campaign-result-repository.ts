import { createHash } from 'node:crypto';
import type { Knex } from 'knex';
import type { CampaignResultSort, CampaignResultSummary, TagValues } from '../schemas/campaigns';
import { parseJson, toIso } from './view-repository';

interface ResultRow {
  id: number;
  file: string;
  ok: number | boolean;
  error: string | null;
  tags: string | TagValues;
  summary: string | CampaignResultSummary | null;
  inverter: string | Record<string, unknown> | null;
  created_at: Date;
}

/** A result as stored: its own tags only (the service adds the campaign's tags for the file). */
export interface StoredResult {
  id: number;
  file: string;
  ok: boolean;
  error: string | null;
  tags: TagValues;
  summary: CampaignResultSummary | null;
  inverter: Record<string, unknown> | null;
  createdAt: string;
}

const fromRow = (r: ResultRow): StoredResult => ({
  id: r.id,
  file: r.file,
  ok: Boolean(r.ok),
  error: r.error,
  tags: parseJson(r.tags),
  summary: r.summary === null ? null : parseJson(r.summary),
  inverter: r.inverter === null ? null : parseJson(r.inverter),
  createdAt: toIso(r.created_at),
});

export interface NewResult {
  file: string;
  ok: boolean;
  error: string | null;
  tags: TagValues;
  summary: CampaignResultSummary | null;
  /** The raw inverter object as JSON text (its size checked by the caller). */
  inverterJson: string | null;
}

export const fileHash = (file: string) => createHash('sha256').update(file, 'utf8').digest('hex');
const isDuplicateKey = (e: unknown) => (e as { code?: string }).code === 'ER_DUP_ENTRY';
/** LIKE pattern for "contains", with the pattern characters of the text escaped. */
const contains = (text: string) => `%${text.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;

const SORT_COLUMNS: Record<string, string> = { file: 'file', createdAt: 'created_at', peakDb: 'peak_db', overallDb: 'overall_db', ok: 'ok' };

export class CampaignResultRepository {
  constructor(private readonly db: Knex) {}

  private async byFile(campaignId: number, file: string): Promise<StoredResult | null> {
    const row = await this.db('campaign_results').where({ campaign_id: campaignId, file_hash: fileHash(file) }).first();
    return row ? fromRow(row) : null;
  }

  /**
   * Stores the file's result unless the campaign has one for the file already; then answers that one.
   * The unique (campaign_id, file_hash) settles two posts that arrive at once.
   */
  async insertOnce(campaignId: number, r: NewResult): Promise<{ result: StoredResult; created: boolean }> {
    const existing = await this.byFile(campaignId, r.file);
    if (existing) return { result: existing, created: false };
    const family = r.summary?.strongestFamilies[0];
    try {
      await this.db('campaign_results').insert({
        campaign_id: campaignId,
        file: r.file,
        file_hash: fileHash(r.file),
        ok: r.ok,
        error: r.error,
        tags: JSON.stringify(r.tags),
        summary: r.summary === null ? null : JSON.stringify(r.summary),
        inverter: r.inverterJson,
        peak_db: family?.peakDb ?? null,
        overall_db: r.summary?.overallDb ?? null,
      });
    } catch (e) {
      if (!isDuplicateKey(e)) throw e;
      return { result: (await this.byFile(campaignId, r.file))!, created: false };
    }
    return { result: (await this.byFile(campaignId, r.file))!, created: true };
  }

  /**
   * One page of the campaign's results whose file name, error or own tag values (JSON_SEARCH looks at
   * values, not keys) contain q, or whose file
   * is one of `taggedFiles` (the files the campaign's tags match), and how many match in all.
   */
  async page(
    campaignId: number,
    opts: { limit: number; offset: number; sort: CampaignResultSort; q: string; taggedFiles?: string[] },
  ): Promise<{ rows: StoredResult[]; total: number }> {
    const where = (qb: Knex.QueryBuilder) => {
      qb.where('campaign_id', campaignId);
      if (opts.q)
        qb.andWhere((w) => {
          w.where('file', 'like', contains(opts.q)).orWhere('error', 'like', contains(opts.q)).orWhereRaw("JSON_SEARCH(LOWER(tags), 'one', ?) IS NOT NULL", [contains(opts.q.toLowerCase())]);
          if (opts.taggedFiles?.length) w.orWhereIn('file', opts.taggedFiles);
        });
    };
    const [{ n }] = await this.db('campaign_results').modify(where).count({ n: '*' });
    const descending = opts.sort.startsWith('-');
    const column = SORT_COLUMNS[descending ? opts.sort.slice(1) : opts.sort];
    const rows = await this.db('campaign_results')
      .modify(where)
      // files without the value (a failed run has no levels) come last either way
      .orderByRaw('?? IS NULL', [column])
      .orderBy(column, descending ? 'desc' : 'asc')
      .orderBy('id', 'asc')
      .limit(opts.limit)
      .offset(opts.offset);
    return { rows: rows.map(fromRow), total: Number(n) };
  }
}
