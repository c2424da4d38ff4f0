import type { Knex } from 'knex';
import type { SiteRole, PublicUser } from '../schemas/auth';
import { userChanged } from '../services/cache-notices';

export interface UserRecord extends PublicUser {
  passwordHash: string;
  disabledAt: Date | null;
  createdAt: Date;
}

interface UserRow {
  id: number;
  email: string;
  name: string;
  password_hash: string;
  site_role: SiteRole;
  disabled_at: Date | null;
  created_at: Date;
}

const fromRow = (r: UserRow): UserRecord => ({
  id: r.id,
  email: r.email,
  name: r.name,
  siteRole: r.site_role,
  passwordHash: r.password_hash,
  disabledAt: r.disabled_at,
  createdAt: r.created_at,
});

export const toPublicUser = (u: UserRecord): PublicUser => ({
  id: u.id,
  email: u.email,
  name: u.name,
  siteRole: u.siteRole,
});

export class UserRepository {
  constructor(private readonly db: Knex) {}

  async findByEmail(email: string): Promise<UserRecord | null> {
    const row = await this.db<UserRow>('users').where({ email }).first();
    return row ? fromRow(row) : null;
  }

  async findById(id: number): Promise<UserRecord | null> {
    const row = await this.db<UserRow>('users').where({ id }).first();
    return row ? fromRow(row) : null;
  }

  async insert(user: { email: string; name: string; passwordHash: string; siteRole: SiteRole }): Promise<number> {
    const [id] = await this.db('users').insert({
      email: user.email,
      name: user.name,
      password_hash: user.passwordHash,
      site_role: user.siteRole,
    });
    return id;
  }
}

export interface UserChanges {
  name?: string;
  siteRole?: SiteRole;
  disabled?: boolean;
  passwordHash?: string;
}

export interface UserWithCounts extends UserRecord {
  projectCount: number;
}

export class UserAdminRepository {
  constructor(private readonly db: Knex) {}

  async list(): Promise<UserWithCounts[]> {
    const rows = await this.db('users as u')
      .select('u.*', this.db('project_members as m').count('*').whereRaw('m.user_id = u.id').as('project_count'))
      .orderBy('u.name');
    return rows.map((r: UserRow & { project_count: number | string }) => ({
      ...fromRow(r),
      projectCount: Number(r.project_count),
    }));
  }

  async update(id: number, changes: UserChanges, db: Knex = this.db): Promise<void> {
    const row: Record<string, unknown> = { updated_at: db.fn.now() };
    if (changes.name !== undefined) row.name = changes.name;
    if (changes.siteRole !== undefined) row.site_role = changes.siteRole;
    if (changes.passwordHash !== undefined) row.password_hash = changes.passwordHash;
    if (changes.disabled !== undefined) row.disabled_at = changes.disabled ? db.fn.now() : null;
    await db('users').where({ id }).update(row);
    userChanged(id);
  }

  async countActiveAdmins(db: Knex = this.db): Promise<number> {
    const [{ n }] = await db('users').where({ site_role: 'admin' }).whereNull('disabled_at').count({ n: '*' });
    return Number(n);
  }
}
