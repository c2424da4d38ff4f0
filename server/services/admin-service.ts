import type { Knex } from 'knex';
import { ConflictError, ForbiddenError, NotFoundError } from '../errors';
import { SessionRepository } from '../repositories/session-repository';
import { UserAdminRepository, UserRepository, type UserWithCounts } from '../repositories/user-repository';
import type { AdminUser, CreateUserBody, UpdateUserFields } from '../schemas/admin';
import type { PublicUser } from '../schemas/auth';
import { hashPassword } from './passwords';

const toAdminUser = (u: UserWithCounts): AdminUser => ({
  id: u.id,
  email: u.email,
  name: u.name,
  siteRole: u.siteRole,
  disabled: u.disabledAt !== null,
  createdAt: new Date(u.createdAt).toISOString(),
  projectCount: u.projectCount,
});

export class AdminService {
  private readonly users: UserRepository;
  private readonly admin: UserAdminRepository;
  private readonly sessions: SessionRepository;

  constructor(private readonly db: Knex) {
    this.users = new UserRepository(db);
    this.admin = new UserAdminRepository(db);
    this.sessions = new SessionRepository(db);
  }

  static assertAdmin(user: PublicUser): void {
    if (user.siteRole !== 'admin') throw new ForbiddenError('Only site admins manage users.');
  }

  async list(): Promise<AdminUser[]> {
    return (await this.admin.list()).map(toAdminUser);
  }

  private async one(id: number): Promise<AdminUser> {
    const u = (await this.admin.list()).find((x) => x.id === id);
    if (!u) throw new NotFoundError('No such user.');
    return toAdminUser(u);
  }

  async create(body: CreateUserBody): Promise<AdminUser> {
    if (await this.users.findByEmail(body.email)) {
      throw new ConflictError(`An account for ${body.email} exists already.`, { email: 'Already in use.' });
    }
    const id = await this.users.insert({ ...body, passwordHash: await hashPassword(body.password) });
    return this.one(id);
  }

  /** Changes a user; disabling ends their sessions. The last active admin cannot be demoted or disabled. */
  async update(id: number, changes: UpdateUserFields): Promise<AdminUser> {
    const target = await this.users.findById(id);
    if (!target) throw new NotFoundError('No such user.');
    const losesAdmin =
      target.siteRole === 'admin' && !target.disabledAt && ((changes.siteRole && changes.siteRole !== 'admin') || changes.disabled);
    await this.db.transaction(async (trx) => {
      if (losesAdmin && (await this.admin.countActiveAdmins(trx)) <= 1) {
        throw new ConflictError('Fanlight keeps at least one active admin: make someone else admin first.');
      }
      await this.admin.update(id, changes, trx);
      if (changes.disabled) await this.sessions.endAllFor(id, undefined, trx);
    });
    return this.one(id);
  }
}
