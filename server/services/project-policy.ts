import type { Knex } from 'knex';
import { ConflictError, ForbiddenError, NotFoundError } from '../errors';
import { MemberRepository } from '../repositories/project-repository';
import type { ProjectRole } from '../schemas/projects';

const RANK: Record<ProjectRole, number> = { viewer: 1, engineer: 2, lead: 3 };
const WHO: Record<ProjectRole, string> = {
  viewer: 'members',
  engineer: 'engineers and leads',
  lead: 'project leads',
};

export const atLeast = (role: ProjectRole, min: ProjectRole) => RANK[role] >= RANK[min];

/** The lower of a member's role and a cap (an API token's role): a token never grants more than its user has. */
export const capRole = (role: ProjectRole | null, cap: ProjectRole | null | undefined): ProjectRole | null =>
  role && cap && RANK[cap] < RANK[role] ? cap : role;

/**
 * Who may do what in a project. A non-member gets 404 (the project is not theirs to know about); a
 * member whose role is too low gets 403.
 */
export class ProjectPolicy {
  private readonly members: MemberRepository;

  constructor(db: Knex) {
    this.members = new MemberRepository(db);
  }

  /** `cap`: the role of the API token the request came with, if any; the caller acts at no more than it. */
  async require(projectId: number, userId: number, min: ProjectRole, cap?: ProjectRole | null): Promise<ProjectRole> {
    return ProjectPolicy.judge(capRole(await this.members.roleOf(projectId, userId), cap), min);
  }

  /** As require(), and the project must not be archived (changes to an archived project are refused). */
  async requireWritable(projectId: number, userId: number, min: ProjectRole, cap?: ProjectRole | null): Promise<ProjectRole> {
    const { role, archived } = await this.members.accessTo(projectId, userId); // one query for both checks
    return ProjectPolicy.judge(capRole(role, cap), min, archived);
  }

  /** The rule itself, for callers that read the role with their own query. */
  static judge(role: ProjectRole | null, min: ProjectRole, archived?: boolean): ProjectRole {
    if (!role) throw new NotFoundError('Project not found.');
    if (!atLeast(role, min)) throw new ForbiddenError(`Only ${WHO[min]} may do that in this project.`);
    if (archived) throw new ConflictError('This project is archived. A lead can restore it first.');
    return role;
  }
}
