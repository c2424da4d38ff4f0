import type { Knex } from 'knex';
import { AppError } from '../errors';
import { UserRepository, toPublicUser } from '../repositories/user-repository';
import type { PublicUser, SignInBody } from '../schemas/auth';
import { verifyPassword } from './passwords';

// One message for an unknown e-mail, a wrong password and a disabled account: nothing to enumerate.
const BAD_CREDENTIALS = 'That e-mail and password do not match an account.';

export class AuthService {
  private readonly users: UserRepository;

  constructor(db: Knex) {
    this.users = new UserRepository(db);
  }

  async signIn({ email, password }: SignInBody): Promise<PublicUser> {
    const user = await this.users.findByEmail(email);
    const ok = await verifyPassword(password, user?.passwordHash ?? null);
    if (!user || !ok || user.disabledAt) throw new AppError(401, 'INVALID_CREDENTIALS', BAD_CREDENTIALS);
    return toPublicUser(user);
  }

  async activeUser(id: number): Promise<PublicUser | null> {
    const user = await this.users.findById(id);
    return user && !user.disabledAt ? toPublicUser(user) : null;
  }
}
