import type { Knex } from 'knex';
import { LRUCache } from 'lru-cache';
import { onUserChanged } from './cache-notices';
import { AppError } from '../errors';
import { UserRepository, toPublicUser } from '../repositories/user-repository';
import type { PublicUser, SignInBody } from '../schemas/auth';
import { verifyPassword } from './passwords';

// One message for an unknown e-mail, a wrong password and a disabled account: nothing to enumerate.
const BAD_CREDENTIALS = 'That e-mail and password do not match an account.';

/** How long a signed-in user's record is reused between requests (see cache-notices.ts). */
export const USER_CACHE_MS = 5000;

export class AuthService {
  private readonly users: UserRepository;
  // Every request of a signed-in user needs their record; reading it once per few seconds instead of once
  // per request halves the queries of a simple read. A change in this process drops it at once.
  private readonly recent = new LRUCache<number, { user: PublicUser | null }>({ max: 10_000, ttl: USER_CACHE_MS });
  // A change may be announced before its transaction commits: for one cache lifetime after it, the user
  // is read afresh every time, so a read of the old row cannot be kept.
  private readonly justChanged = new LRUCache<number, true>({ max: 10_000, ttl: USER_CACHE_MS });
  private readonly stopListening: () => void;

  constructor(db: Knex) {
    this.users = new UserRepository(db);
    this.stopListening = onUserChanged((id) => {
      this.recent.delete(id);
      this.justChanged.set(id, true);
    });
  }

  close(): void {
    this.stopListening();
  }

  async signIn({ email, password }: SignInBody): Promise<PublicUser> {
    const user = await this.users.findByEmail(email);
    const ok = await verifyPassword(password, user?.passwordHash ?? null);
    if (!user || !ok || user.disabledAt) throw new AppError(401, 'INVALID_CREDENTIALS', BAD_CREDENTIALS);
    return toPublicUser(user);
  }

  async activeUser(id: number): Promise<PublicUser | null> {
    const fresh = this.justChanged.has(id);
    const cached = fresh ? undefined : this.recent.get(id);
    if (cached) return cached.user;
    const record = await this.users.findById(id);
    const user = record && !record.disabledAt ? toPublicUser(record) : null;
    if (!fresh) this.recent.set(id, { user });
    return user;
  }
}
