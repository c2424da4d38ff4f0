/**
 * A view saved whole from the Bench: its state, its snapshot and the marks placed on it, stored in one
 * transaction, so a server or database that dies in the middle leaves either all of it or nothing (never a
 * view without its picture, or half its marks). The same for saving changes into a view.
 */
import type { Knex } from 'knex';
import { StaleVersionError, ValidationError } from '../errors';
import { ActivityRepository } from '../repositories/activity-repository';
import { MarkRepository } from '../repositories/mark-repository';
import { SnapshotRepository } from '../repositories/view-repository';
import type { PublicUser } from '../schemas/auth';
import { type CreateMarkBody, type Mark, type SaveViewBody, type SaveViewChangesBody, type ViewDetail } from '../schemas/views';
import { SNAPSHOT_CONTENT_TYPE } from '../../workers/io/snapshot-format';
import { short } from './mark-service';
import type { FollowUp, NotificationService } from './notification-service';
import { checkSnapshot, type CheckedSnapshot, type UploadedSnapshot } from './snapshot-upload';
import { ViewAccess } from './view-access';
import type { ViewService } from './view-service';

export interface SavedWhole {
  view: ViewDetail;
  marks: Mark[];
  followUp: FollowUp;
}

export class ViewSaveService {
  private readonly access: ViewAccess;
  private readonly snapshots: SnapshotRepository;
  private readonly marks: MarkRepository;
  private readonly activity: ActivityRepository;

  constructor(
    private readonly db: Knex,
    private readonly views: ViewService,
    private readonly notifications: NotificationService,
  ) {
    this.access = new ViewAccess(db);
    this.snapshots = new SnapshotRepository(db);
    this.marks = new MarkRepository(db);
    this.activity = new ActivityRepository(db);
  }

  /** The role check for a new view, run before the upload is read. */
  async mayCreate(user: PublicUser, projectId: number): Promise<void> {
    await this.access.project(projectId, user.id, 'engineer', true);
  }

  async saveNew(user: PublicUser, projectId: number, body: SaveViewBody, file: UploadedSnapshot | undefined): Promise<SavedWhole> {
    await this.mayCreate(user, projectId);
    if (body.recordingId !== null && !(await this.access.views.recordingInProject(projectId, body.recordingId))) {
      throw new ValidationError({ recordingId: 'No such recording is registered in this project.' });
    }
    const snapshot = await checkSnapshot(file);
    const { viewId, markIds } = await this.db.transaction(async (trx) => {
      const viewId = await this.access.views.insert(
        { projectId, recordingId: body.recordingId, title: body.title, state: body.state, createdBy: user.id },
        trx,
      );
      await this.activity.add(
        { projectId, actorId: user.id, verb: 'saved', objectType: 'view', objectId: viewId, summary: `saved the view ${body.title}` },
        trx,
      );
      await this.putSnapshot(viewId, snapshot, user.id, trx);
      const markIds = await this.placeMarks(user, { id: viewId, projectId, title: body.title }, body.marks, trx);
      return { viewId, markIds };
    });
    return this.answer(user, viewId, markIds, body.marks);
  }

  async saveChanges(user: PublicUser, viewId: number, body: SaveViewChangesBody, file: UploadedSnapshot | undefined): Promise<SavedWhole> {
    const { view, role } = await this.access.open(user.id, viewId, 'engineer', true);
    ViewAccess.requireAuthorOrLead(role, view.createdBy, user.id, 'the view');
    ViewAccess.requireNotArchived(view);
    const snapshot = await checkSnapshot(file);
    const title = body.title ?? view.title;
    const markIds = await this.db.transaction(async (trx) => {
      if (!(await this.access.views.updateIfVersion(viewId, body.version, { title: body.title, state: body.state }, trx))) return null;
      await this.activity.add(
        { projectId: view.projectId, actorId: user.id, verb: 'updated', objectType: 'view', objectId: viewId, summary: `updated the view ${title}` },
        trx,
      );
      await this.putSnapshot(viewId, snapshot, user.id, trx);
      return this.placeMarks(user, { id: viewId, projectId: view.projectId, title }, body.marks, trx);
    });
    if (markIds === null) {
      throw new StaleVersionError(
        `This view was changed by someone else in the meantime (you edited version ${body.version}). The current view is attached.`,
        await this.views.detail(viewId),
      );
    }
    return this.answer(user, viewId, markIds, body.marks);
  }

  private async putSnapshot(viewId: number, s: CheckedSnapshot, userId: number, trx: Knex): Promise<void> {
    await this.snapshots.put(
      { viewId, contentType: SNAPSHOT_CONTENT_TYPE, gzip: s.gzip, rawSize: s.rawSize, width: s.width, height: s.height, uploadedBy: userId },
      trx,
    );
  }

  private async placeMarks(user: PublicUser, view: { id: number; projectId: number; title: string }, marks: CreateMarkBody[], trx: Knex): Promise<number[]> {
    const ids: number[] = [];
    for (const m of marks) {
      const id = await this.marks.insert({ viewId: view.id, kind: m.kind, geometry: m.geometry, text: m.text, authorId: user.id }, trx);
      await this.activity.add(
        {
          projectId: view.projectId,
          actorId: user.id,
          verb: 'placed',
          objectType: 'mark',
          objectId: id,
          summary: `placed a ${m.kind} mark on ${view.title}${m.text ? `: ${short(m.text)}` : ''}`,
        },
        trx,
      );
      ids.push(id);
    }
    return ids;
  }

  private async answer(user: PublicUser, viewId: number, markIds: number[], marks: CreateMarkBody[]): Promise<SavedWhole> {
    const view = await this.views.detail(viewId);
    const placed = (await this.marks.list(viewId)).filter((m) => markIds.includes(m.id));
    const ref = { id: view.id, projectId: view.projectId, title: view.title, createdBy: view.author?.id ?? null };
    return {
      view,
      marks: placed,
      followUp: async () => {
        for (let i = 0; i < markIds.length; i++) {
          await this.notifications.markWritten({ actor: user, view: ref, markId: markIds[i], text: marks[i].text });
        }
      },
    };
  }
}
