import type { Knex } from 'knex';
import type { NotificationSettings } from '../schemas/views';

export const DEFAULT_NOTIFICATIONS: NotificationSettings = { replies: true, mentions: true, shares: true };

export class NotificationSettingsRepository {
  constructor(private readonly db: Knex) {}

  /** A user's settings; without a row every kind is on. */
  async get(userId: number): Promise<NotificationSettings> {
    const r = await this.db('notification_settings').where({ user_id: userId }).first('replies', 'mentions', 'shares');
    return r ? { replies: Boolean(r.replies), mentions: Boolean(r.mentions), shares: Boolean(r.shares) } : { ...DEFAULT_NOTIFICATIONS };
  }

  /** The settings of several users at once (missing users get the defaults). */
  async forUsers(userIds: number[]): Promise<Map<number, NotificationSettings>> {
    const out = new Map<number, NotificationSettings>(userIds.map((id) => [id, { ...DEFAULT_NOTIFICATIONS }]));
    if (!userIds.length) return out;
    const rows = await this.db('notification_settings').whereIn('user_id', userIds).select('user_id', 'replies', 'mentions', 'shares');
    for (const r of rows) out.set(r.user_id, { replies: Boolean(r.replies), mentions: Boolean(r.mentions), shares: Boolean(r.shares) });
    return out;
  }

  async save(userId: number, s: NotificationSettings): Promise<void> {
    await this.db('notification_settings')
      .insert({ user_id: userId, replies: s.replies, mentions: s.mentions, shares: s.shares })
      .onConflict('user_id')
      .merge({ replies: s.replies, mentions: s.mentions, shares: s.shares, updated_at: this.db.fn.now() });
  }
}
