import type { Knex } from 'knex';
import { ConflictError, NotFoundError, StaleVersionError, ValidationError, type FieldErrors } from '../errors';
import { ActivityRepository } from '../repositories/activity-repository';
import { DuplicateTargetError, TargetRepository, type NewTarget } from '../repositories/target-repository';
import type { PublicUser } from '../schemas/auth';
import type { ProjectRole } from '../schemas/projects';
import type { CreateTargetBody, ImportTargetsBody, ImportTargetsResult, Target, TargetWeighting, UpdateTargetBody } from '../schemas/targets';
import {
  parseTargetCsv,
  parseTrackKey,
  targetPointsProblem,
  trackKeyText,
  type TargetCsvError,
  type TargetPoint,
  type TrackKey,
} from '../../workers/io/target-csv';
import { ProjectPolicy } from './project-policy';

const NO_TARGET = 'Target not found.';

/** The track in its one written form; the schema has checked it already, this is the pure code's word on it. */
function trackText(text: string): string {
  const key = parseTrackKey(text);
  if (!key) throw new ValidationError({ track: 'Name the track as order:K, family:M:N or overall.' });
  return trackKeyText(key);
}

function checkPoints(points: TargetPoint[]): TargetPoint[] {
  const problem = targetPointsProblem(points);
  if (problem) throw new ValidationError({ points: problem });
  return points;
}

const targetName = (t: { track: string; weighting: TargetWeighting }) => `${t.track} (${t.weighting}-weighted)`;

function duplicate(t: { track: string; weighting: TargetWeighting }): ConflictError {
  return new ConflictError(`This project has a target for ${targetName(t)} already; change that one instead.`, {
    track: `${t.track} has an ${t.weighting}-weighted target already.`,
  });
}

/** Overall first, then the orders by number, then the carrier families by m and n; A before Z. */
const RANK: Record<TrackKey['kind'], number> = { overall: 0, order: 1, family: 2 };
function byTrack(a: Target, b: Target): number {
  const ka = parseTrackKey(a.track);
  const kb = parseTrackKey(b.track);
  if (!ka || !kb) return a.track.localeCompare(b.track);
  if (ka.kind !== kb.kind) return RANK[ka.kind] - RANK[kb.kind];
  if (ka.kind === 'order' && kb.kind === 'order' && ka.order !== kb.order) return ka.order - kb.order;
  if (ka.kind === 'family' && kb.kind === 'family' && (ka.m !== kb.m || ka.n !== kb.n)) return ka.m - kb.m || ka.n - kb.n;
  return a.weighting.localeCompare(b.weighting);
}

/** The reader's errors as the one error shape's fields: `line 4: rpm` → what is wrong there. */
export function csvFieldErrors(errors: TargetCsvError[]): FieldErrors {
  const fields: FieldErrors = {};
  for (const e of errors) fields[e.row === 0 ? 'csv' : `line ${e.row}: ${e.field === 'file' ? 'header' : e.field}`] ??= e.message;
  return fields;
}

/**
 * A project's targets (limit curves of a track's level against speed). Every member reads them; engineers
 * and leads make, change, remove and import them; an archived project's are read-only (409).
 */
export class TargetService {
  private readonly targets: TargetRepository;
  private readonly activity: ActivityRepository;
  private readonly policy: ProjectPolicy;

  constructor(private readonly db: Knex) {
    this.targets = new TargetRepository(db);
    this.activity = new ActivityRepository(db);
    this.policy = new ProjectPolicy(db);
  }

  /** The target and the caller's role in its project; a non-member gets the same 404 as for a target that is not there. */
  private async openTarget(user: PublicUser, targetId: number, min: ProjectRole): Promise<Target> {
    const target = await this.targets.get(targetId);
    if (!target) throw new NotFoundError(NO_TARGET);
    try {
      await this.policy.requireWritable(target.projectId, user.id, min);
    } catch (e) {
      if (e instanceof NotFoundError) throw new NotFoundError(NO_TARGET);
      throw e;
    }
    return target;
  }

  private async sorted(projectId: number, db: Knex = this.db): Promise<Target[]> {
    return (await this.targets.list(projectId, db)).sort(byTrack);
  }

  async list(user: PublicUser, projectId: number): Promise<Target[]> {
    await this.policy.require(projectId, user.id, 'viewer');
    return this.sorted(projectId);
  }

