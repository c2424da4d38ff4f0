import type { Knex } from 'knex';
import { ConflictError, ForbiddenError, NotFoundError } from '../errors';
import { ActivityRepository } from '../repositories/activity-repository';
import { InvitationRepository } from '../repositories/invitation-repository';
import { MemberRepository, ProjectRepository } from '../repositories/project-repository';
import type { PublicUser } from '../schemas/auth';
import type {
  ActivityEntry,
  CreateProjectBody,
  PendingInvitation,
  ProjectDetail,
  ProjectMember,
  ProjectRole,
  ProjectSummary,
  UpdateProjectBody,
} from '../schemas/projects';
import { ProjectPolicy } from './project-policy';

const LAST_LEAD = 'A project keeps at least one lead: make someone else lead first.';

export class ProjectService {
  private readonly projects: ProjectRepository;
  private readonly members: MemberRepository;
  private readonly invitations: InvitationRepository;
  private readonly activity: ActivityRepository;
  private readonly policy: ProjectPolicy;

  constructor(
    private readonly db: Knex,
    private readonly now: () => Date = () => new Date(),
  ) {
    this.projects = new ProjectRepository(db);
    this.members = new MemberRepository(db);
    this.invitations = new InvitationRepository(db);
    this.activity = new ActivityRepository(db);
    this.policy = new ProjectPolicy(db);
  }

  list(user: PublicUser): Promise<ProjectSummary[]> {
    return this.projects.listForUser(user.id);
  }

  /** Staff and admins create projects; the creator becomes the lead. */
  async create(user: PublicUser, body: CreateProjectBody): Promise<ProjectDetail> {
    if (user.siteRole !== 'staff' && user.siteRole !== 'admin') {
      throw new ForbiddenError('Only staff and admins may create projects.');
    }
    const id = await this.db.transaction(async (trx) => {
      const projectId = await this.projects.create({ ...body, createdBy: user.id }, trx);
      await this.members.upsert(projectId, user.id, 'lead', trx);
      await this.activity.add(
        { projectId, actorId: user.id, verb: 'created', objectType: 'project', objectId: projectId, summary: `created the project ${body.name}` },
        trx,
      );
      return projectId;
    });
    return (await this.projects.findForUser(id, user.id))!;
  }

  async get(user: PublicUser, projectId: number): Promise<ProjectDetail> {
    const project = await this.projects.findForUser(projectId, user.id);
    if (!project) throw new NotFoundError('Project not found.');
    return project;
  }

  async update(user: PublicUser, projectId: number, body: UpdateProjectBody): Promise<ProjectDetail> {
    await this.policy.requireWritable(projectId, user.id, 'lead');
    await this.projects.update(projectId, body);
    await this.activity.add({
      projectId,
      actorId: user.id,
      verb: 'updated',
      objectType: 'project',
      objectId: projectId,
      summary: body.name ? `renamed the project to ${body.name}` : 'changed the project description',
    });
    return this.get(user, projectId);
  }

  async setArchived(user: PublicUser, projectId: number, archived: boolean): Promise<ProjectDetail> {
    await this.policy.require(projectId, user.id, 'lead');
    await this.projects.setArchived(projectId, archived);
    await this.activity.add({
      projectId,
      actorId: user.id,
      verb: archived ? 'archived' : 'restored',
      objectType: 'project',
      objectId: projectId,
      summary: archived ? 'archived the project' : 'restored the project',
    });
    return this.get(user, projectId);
  }

  /** Members for every member; pending invitations only for leads. */
  async membersOf(user: PublicUser, projectId: number): Promise<{ members: ProjectMember[]; invitations: PendingInvitation[] }> {
    const role = await this.policy.require(projectId, user.id, 'viewer');
    return {
      members: await this.members.list(projectId),
      invitations: role === 'lead' ? await this.invitations.listPending(projectId, this.now()) : [],
    };
  }

  async changeRole(user: PublicUser, projectId: number, memberId: number, role: ProjectRole): Promise<ProjectMember> {
    await this.policy.requireWritable(projectId, user.id, 'lead');
    await this.db.transaction(async (trx) => {
      const current = await this.members.roleOf(projectId, memberId, trx);
      if (!current) throw new NotFoundError('That person is not a member of this project.');
      if (current === 'lead' && role !== 'lead' && (await this.members.countLeadsForUpdate(projectId, trx)) <= 1) {
        throw new ConflictError(LAST_LEAD);
      }
      await this.members.upsert(projectId, memberId, role, trx);
    });
    const member = (await this.members.list(projectId)).find((m) => m.userId === memberId)!;
    await this.activity.add({
      projectId,
      actorId: user.id,
      verb: 'changed-role',
      objectType: 'member',
      objectId: memberId,
      summary: `made ${member.name} ${role}`,
    });
    return member;
  }

  async removeMember(user: PublicUser, projectId: number, memberId: number): Promise<void> {
    await this.policy.requireWritable(projectId, user.id, 'lead');
    const member = (await this.members.list(projectId)).find((m) => m.userId === memberId);
    if (!member) throw new NotFoundError('That person is not a member of this project.');
    await this.db.transaction(async (trx) => {
      if (member.role === 'lead' && (await this.members.countLeadsForUpdate(projectId, trx)) <= 1) {
        throw new ConflictError(LAST_LEAD);
      }
      await this.members.remove(projectId, memberId, trx);
    });
    await this.activity.add({
      projectId,
      actorId: user.id,
      verb: 'removed',
      objectType: 'member',
      objectId: memberId,
      summary: `removed ${member.name} from the project`,
    });
  }

  async recentActivity(user: PublicUser, projectId: number): Promise<ActivityEntry[]> {
    await this.policy.require(projectId, user.id, 'viewer');
    return this.activity.list(projectId);
  }
}
