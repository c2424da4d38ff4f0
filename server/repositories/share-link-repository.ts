import type { Knex } from 'knex';
import type { ShareLinkSummary } from '../schemas/views';
import { toIso } from './view-repository';

export interface ShareLinkRecord {
  id: number;
  viewId: number;
  projectId: number;
  projectName: string;
  mayReply: boolean;
  expiresAt: Date | null;
  revokedAt: Date | null;
}

const statusOf = (revokedAt: Date | null, expiresAt: Date | null, now: Date): ShareLinkSummary['status'] =>
  revokedAt ? 'revoked' : expiresAt && expiresAt <= now ? 'expired' : 'active';

/** Share links. The token itself is never stored or returned here: only its SHA-256. */
export class ShareLinkRepository {
  constructor(private readonly db: Knex) {}

  async create(
    l: { viewId: number; tokenHash: string; mayReply: boolean; expiresAt: Date | null; createdBy: number },
    db: Knex = this.db,
  ): Promise<number> {
    const [id] = await db('share_links').insert({
      view_id: l.viewId,
      token_hash: l.tokenHash,
      may_reply: l.mayReply,
      expires_at: l.expiresAt,
      created_by: l.createdBy,
    });
    return id;
  }

  private summaries(now: Date) {
    return {
      query: this.db('share_links as l')
        .leftJoin('users as u', 'u.id', 'l.created_by')
        .select('l.id', 'l.view_id', 'l.may_reply', 'l.expires_at', 'l.revoked_at', 'u.name as created_by_name', 'l.created_at'),
      map: (r: {
        id: number;
        view_id: number;
        may_reply: number | boolean;
        expires_at: Date | null;
        revoked_at: Date | null;
        created_by_name: string | null;
        created_at: Date;
      }): ShareLinkSummary => {
        const expiresAt = r.expires_at ? new Date(r.expires_at) : null;
        const revokedAt = r.revoked_at ? new Date(r.revoked_at) : null;
        return {
          id: r.id,
          viewId: r.view_id,
          mayReply: Boolean(r.may_reply),
          expiresAt: expiresAt ? expiresAt.toISOString() : null,
          revokedAt: revokedAt ? revokedAt.toISOString() : null,
          status: statusOf(revokedAt, expiresAt, now),
          createdBy: r.created_by_name ?? null,
          createdAt: toIso(r.created_at),
        };
      },
    };
  }

  async list(viewId: number, now: Date): Promise<ShareLinkSummary[]> {
    const { query, map } = this.summaries(now);
    return (await query.where('l.view_id', viewId).orderBy('l.id', 'desc')).map(map);
  }

  async summary(id: number, now: Date): Promise<ShareLinkSummary | null> {
    const { query, map } = this.summaries(now);
    const r = await query.where('l.id', id).first();
    return r ? map(r) : null;
  }

  private async record(where: Record<string, unknown>): Promise<ShareLinkRecord | null> {
    const r = await this.db('share_links as l')
      .join('views as v', 'v.id', 'l.view_id')
      .join('projects as p', 'p.id', 'v.project_id')
      .where(where)
      .first('l.id', 'l.view_id', 'v.project_id', 'p.name as project_name', 'l.may_reply', 'l.expires_at', 'l.revoked_at');
    return r
      ? {
          id: r.id,
          viewId: r.view_id,
          projectId: r.project_id,
          projectName: r.project_name,
          mayReply: Boolean(r.may_reply),
          expiresAt: r.expires_at ? new Date(r.expires_at) : null,
          revokedAt: r.revoked_at ? new Date(r.revoked_at) : null,
        }
      : null;
  }

  findByTokenHash(tokenHash: string): Promise<ShareLinkRecord | null> {
    return this.record({ 'l.token_hash': tokenHash });
  }

  findById(id: number): Promise<ShareLinkRecord | null> {
    return this.record({ 'l.id': id });
  }

  /** Revokes once; a second revocation leaves the first time in place. */
  async revoke(id: number, db: Knex = this.db): Promise<void> {
    await db('share_links').where({ id }).whereNull('revoked_at').update({ revoked_at: db.fn.now() });
  }
}
