import type { Knex } from 'knex';
import type { ProjectRole } from '../schemas/projects';
import type { ListViewsQuery, SnapshotInfo, ViewDetail, ViewState, ViewSummary } from '../schemas/views';

export const parseJson = <T>(v: string | T): T => (typeof v === 'string' ? (JSON.parse(v) as T) : v);
export const toIso = (d: Date | string) => new Date(d).toISOString();
const toIsoOrNull = (d: Date | string | null) => (d ? toIso(d) : null);

/** The columns of one view that rules need (who made it, where it lives, whether it is archived). */
export interface ViewRecord {
  id: number;
  projectId: number;
  recordingId: number | null;
  title: string;
  state: unknown;
  version: number;
  createdBy: number | null;
  archivedAt: Date | null;
}

interface ViewRow {
  id: number;
  project_id: number;
  recording_id: number | null;
  title: string;
  state: string | object;
  version: number;
  created_by: number | null;
  archived_at: Date | null;
}

const fromRow = (r: ViewRow): ViewRecord => ({
  id: r.id,
  projectId: r.project_id,
  recordingId: r.recording_id,
  title: r.title,
  state: parseJson(r.state),
  version: r.version,
  createdBy: r.created_by,
  archivedAt: r.archived_at ? new Date(r.archived_at) : null,
});