  async create(user: PublicUser, projectId: number, body: CreateTargetBody): Promise<Target> {
    await this.policy.requireWritable(projectId, user.id, 'engineer');
    const target: NewTarget = { track: trackText(body.track), weighting: body.weighting, points: checkPoints(body.points), label: body.label };
    try {
      const id = await this.db.transaction(async (trx) => {
        const targetId = await this.targets.insert(projectId, target, user.id, trx);
        await this.activity.add(
          { projectId, actorId: user.id, verb: 'set', objectType: 'target', objectId: targetId, summary: `set a target for ${targetName(target)}` },
          trx,
        );
        return targetId;
      });
      return (await this.targets.get(id))!;
    } catch (e) {
      if (e instanceof DuplicateTargetError) throw duplicate(target);
      throw e;
    }
  }

  /** Changes the target only from the version the caller last read (else 409 with the current target). */
  async update(user: PublicUser, targetId: number, body: UpdateTargetBody): Promise<Target> {
    const before = await this.openTarget(user, targetId, 'engineer');
    const changes: Partial<NewTarget> = {
      track: body.track === undefined ? undefined : trackText(body.track),
      weighting: body.weighting,
      points: body.points === undefined ? undefined : checkPoints(body.points),
      label: body.label,
    };
    const after = { track: changes.track ?? before.track, weighting: changes.weighting ?? before.weighting };
    let updated: boolean;
    try {
      updated = await this.db.transaction(async (trx) => {
        if (!(await this.targets.updateIfVersion(targetId, body.version, changes, trx))) return false;
        await this.activity.add(
          { projectId: before.projectId, actorId: user.id, verb: 'changed', objectType: 'target', objectId: targetId, summary: `changed the target for ${targetName(after)}` },
          trx,
        );
        return true;
      });
    } catch (e) {
      if (e instanceof DuplicateTargetError) throw duplicate(after);
      throw e;
    }
    const current = await this.targets.get(targetId);
    if (!current) throw new NotFoundError(NO_TARGET); // removed in the meantime
    if (!updated) {
      throw new StaleVersionError(
        `This target was changed by someone else in the meantime (you edited version ${body.version}). The current target is attached.`,
        current,
      );
    }
    return current;
  }

  async remove(user: PublicUser, targetId: number): Promise<void> {
    const target = await this.openTarget(user, targetId, 'engineer');
    await this.db.transaction(async (trx) => {
      await this.targets.remove(targetId, trx);
      await this.activity.add(
        { projectId: target.projectId, actorId: user.id, verb: 'removed', objectType: 'target', objectId: targetId, summary: `removed the target for ${targetName(target)}` },
        trx,
      );
    });
  }

  /**
   * Targets from a CSV file (track,rpm,db), all of the body's weighting. A file with any bad row stores
   * nothing (400 naming each line and field). Otherwise, in one transaction, each target is stored or its
   * points replace those of the project's target of the same track and weighting; with `replace`, the
   * project's targets of that weighting become exactly those of the file (the others
   * of that weighting are removed).
   */
  async importCsv(user: PublicUser, projectId: number, body: ImportTargetsBody): Promise<ImportTargetsResult> {
    await this.policy.requireWritable(projectId, user.id, 'engineer');
    const parsed = parseTargetCsv(body.csv);
    if (!parsed.ok) {
      const n = parsed.errors.length;
      throw new ValidationError(
        csvFieldErrors(parsed.errors),
        `The CSV has ${n === 1 ? 'a problem' : `${n}${n === 50 ? ' or more' : ''} problems`}; nothing was imported.`,
      );
    }
    const incoming: NewTarget[] = parsed.targets.map((t) => ({
      track: trackKeyText(t.track),
      weighting: body.weighting,
      points: t.points,
      label: null,
    }));
    return this.db.transaction(async (trx) => {
      const existing = new Set(await this.targets.tracksOf(projectId, body.weighting, trx));
      const removed = body.replace ? await this.targets.removeWeightingExcept(projectId, body.weighting, incoming.map((t) => t.track), trx) : 0;
      await this.targets.upsertPoints(projectId, incoming, user.id, trx);
      const updated = incoming.filter((t) => existing.has(t.track)).length;
      const created = incoming.length - updated;
      await this.activity.add(
        {
          projectId,
          actorId: user.id,
          verb: 'imported',
          objectType: 'target',
          summary: `imported ${incoming.length} ${body.weighting}-weighted target${incoming.length === 1 ? '' : 's'}${body.replace ? ' (replacing the others)' : ''}`,
        },
        trx,
      );
      return { targets: await this.sorted(projectId, trx), created, updated, removed };
    });
  }
}
