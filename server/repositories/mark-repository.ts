import type { Knex } from 'knex';
import type { Mark, MarkGeometry, MarkKind } from '../schemas/views';
import { parseJson, toIso } from './view-repository';

export interface MarkRecord {
  id: number;
  viewId: number;
  kind: MarkKind;
  geometry: MarkGeometry;
  text: string;
  authorId: number | null;
  version: number;
}

const fromRow = (r: {
  id: number;
  view_id: number;
  kind: MarkKind;
  geometry: string | MarkGeometry;
  body: string;
  author_id: number | null;
  author_name: string | null;
  version: number;
  created_at: Date;
  updated_at: Date;
  comment_count: number | string;
}): Mark => ({
  id: r.id,
  viewId: r.view_id,
  kind: r.kind,
  geometry: parseJson(r.geometry),
  text: r.body,
  version: r.version,
  author: r.author_id ? { id: r.author_id, name: r.author_name ?? '' } : null,
  createdAt: toIso(r.created_at),
  updatedAt: toIso(r.updated_at),
  commentCount: Number(r.comment_count),
});

export class MarkRepository {
  constructor(private readonly db: Knex) {}

  private select(db: Knex = this.db) {
    return db('marks as k')
      .leftJoin('users as u', 'u.id', 'k.author_id')
      .select(
        'k.id',
        'k.view_id',
        'k.kind',
        'k.geometry',
        'k.body',
        'k.author_id',
        'u.name as author_name',
        'k.version',
        'k.created_at',
        'k.updated_at',
        db('comments as c').count('*').whereRaw('c.mark_id = k.id').as('comment_count'),
      );
  }

  async insert(
    m: { viewId: number; kind: MarkKind; geometry: MarkGeometry; text: string; authorId: number },
    db: Knex = this.db,
  ): Promise<number> {
    const [id] = await db('marks').insert({
      view_id: m.viewId,
      kind: m.kind,
      geometry: JSON.stringify(m.geometry),
      body: m.text,
      author_id: m.authorId,
    });
    return id;
  }

  async find(id: number, db: Knex = this.db): Promise<MarkRecord | null> {
    const r = await db('marks').where({ id }).first('id', 'view_id', 'kind', 'geometry', 'body', 'author_id', 'version');
    return r
      ? { id: r.id, viewId: r.view_id, kind: r.kind, geometry: parseJson(r.geometry), text: r.body, authorId: r.author_id, version: r.version }
      : null;
  }

  async get(id: number, db: Knex = this.db): Promise<Mark | null> {
    const r = await this.select(db).where('k.id', id).first();
    return r ? fromRow(r) : null;
  }

  /** A view's marks in the order they were placed. */
  async list(viewId: number): Promise<Mark[]> {
    return (await this.select().where('k.view_id', viewId).orderBy('k.id')).map(fromRow);
  }

  async updateIfVersion(
    id: number,
    version: number,
    changes: { text?: string; kind?: MarkKind; geometry?: MarkGeometry },
    db: Knex = this.db,
  ): Promise<boolean> {
    const row: Record<string, unknown> = { version: db.raw('version + 1'), updated_at: db.fn.now() };
    if (changes.text !== undefined) row.body = changes.text;
    if (changes.kind !== undefined) row.kind = changes.kind;
    if (changes.geometry !== undefined) row.geometry = JSON.stringify(changes.geometry);
    return (await db('marks').where({ id, version }).update(row)) === 1;
  }

  async remove(id: number, db: Knex = this.db): Promise<void> {
    await db('marks').where({ id }).delete();
  }
}
