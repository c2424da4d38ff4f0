import type { Knex } from 'knex';
import type { Target, TargetWeighting } from '../schemas/targets';
import { parseJson, toIso } from './view-repository';

type Points = [number, number][];

interface TargetRow {
  id: number;
  project_id: number;
  track: string;
  weighting: TargetWeighting;
  points: string | Points;
  label: string | null;
  created_by: number | null;
  created_by_name: string | null;
  version: number;
  created_at: Date;
  updated_at: Date;
}

const fromRow = (r: TargetRow): Target => ({
  id: r.id,
  projectId: r.project_id,
  track: r.track,
  weighting: r.weighting,
  points: parseJson(r.points),
  label: r.label,
  version: r.version,
  createdBy: r.created_by ? { id: r.created_by, name: r.created_by_name ?? '' } : null,
  createdAt: toIso(r.created_at),
  updatedAt: toIso(r.updated_at),
});

/** A second target of the same (project, track, weighting). */
export class DuplicateTargetError extends Error {
  constructor() {
    super('A target of this track and weighting exists already in the project.');
    this.name = 'DuplicateTargetError';
  }
}

const isDuplicateKey = (e: unknown) => (e as { code?: string }).code === 'ER_DUP_ENTRY';

async function unlessDuplicate<T>(work: Promise<T>): Promise<T> {
  try {
    return await work;
  } catch (e) {
    if (isDuplicateKey(e)) throw new DuplicateTargetError();
    throw e;
  }
}

export interface NewTarget {
  track: string;
  weighting: TargetWeighting;
  points: Points;
  label: string | null;
}

export class TargetRepository {
  constructor(private readonly db: Knex) {}

  private select(db: Knex = this.db) {
    return db('targets as t')
      .leftJoin('users as u', 'u.id', 't.created_by')
      .select(
        't.id',
        't.project_id',
        't.track',
        't.weighting',
        't.points',
        't.label',
        't.created_by',
        'u.name as created_by_name',
        't.version',
        't.created_at',
        't.updated_at',
      );
  }

  async get(id: number, db: Knex = this.db): Promise<Target | null> {
    const row = await this.select(db).where('t.id', id).first();
    return row ? fromRow(row) : null;
  }

  /** The project's targets, in the order they were made (the service sorts them for reading). */
  async list(projectId: number, db: Knex = this.db): Promise<Target[]> {
    return (await this.select(db).where('t.project_id', projectId).orderBy('t.id')).map(fromRow);
  }

  /** The tracks the project has targets for in one weighting. */
  async tracksOf(projectId: number, weighting: TargetWeighting, db: Knex = this.db): Promise<string[]> {
    return (await db('targets').where({ project_id: projectId, weighting }).select('track')).map((r: { track: string }) => r.track);
  }

  /** Throws DuplicateTargetError when the project has one of this track and weighting. */
  async insert(projectId: number, t: NewTarget, createdBy: number, db: Knex = this.db): Promise<number> {
    const [id] = await unlessDuplicate(
      db('targets').insert({
        project_id: projectId,
        track: t.track,
        weighting: t.weighting,
        points: JSON.stringify(t.points),
        label: t.label,
        created_by: createdBy,
      }),
    );
    return id;
  }

  /**
   * Stores each target, or on a (project, track, weighting) that exists already, its new points (its label
   * stays; its version goes up). One statement.
   */
  async upsertPoints(projectId: number, targets: NewTarget[], createdBy: number, db: Knex = this.db): Promise<void> {
    if (targets.length === 0) return;
    await db('targets')
      .insert(
        targets.map((t) => ({
          project_id: projectId,
          track: t.track,
          weighting: t.weighting,
          points: JSON.stringify(t.points),
          label: t.label,
          created_by: createdBy,
        })),
      )
      .onConflict(['project_id', 'track', 'weighting'])
      .merge({ points: db.raw('VALUES(??)', ['points']), version: db.raw('?? + 1', ['version']), updated_at: db.fn.now() });
  }

  /** Applies the changes only if the target is still at `version`; false when someone saved in between. */
  async updateIfVersion(id: number, version: number, changes: Partial<NewTarget>, db: Knex = this.db): Promise<boolean> {
    const row: Record<string, unknown> = { version: db.raw('version + 1'), updated_at: db.fn.now() };
    if (changes.track !== undefined) row.track = changes.track;
    if (changes.weighting !== undefined) row.weighting = changes.weighting;
    if (changes.points !== undefined) row.points = JSON.stringify(changes.points);
    if (changes.label !== undefined) row.label = changes.label;
    return (await unlessDuplicate(db('targets').where({ id, version }).update(row))) === 1;
  }

  async remove(id: number, db: Knex = this.db): Promise<void> {
    await db('targets').where({ id }).delete();
  }

  /** Removes the project's targets of one weighting but those of the tracks in `keep`; answers how many went. */
  async removeWeightingExcept(projectId: number, weighting: TargetWeighting, keep: string[], db: Knex = this.db): Promise<number> {
    const q = db('targets').where({ project_id: projectId, weighting });
    return (keep.length ? q.whereNotIn('track', keep) : q).delete();
  }
}
