import type { Knex } from 'knex';
import { ConflictError, ForbiddenError, NotFoundError } from '../errors';
import { ViewRepository, type ViewRecord } from '../repositories/view-repository';
import type { ProjectRole } from '../schemas/projects';
import { ProjectPolicy, atLeast } from './project-policy';

const NO_VIEW = 'View not found.';

/**
 * Who may touch a view: the project's roles (ProjectPolicy: 404 for non-members, 403 for a low role), then
 * for changes to the view itself and its marks, the author (an engineer or lead) or a lead.
 */
export class ViewAccess {
  readonly views: ViewRepository;
  private readonly policy: ProjectPolicy;

  constructor(db: Knex) {
    this.views = new ViewRepository(db);
    this.policy = new ProjectPolicy(db);
  }

  /** The view and the caller's role in its project; `writable`: the project must not be archived. */
  async open(userId: number, viewId: number, min: ProjectRole, writable = false): Promise<{ view: ViewRecord; role: ProjectRole }> {
    const found = await this.views.findWithAccess(viewId, userId);
    if (!found) throw new NotFoundError(NO_VIEW);
    const role = await ViewAccess.asViewNotFound(async () => ProjectPolicy.judge(found.role, min, writable && found.projectArchived));
    return { view: found.view, role };
  }

  /** Project roles for a route that names the project (or a link, a mark) rather than the view. */
  async project(projectId: number, userId: number, min: ProjectRole, writable = false): Promise<ProjectRole> {
    return writable ? this.policy.requireWritable(projectId, userId, min) : this.policy.require(projectId, userId, min);
  }

  /** A non-member learns nothing about the view: its 404 names the view, not the project. */
  static async asViewNotFound<T>(f: () => Promise<T>): Promise<T> {
    try {
      return await f();
    } catch (e) {
      if (e instanceof NotFoundError) throw new NotFoundError(NO_VIEW);
      throw e;
    }
  }

  static mayChange(role: ProjectRole, authorId: number | null, userId: number): boolean {
    return role === 'lead' || (authorId === userId && atLeast(role, 'engineer'));
  }

  static requireAuthorOrLead(role: ProjectRole, authorId: number | null, userId: number, what: string): void {
    if (!ViewAccess.mayChange(role, authorId, userId)) throw new ForbiddenError(`Only the author of ${what} or a project lead may change it.`);
  }

  static requireNotArchived(view: ViewRecord): void {
    if (view.archivedAt) throw new ConflictError('This view is archived: it can be read but not changed. A lead can restore it.');
  }
}
