import type { Knex } from 'knex';
import type { ProjectDetail, ProjectMember, ProjectRole, ProjectSummary } from '../schemas/projects';

interface SummaryRow {
  id: number;
  name: string;
  description: string;
  role: ProjectRole;
  member_count: number | string;
  recording_count: number | string;
  view_count: number | string;
  archived_at: Date | null;
  created_at: Date;
  updated_at: Date;
  last_activity_at: Date | null;
}

const toIso = (d: Date) => new Date(d).toISOString();

const toDetail = (r: SummaryRow): ProjectDetail => ({
  id: r.id,
  name: r.name,
  description: r.description,
  role: r.role,
  memberCount: Number(r.member_count),
  recordingCount: Number(r.recording_count),
  viewCount: Number(r.view_count),
  archived: r.archived_at !== null,
  lastActivityAt: toIso(r.last_activity_at ?? r.updated_at),
  createdAt: toIso(r.created_at),
});

export class ProjectRepository {
  constructor(private readonly db: Knex) {}

  /** Projects with the given user's role and the counts the Projects table shows. */
  private summaries(userId: number) {
    const db = this.db;
    return db('projects as p')
      .join('project_members as me', function () {
        this.on('me.project_id', '=', 'p.id').andOn('me.user_id', '=', db.raw('?', [userId]));
      })
      .select(
        'p.id',
        'p.name',
        'p.description',
        'p.archived_at',
        'p.created_at',
        'p.updated_at',
        'me.role',
        db('project_members as m').count('*').whereRaw('m.project_id = p.id').as('member_count'),
        db('recordings as r').count('*').whereRaw('r.project_id = p.id').as('recording_count'),
        db('views as v').count('*').whereRaw('v.project_id = p.id').as('view_count'),
        db('activity as a').max('a.created_at').whereRaw('a.project_id = p.id').as('last_activity_at'),
      );
  }

  /** The projects a user belongs to, most recently active first. */
  async listForUser(userId: number): Promise<ProjectSummary[]> {
    const rows: SummaryRow[] = await this.summaries(userId);
    return rows
      .map((r) => {
        const { createdAt: _createdAt, ...summary } = toDetail(r);
        return summary;
      })
      .sort((a, b) => b.lastActivityAt.localeCompare(a.lastActivityAt));
  }

  async findForUser(projectId: number, userId: number): Promise<ProjectDetail | null> {
    const row: SummaryRow | undefined = await this.summaries(userId).where('p.id', projectId).first();
    return row ? toDetail(row) : null;
  }

  async exists(projectId: number): Promise<boolean> {
    return Boolean(await this.db('projects').where({ id: projectId }).first('id'));
  }

  async isArchived(projectId: number): Promise<boolean> {
    const row = await this.db('projects').where({ id: projectId }).first('archived_at');
    return Boolean(row?.archived_at);
  }

  async create(p: { name: string; description: string; createdBy: number }, db: Knex = this.db): Promise<number> {
    const [id] = await db('projects').insert({ name: p.name, description: p.description, created_by: p.createdBy });
    return id;
  }

  async update(projectId: number, changes: { name?: string; description?: string }): Promise<void> {
    await this.db('projects')
      .where({ id: projectId })
      .update({ ...changes, updated_at: this.db.fn.now() });
  }

  async setArchived(projectId: number, archived: boolean): Promise<void> {
    await this.db('projects')
      .where({ id: projectId })
      .update({ archived_at: archived ? this.db.fn.now() : null, updated_at: this.db.fn.now() });
  }
}

export class MemberRepository {
  constructor(private readonly db: Knex) {}

  /** The caller's role and whether the project is archived, in one query; null role for a non-member. */
  async accessTo(projectId: number, userId: number): Promise<{ role: ProjectRole | null; archived: boolean }> {
    const row = await this.db('projects as p')
      .leftJoin('project_members as m', (j) => j.on('m.project_id', '=', 'p.id').andOnVal('m.user_id', '=', userId))
      .where('p.id', projectId)
      .first('m.role', 'p.archived_at');
    return { role: row?.role ?? null, archived: Boolean(row?.archived_at) };
  }

  async roleOf(projectId: number, userId: number, db: Knex = this.db): Promise<ProjectRole | null> {
    const row = await db('project_members').where({ project_id: projectId, user_id: userId }).first('role');
    return row?.role ?? null;
  }

  async list(projectId: number): Promise<ProjectMember[]> {
    const rows = await this.db('project_members as m')
      .join('users as u', 'u.id', 'm.user_id')
      .where('m.project_id', projectId)
      .orderByRaw("FIELD(m.role, 'lead', 'engineer', 'viewer'), u.name")
      .select('u.id', 'u.email', 'u.name', 'm.role', 'm.created_at');
    return rows.map((r) => ({
      userId: r.id,
      email: r.email,
      name: r.name,
      role: r.role,
      joinedAt: new Date(r.created_at).toISOString(),
    }));
  }

  /** The members whose accounts are not disabled: the ones mail may go to. */
  async listReachable(projectId: number): Promise<ProjectMember[]> {
    const active = new Set(
      (
        await this.db('project_members as m')
          .join('users as u', 'u.id', 'm.user_id')
          .where('m.project_id', projectId)
          .whereNull('u.disabled_at')
          .select('u.id')
      ).map((r: { id: number }) => r.id),
    );
    return (await this.list(projectId)).filter((m) => active.has(m.userId));
  }

  /** Adds a member, or changes the role of one already there. */
  async upsert(projectId: number, userId: number, role: ProjectRole, db: Knex = this.db): Promise<void> {
    await db('project_members').insert({ project_id: projectId, user_id: userId, role }).onConflict().merge(['role']);
  }

  async remove(projectId: number, userId: number, db: Knex = this.db): Promise<void> {
    await db('project_members').where({ project_id: projectId, user_id: userId }).delete();
  }

  /** Counts leads with a row lock, so two concurrent demotions cannot both pass the last-lead check. */
  async countLeadsForUpdate(projectId: number, db: Knex): Promise<number> {
    const rows = await db('project_members').where({ project_id: projectId, role: 'lead' }).forUpdate().select('user_id');
    return rows.length;
  }
}
