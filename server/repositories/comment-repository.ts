import type { Knex } from 'knex';
import type { ThreadComment } from '../schemas/views';
import { toIso } from './view-repository';

const FORMER_MEMBER = 'a former member';

const fromRow = (r: {
  id: number;
  view_id: number;
  mark_id: number | null;
  body: string;
  author_id: number | null;
  author_name: string | null;
  guest_name: string | null;
  link_id: number | null;
  created_at: Date;
}): ThreadComment => ({
  id: r.id,
  viewId: r.view_id,
  markId: r.mark_id,
  body: r.body,
  author: {
    id: r.author_id,
    name: r.author_name ?? r.guest_name ?? FORMER_MEMBER,
    viaLink: r.author_id === null && r.guest_name !== null,
  },
  createdAt: toIso(r.created_at),
});

export class CommentRepository {
  constructor(private readonly db: Knex) {}

  private select(db: Knex = this.db) {
    return db('comments as c')
      .leftJoin('users as u', 'u.id', 'c.author_id')
      .select('c.id', 'c.view_id', 'c.mark_id', 'c.body', 'c.author_id', 'u.name as author_name', 'c.guest_name', 'c.link_id', 'c.created_at');
  }

  async insert(
    c: { viewId: number; markId: number | null; body: string; authorId: number | null; guestName?: string; linkId?: number },
    db: Knex = this.db,
  ): Promise<number> {
    const [id] = await db('comments').insert({
      view_id: c.viewId,
      mark_id: c.markId,
      body: c.body,
      author_id: c.authorId,
      guest_name: c.guestName ?? null,
      link_id: c.linkId ?? null,
    });
    return id;
  }

  async get(id: number, db: Knex = this.db): Promise<ThreadComment | null> {
    const r = await this.select(db).where('c.id', id).first();
    return r ? fromRow(r) : null;
  }

  /** One thread, oldest first: a mark's (markId) or the view's own (markId null). */
  async thread(viewId: number, markId: number | null): Promise<ThreadComment[]> {
    const q = this.select().where('c.view_id', viewId);
    if (markId === null) q.whereNull('c.mark_id');
    else q.where('c.mark_id', markId);
    return (await q.orderBy('c.id')).map(fromRow);
  }

  /** Every comment under a view, its own thread and its marks', oldest first. */
  async allForView(viewId: number): Promise<ThreadComment[]> {
    return (await this.select().where('c.view_id', viewId).orderBy('c.id')).map(fromRow);
  }
}
