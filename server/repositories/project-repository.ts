import type { Knex } from 'knex';
import type { ProjectRole, ProjectSummary } from '../schemas/projects';

interface SummaryRow {
  id: number;
  name: string;
  description: string;
  role: ProjectRole;
  member_count: number | string;
  recording_count: number | string;
  view_count: number | string;
  archived_at: Date | null;
  updated_at: Date;
  last_activity_at: Date | null;
}

const toIso = (d: Date) => new Date(d).toISOString();

export class ProjectRepository {
  constructor(private readonly db: Knex) {}

  /** The projects a user belongs to, with their role and counts, most recently active first. */
  async listForUser(userId: number): Promise<ProjectSummary[]> {
    const db = this.db;
    const rows: SummaryRow[] = await db('projects as p')
      .join('project_members as me', function () {
        this.on('me.project_id', '=', 'p.id').andOn('me.user_id', '=', db.raw('?', [userId]));
      })
      .select(
        'p.id',
        'p.name',
        'p.description',
        'p.archived_at',
        'p.updated_at',
        'me.role',
        db('project_members as m').count('*').whereRaw('m.project_id = p.id').as('member_count'),
        db('recordings as r').count('*').whereRaw('r.project_id = p.id').as('recording_count'),
        db('views as v').count('*').whereRaw('v.project_id = p.id').as('view_count'),
        db('activity as a').max('a.created_at').whereRaw('a.project_id = p.id').as('last_activity_at'),
      );
    return rows
      .map((r) => ({
        id: r.id,
        name: r.name,
        description: r.description,
        role: r.role,
        memberCount: Number(r.member_count),
        recordingCount: Number(r.recording_count),
        viewCount: Number(r.view_count),
        archived: r.archived_at !== null,
        lastActivityAt: toIso(r.last_activity_at ?? r.updated_at),
      }))
      .sort((a, b) => b.lastActivityAt.localeCompare(a.lastActivityAt));
  }
}
