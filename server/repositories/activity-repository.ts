import type { Knex } from 'knex';
import type { ActivityEntry } from '../schemas/projects';

export interface NewActivity {
  projectId: number;
  actorId: number | null;
  verb: string;
  objectType: string;
  objectId?: string | number | null;
  summary: string;
}

export class ActivityRepository {
  constructor(private readonly db: Knex) {}

  async add(a: NewActivity, db: Knex = this.db): Promise<void> {
    await db('activity').insert({
      project_id: a.projectId,
      actor_id: a.actorId,
      verb: a.verb,
      object_type: a.objectType,
      object_id: a.objectId == null ? null : String(a.objectId),
      summary: a.summary.slice(0, 300),
    });
  }

  async list(projectId: number, limit = 50): Promise<ActivityEntry[]> {
    const rows = await this.db('activity as a')
      .leftJoin('users as u', 'u.id', 'a.actor_id')
      .where('a.project_id', projectId)
      .orderBy([{ column: 'a.created_at', order: 'desc' }, { column: 'a.id', order: 'desc' }])
      .limit(limit)
      .select('a.id', 'u.name as actor', 'a.verb', 'a.object_type', 'a.summary', 'a.created_at');
    return rows.map((r) => ({
      id: Number(r.id),
      actor: r.actor ?? null,
      verb: r.verb,
      objectType: r.object_type,
      summary: r.summary,
      at: new Date(r.created_at).toISOString(),
    }));
  }
}
