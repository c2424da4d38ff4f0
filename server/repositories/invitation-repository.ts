import type { Knex } from 'knex';
import type { PendingInvitation, ProjectRole } from '../schemas/projects';

export interface InvitationRecord {
  id: number;
  projectId: number;
  projectName: string;
  email: string;
  role: ProjectRole;
  invitedBy: string | null;
  expiresAt: Date;
  acceptedAt: Date | null;
}

export class InvitationRepository {
  constructor(private readonly db: Knex) {}

  async create(i: {
    projectId: number;
    email: string;
    role: ProjectRole;
    tokenHash: string;
    invitedBy: number;
    expiresAt: Date;
  }): Promise<number> {
    const [id] = await this.db('invitations').insert({
      project_id: i.projectId,
      email: i.email,
      role: i.role,
      token_hash: i.tokenHash,
      invited_by: i.invitedBy,
      expires_at: i.expiresAt,
    });
    return id;
  }

  async findByTokenHash(tokenHash: string, db: Knex = this.db): Promise<InvitationRecord | null> {
    const r = await db('invitations as i')
      .join('projects as p', 'p.id', 'i.project_id')
      .leftJoin('users as u', 'u.id', 'i.invited_by')
      .where('i.token_hash', tokenHash)
      .first('i.id', 'i.project_id', 'p.name as project_name', 'i.email', 'i.role', 'u.name as inviter', 'i.expires_at', 'i.accepted_at');
    return r
      ? {
          id: r.id,
          projectId: r.project_id,
          projectName: r.project_name,
          email: r.email,
          role: r.role,
          invitedBy: r.inviter ?? null,
          expiresAt: new Date(r.expires_at),
          acceptedAt: r.accepted_at ? new Date(r.accepted_at) : null,
        }
      : null;
  }

  async listPending(projectId: number, now: Date): Promise<PendingInvitation[]> {
    const rows = await this.db('invitations as i')
      .leftJoin('users as u', 'u.id', 'i.invited_by')
      .where('i.project_id', projectId)
      .whereNull('i.accepted_at')
      .where('i.expires_at', '>', now)
      .orderBy('i.created_at', 'desc')
      .select('i.id', 'i.email', 'i.role', 'i.expires_at', 'u.name as inviter');
    return rows.map((r) => ({
      id: r.id,
      email: r.email,
      role: r.role,
      expiresAt: new Date(r.expires_at).toISOString(),
      invitedBy: r.inviter ?? null,
    }));
  }

  /** Marks accepted only if still open; false when another request took it first. */
  async markAccepted(id: number, userId: number, db: Knex = this.db): Promise<boolean> {
    const n = await db('invitations')
      .where({ id })
      .whereNull('accepted_at')
      .update({ accepted_at: db.fn.now(), accepted_by: userId });
    return n === 1;
  }

  async remove(projectId: number, id: number): Promise<boolean> {
    return (await this.db('invitations').where({ id, project_id: projectId }).whereNull('accepted_at').delete()) === 1;
  }
}
