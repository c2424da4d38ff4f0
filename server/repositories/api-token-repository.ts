import type { Knex } from 'knex';
import type { ApiToken } from '../schemas/api-tokens';
import type { ProjectRole } from '../schemas/projects';
import { toIso } from './view-repository';

interface ApiTokenRow {
  id: number;
  user_id: number;
  project_id: number;
  project_name: string;
  role: ProjectRole;
  name: string;
  expires_at: Date;
  last_used_at: Date | null;
  revoked_at: Date | null;
  created_at: Date;
}

const toIsoOrNull = (d: Date | null) => (d ? toIso(d) : null);

const fromRow = (r: ApiTokenRow): ApiToken => ({
  id: r.id,
  name: r.name,
  projectId: r.project_id,
  projectName: r.project_name,
  role: r.role,
  expiresAt: toIso(r.expires_at),
  lastUsedAt: toIsoOrNull(r.last_used_at),
  revokedAt: toIsoOrNull(r.revoked_at),
  createdAt: toIso(r.created_at),
});

/** What a bearer request needs of its token: whose, where, how far, and whether it still holds. */
export interface TokenGrant {
  id: number;
  userId: number;
  projectId: number;
  role: ProjectRole;
  expiresAt: Date;
  lastUsedAt: Date | null;
  revokedAt: Date | null;
}

export interface NewApiToken {
  userId: number;
  projectId: number;
  role: ProjectRole;
  name: string;
  tokenHash: string;
  expiresAt: Date;
}

export class ApiTokenRepository {
  constructor(private readonly db: Knex) {}

  private select() {
    return this.db('api_tokens as k')
      .join('projects as p', 'p.id', 'k.project_id')
      .select('k.id', 'k.user_id', 'k.project_id', 'p.name as project_name', 'k.role', 'k.name', 'k.expires_at', 'k.last_used_at', 'k.revoked_at', 'k.created_at');
  }

  async insert(t: NewApiToken): Promise<number> {
    const [id] = await this.db('api_tokens').insert({
      user_id: t.userId,
      project_id: t.projectId,
      role: t.role,
      name: t.name,
      token_hash: t.tokenHash,
      expires_at: t.expiresAt,
    });
    return id;
  }

  async get(id: number): Promise<ApiToken | null> {
    const row = await this.select().where('k.id', id).first();
    return row ? fromRow(row) : null;
  }

  /** The user's tokens, newest first, revoked and expired ones too. */
  async listOf(userId: number): Promise<ApiToken[]> {
    return (await this.select().where('k.user_id', userId).orderBy([{ column: 'k.created_at', order: 'desc' }, { column: 'k.id', order: 'desc' }])).map(fromRow);
  }

  /** Marks the user's token revoked (once); false when the user has no such token. */
  async revoke(userId: number, id: number): Promise<boolean> {
    const row = await this.db('api_tokens').where({ id, user_id: userId }).first('id', 'revoked_at');
    if (!row) return false;
    if (!row.revoked_at) await this.db('api_tokens').where({ id }).whereNull('revoked_at').update({ revoked_at: this.db.fn.now() });
    return true;
  }

  async grantOf(tokenHash: string): Promise<TokenGrant | null> {
    const r = await this.db('api_tokens')
      .where({ token_hash: tokenHash })
      .first('id', 'user_id', 'project_id', 'role', 'expires_at', 'last_used_at', 'revoked_at');
    if (!r) return null;
    return {
      id: r.id,
      userId: r.user_id,
      projectId: r.project_id,
      role: r.role,
      expiresAt: new Date(r.expires_at),
      lastUsedAt: r.last_used_at ? new Date(r.last_used_at) : null,
      revokedAt: r.revoked_at ? new Date(r.revoked_at) : null,
    };
  }

  /** Notes a use, unless one was noted within the last minute (a busy script then writes once a minute). */
  async touch(id: number, now: Date): Promise<void> {
    const minuteAgo = new Date(now.getTime() - 60_000);
    await this.db('api_tokens')
      .where({ id })
      .andWhere((q) => q.whereNull('last_used_at').orWhere('last_used_at', '<=', minuteAgo))
      .update({ last_used_at: now });
  }
}
