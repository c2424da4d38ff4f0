import type { Knex } from 'knex';
import type { SiteRole, PublicUser } from '../schemas/auth';

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
