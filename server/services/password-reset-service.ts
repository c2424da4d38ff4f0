import type { Knex } from 'knex';
import { AppError } from '../errors';
import type { Mailer } from '../mail/mailer';
import { passwordResetMail } from '../mail/templates';
import { PasswordResetRepository } from '../repositories/password-reset-repository';
import { SessionRepository } from '../repositories/session-repository';
import { UserAdminRepository, UserRepository } from '../repositories/user-repository';
import { hashPassword } from './passwords';
import { hashToken, newToken } from './tokens';

const RESET_LIFETIME_MS = 3600_000; // one hour

export class PasswordResetService {
  private readonly resets: PasswordResetRepository;
  private readonly users: UserRepository;
  private readonly userAdmin: UserAdminRepository;
  private readonly sessions: SessionRepository;

  constructor(
    private readonly db: Knex,
    private readonly mailer: Mailer,
    private readonly publicOrigin: string,
    private readonly now: () => Date = () => new Date(),
  ) {
    this.resets = new PasswordResetRepository(db);
    this.users = new UserRepository(db);
    this.userAdmin = new UserAdminRepository(db);
    this.sessions = new SessionRepository(db);
  }

  /**
   * Mails a one-time link when the e-mail belongs to an active account. The caller answers 202 at once
   * either way, and the work runs after, so the answer's timing tells nothing about the account.
   */
  async request(email: string): Promise<void> {
    const user = await this.users.findByEmail(email);
    if (!user || user.disabledAt) return;
    const token = newToken();
    await this.resets.create(user.id, hashToken(token), new Date(this.now().getTime() + RESET_LIFETIME_MS));
    await this.mailer.send(
      passwordResetMail({ to: user.email, name: user.name, link: `${this.publicOrigin}/reset-password?token=${token}` }),
    );
  }

  /** Sets the new password and ends every other session of that user. */
  async confirm(token: string, password: string, currentSid: string | undefined): Promise<void> {
    const passwordHash = await hashPassword(password);
    await this.db.transaction(async (trx) => {
      const userId = await this.resets.consume(hashToken(token), this.now(), trx);
      if (!userId) {
        throw new AppError(400, 'VALIDATION_FAILED', 'This reset link is not valid: it may have expired or been used.', {
          token: 'Expired, used or unknown. Ask for a new link.',
        });
      }
      await this.userAdmin.update(userId, { passwordHash }, trx);
      await this.resets.closeOpenFor(userId, trx);
      await this.sessions.endAllFor(userId, currentSid, trx);
    });
  }
}