/** LIKE pattern for "contains", with the pattern characters of the text escaped. */
const contains = (text: string) => `%${text.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;

const SORT_COLUMNS: Record<ListViewsQuery['sort'], string> = {
  updated: 'v.updated_at',
  created: 'v.created_at',
  title: 'v.title',
  author: 'u.name',
  recording: 'r.name',
  threads: 'open_threads',
};

export class ViewRepository {
  constructor(private readonly db: Knex) {}

  async insert(
    v: { projectId: number; recordingId: number | null; title: string; state: ViewState; createdBy: number },
    db: Knex = this.db,
  ): Promise<number> {
    const [id] = await db('views').insert({
      project_id: v.projectId,
      recording_id: v.recordingId,
      title: v.title,
      state: JSON.stringify(v.state),
      created_by: v.createdBy,
    });
    return id;
  }

  /** The view with the caller's role in its project and whether the project is archived: one query. */
  async findWithAccess(id: number, userId: number): Promise<{ view: ViewRecord; role: ProjectRole | null; projectArchived: boolean } | null> {
    const row = await this.db('views as v')
      .join('projects as p', 'p.id', 'v.project_id')
      .leftJoin('project_members as m', (j) => j.on('m.project_id', '=', 'v.project_id').andOnVal('m.user_id', '=', userId))
      .where('v.id', id)
      .first(
        'v.id',
        'v.project_id',
        'v.recording_id',
        'v.title',
        'v.state',
        'v.version',
        'v.created_by',
        'v.archived_at',
        'm.role',
        'p.archived_at as project_archived_at',
      );
    if (!row) return null;
    return { view: fromRow(row as ViewRow), role: row.role ?? null, projectArchived: Boolean(row.project_archived_at) };
  }

  async find(id: number, db: Knex = this.db): Promise<ViewRecord | null> {
    const row: ViewRow | undefined = await db('views')
      .where({ id })
      .first('id', 'project_id', 'recording_id', 'title', 'state', 'version', 'created_by', 'archived_at');
    return row ? fromRow(row) : null;
  }

  async recordingInProject(projectId: number, recordingId: number): Promise<boolean> {
    return Boolean(await this.db('recordings').where({ id: recordingId, project_id: projectId }).first('id'));
  }

  /** The view with its author, recording and snapshot facts; `state` as stored (the service parses it). */
  async detail(id: number, db: Knex = this.db): Promise<Omit<ViewDetail, 'state'> & { state: unknown } | null> {
    const r = await db('views as v')
      .leftJoin('users as u', 'u.id', 'v.created_by')
      .leftJoin('recordings as r', 'r.id', 'v.recording_id')
      .leftJoin('view_snapshots as s', 's.view_id', 'v.id')
      .where('v.id', id)
      .first(
        'v.id',
        'v.project_id',
        'v.title',
        'v.recording_id',
        'r.name as recording_name',
        'v.state',
        'v.version',
        'v.created_by',
        'u.name as author_name',
        'v.created_at',
        'v.updated_at',
        'v.archived_at',
        's.raw_size',
        db.raw('OCTET_LENGTH(s.gzip_bytes) as stored_size'),
        's.width',
        's.height',
        's.updated_at as snapshot_updated_at',
      );
    if (!r) return null;
    const snapshot: SnapshotInfo | null =
      r.raw_size == null
        ? null
        : {
            rawSize: Number(r.raw_size),
            storedSize: Number(r.stored_size),
            width: Number(r.width),
            height: Number(r.height),
            updatedAt: toIso(r.snapshot_updated_at),
          };
    return {
      id: r.id,
      projectId: r.project_id,
      title: r.title,
      recordingId: r.recording_id,
      recordingName: r.recording_name ?? null,
      state: parseJson(r.state),
      version: r.version,
      author: r.created_by ? { id: r.created_by, name: r.author_name } : null,
      createdAt: toIso(r.created_at),
      updatedAt: toIso(r.updated_at),
      archived: r.archived_at !== null,
      archivedAt: toIsoOrNull(r.archived_at),
      snapshot,
    };
  }

  /** Applies the changes only if the view is still at `version`; false when someone saved in between. */
  async updateIfVersion(
    id: number,
    version: number,
    changes: { title?: string; state?: ViewState },
    db: Knex = this.db,
  ): Promise<boolean> {
    const row: Record<string, unknown> = { version: db.raw('version + 1'), updated_at: db.fn.now() };
    if (changes.title !== undefined) row.title = changes.title;
    if (changes.state !== undefined) row.state = JSON.stringify(changes.state);
    return (await db('views').where({ id, version }).update(row)) === 1;
  }

  /** A change under the view (a mark, a comment, a snapshot) makes it the most recently updated. */
  async touch(id: number, db: Knex = this.db): Promise<void> {
    await db('views').where({ id }).update({ updated_at: db.fn.now() });
  }

  async setArchived(id: number, archived: boolean, db: Knex = this.db): Promise<void> {
    await db('views')
      .where({ id })
      .update({ archived_at: archived ? db.fn.now() : null });
  }

  async remove(id: number, db: Knex = this.db): Promise<void> {
    await db('views').where({ id }).delete();
  }

  /** One page of a project's views for the overview, with the total that matches the filter. */
  async list(projectId: number, q: ListViewsQuery): Promise<{ views: ViewSummary[]; total: number }> {
    const db = this.db;
    const filtered = () => {
      const query = db('views as v')
        .leftJoin('users as u', 'u.id', 'v.created_by')
        .leftJoin('recordings as r', 'r.id', 'v.recording_id')
        .where('v.project_id', projectId);
      if (q.archived === 'exclude') query.whereNull('v.archived_at');
      if (q.archived === 'only') query.whereNotNull('v.archived_at');
      for (const word of q.q.split(/\s+/).filter(Boolean)) {
        const pattern = contains(word);
        query.where((w) => w.where('v.title', 'like', pattern).orWhere('u.name', 'like', pattern).orWhere('r.name', 'like', pattern));
      }
      return query;
    };
    const order = q.order ?? (q.sort === 'title' || q.sort === 'author' || q.sort === 'recording' ? 'asc' : 'desc');
    const rows = await filtered()
      .select(
        'v.id',
        'v.title',
        'u.name as author_name',
        'v.recording_id',
        'r.name as recording_name',
        'v.created_at',
        'v.updated_at',
        'v.archived_at',
        db('marks as m').count('*').whereRaw('m.view_id = v.id').as('mark_count'),
        // a thread is each mark's plus the view's own (mark_id null, counted as 0)
        db('comments as c').select(db.raw('COUNT(DISTINCT IFNULL(c.mark_id, 0))')).whereRaw('c.view_id = v.id').as('open_threads'),
        db('view_snapshots as s').count('*').whereRaw('s.view_id = v.id').as('has_snapshot'),
        // the number of matches before paging, in the same query (a window over the filtered rows)
        db.raw('COUNT(*) OVER () AS total_count'),
      )
      .orderBy([
        { column: SORT_COLUMNS[q.sort], order },
        { column: 'v.id', order: 'desc' },
      ])
      .limit(q.pageSize)
      .offset((q.page - 1) * q.pageSize);
    // past the last page no row carries the total: count then (rare)
    const total = rows.length ? Number(rows[0].total_count) : Number((await filtered().count({ n: '*' }))[0].n);
    return {
      total,
      views: rows.map((r) => ({
        id: r.id,
        title: r.title,
        authorName: r.author_name ?? null,
        recordingId: r.recording_id,
        recordingName: r.recording_name ?? null,
        createdAt: toIso(r.created_at),
        updatedAt: toIso(r.updated_at),
        markCount: Number(r.mark_count),
        openThreads: Number(r.open_threads),
        archived: r.archived_at !== null,
        hasSnapshot: Number(r.has_snapshot) > 0,
      })),
    };
  }
}

export interface StoredSnapshot {
  contentType: string;
  gzip: Buffer;
  rawSize: number;
  updatedAt: string;
}

export class SnapshotRepository {
  constructor(private readonly db: Knex) {}

  /** Writes the view's snapshot, replacing the one it had. */
  async put(
    s: { viewId: number; contentType: string; gzip: Buffer; rawSize: number; width: number; height: number; uploadedBy: number },
    db: Knex = this.db,
  ): Promise<'created' | 'replaced'> {
    const existed = Boolean(await db('view_snapshots').where({ view_id: s.viewId }).forUpdate().first('view_id'));
    await db('view_snapshots')
      .insert({
        view_id: s.viewId,
        content_type: s.contentType,
        gzip_bytes: s.gzip,
        raw_size: s.rawSize,
        width: s.width,
        height: s.height,
        uploaded_by: s.uploadedBy,
      })
      .onConflict('view_id')
      .merge({
        content_type: s.contentType,
        gzip_bytes: s.gzip,
        raw_size: s.rawSize,
        width: s.width,
        height: s.height,
        uploaded_by: s.uploadedBy,
        updated_at: db.fn.now(),
      });
    return existed ? 'replaced' : 'created';
  }

  async get(viewId: number): Promise<StoredSnapshot | null> {
    const r = await this.db('view_snapshots').where({ view_id: viewId }).first('content_type', 'gzip_bytes', 'raw_size', 'updated_at');
    return r
      ? { contentType: r.content_type, gzip: Buffer.from(r.gzip_bytes), rawSize: Number(r.raw_size), updatedAt: toIso(r.updated_at) }
      : null;
  }
}
