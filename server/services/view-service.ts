import type { Knex } from 'knex';
import { promisify } from 'node:util';
import { gunzip as gunzipCb } from 'node:zlib';
import { NotFoundError, StaleVersionError, ValidationError } from '../errors';
import { ActivityRepository } from '../repositories/activity-repository';
import { MemberRepository, ProjectRepository } from '../repositories/project-repository';
import { SnapshotRepository, type StoredSnapshot } from '../repositories/view-repository';
import type { PublicUser } from '../schemas/auth';
import { upgradeViewState, viewState, type CreateViewBody, type ListViewsQuery, type SnapshotInfo, type UpdateViewBody, type ViewDetail, type ViewList, type ViewState } from '../schemas/views';
import { SNAPSHOT_CONTENT_TYPE } from '../../workers/io/snapshot-format';
import { NOTHING_TO_FOLLOW, type FollowUp, type NotificationService } from './notification-service';
import { checkSnapshot, type UploadedSnapshot } from './snapshot-upload';
import { ViewAccess } from './view-access';

const gunzip = promisify(gunzipCb);

/** A stored state in the newest shape; a state no version reads any more is passed on as stored. */
export function readViewState(stored: unknown): ViewState {
  const parsed = viewState.safeParse(stored);
  return parsed.success ? upgradeViewState(parsed.data) : (stored as ViewState);
}

export type { UploadedSnapshot } from './snapshot-upload';

/** Saved views: every member reads, engineers and leads save, the author or a lead changes, a lead archives. */
export class ViewService {
  private readonly access: ViewAccess;
  private readonly snapshots: SnapshotRepository;
  private readonly activity: ActivityRepository;
  private readonly projects: ProjectRepository;
  private readonly members: MemberRepository;

  constructor(
    private readonly db: Knex,
    private readonly notifications: NotificationService,
  ) {
    this.access = new ViewAccess(db);
    this.snapshots = new SnapshotRepository(db);
    this.activity = new ActivityRepository(db);
    this.projects = new ProjectRepository(db);
    this.members = new MemberRepository(db);
  }

  private get views() {
    return this.access.views;
  }

  async detail(viewId: number, db: Knex = this.db): Promise<ViewDetail> {
    const d = await this.views.detail(viewId, db);
    if (!d) throw new NotFoundError('View not found.');
    return { ...d, state: readViewState(d.state) };
  }

  async list(user: PublicUser, projectId: number, query: ListViewsQuery): Promise<ViewList> {
    await this.access.project(projectId, user.id, 'viewer');
    const { views, total } = await this.views.list(projectId, query);
    return { views, total, page: query.page, pageSize: query.pageSize };
  }

  async create(user: PublicUser, projectId: number, body: CreateViewBody): Promise<ViewDetail> {
    await this.access.project(projectId, user.id, 'engineer', true);
    if (body.recordingId !== null && !(await this.views.recordingInProject(projectId, body.recordingId))) {
      throw new ValidationError({ recordingId: 'No such recording is registered in this project.' });
    }
    const id = await this.db.transaction(async (trx) => {
      const viewId = await this.views.insert({ projectId, recordingId: body.recordingId, title: body.title, state: body.state, createdBy: user.id }, trx);
      await this.activity.add(
        { projectId, actorId: user.id, verb: 'saved', objectType: 'view', objectId: viewId, summary: `saved the view ${body.title}` },
        trx,
      );
      return viewId;
    });
    return this.detail(id);
  }

  async get(user: PublicUser, viewId: number): Promise<ViewDetail> {
    await this.access.open(user.id, viewId, 'viewer');
    return this.detail(viewId);
  }

  /** Changes the title or the state, only from the version the caller last read (else 409 with the current view). */
  async update(user: PublicUser, viewId: number, body: UpdateViewBody): Promise<ViewDetail> {
    const { view, role } = await this.access.open(user.id, viewId, 'engineer', true);
    ViewAccess.requireAuthorOrLead(role, view.createdBy, user.id, 'the view');
    ViewAccess.requireNotArchived(view);
    const updated = await this.db.transaction(async (trx) => {
      if (!(await this.views.updateIfVersion(viewId, body.version, { title: body.title, state: body.state }, trx))) return false;
      const title = body.title ?? view.title;
      await this.activity.add(
        {
          projectId: view.projectId,
          actorId: user.id,
          verb: 'updated',
          objectType: 'view',
          objectId: viewId,
          summary: body.title && body.title !== view.title ? `renamed the view ${view.title} to ${title}` : `updated the view ${title}`,
        },
        trx,
      );
      return true;
    });
    if (!updated) {
      throw new StaleVersionError(
        `This view was changed by someone else in the meantime (you edited version ${body.version}). The current view is attached.`,
        await this.detail(viewId),
      );
    }
    return this.detail(viewId);
  }

  async remove(user: PublicUser, viewId: number): Promise<void> {
    const { view, role } = await this.access.open(user.id, viewId, 'engineer', true);
    ViewAccess.requireAuthorOrLead(role, view.createdBy, user.id, 'the view');
    await this.db.transaction(async (trx) => {
      // marks, comments, share links and the snapshot go with the view (ON DELETE CASCADE)
      await this.views.remove(viewId, trx);
      await this.activity.add(
        { projectId: view.projectId, actorId: user.id, verb: 'deleted', objectType: 'view', objectId: viewId, summary: `deleted the view ${view.title}` },
        trx,
      );
    });
  }

  async setArchived(user: PublicUser, viewId: number, archived: boolean): Promise<ViewDetail> {
    const { view } = await this.access.open(user.id, viewId, 'lead', true);
    if (Boolean(view.archivedAt) !== archived) {
      await this.db.transaction(async (trx) => {
        await this.views.setArchived(viewId, archived, trx);
        await this.activity.add(
          {
            projectId: view.projectId,
            actorId: user.id,
            verb: archived ? 'archived' : 'restored',
            objectType: 'view',
            objectId: viewId,
            summary: `${archived ? 'archived' : 'restored'} the view ${view.title}`,
          },
          trx,
        );
      });
    }
    return this.detail(viewId);
  }

  // -------------------------------------------------------------- snapshot

  /**
   * The role check for an upload, run before the file is read (so nobody else's bytes are taken in);
   * putSnapshot checks again with the file.
   */
  async mayUploadSnapshot(user: PublicUser, viewId: number): Promise<void> {
    const { view, role } = await this.access.open(user.id, viewId, 'engineer', true);
    ViewAccess.requireAuthorOrLead(role, view.createdBy, user.id, 'the view');
    ViewAccess.requireNotArchived(view);
  }

  async putSnapshot(user: PublicUser, viewId: number, file: UploadedSnapshot | undefined): Promise<{ snapshot: SnapshotInfo; created: boolean }> {
    const { view, role } = await this.access.open(user.id, viewId, 'engineer', true);
    ViewAccess.requireAuthorOrLead(role, view.createdBy, user.id, 'the view');
    ViewAccess.requireNotArchived(view);
    const checked = await checkSnapshot(file);
    const outcome = await this.db.transaction(async (trx) => {
      const result = await this.snapshots.put(
        {
          viewId,
          contentType: SNAPSHOT_CONTENT_TYPE,
          gzip: checked.gzip,
          rawSize: checked.rawSize,
          width: checked.width,
          height: checked.height,
          uploadedBy: user.id,
        },
        trx,
      );
      await this.views.touch(viewId, trx);
      await this.activity.add(
        {
          projectId: view.projectId,
          actorId: user.id,
          verb: 'saved-snapshot',
          objectType: 'view',
          objectId: viewId,
          summary: `saved a snapshot of the view ${view.title}`,
        },
        trx,
      );
      return result;
    });
    const detail = await this.detail(viewId);
    return { snapshot: detail.snapshot!, created: outcome === 'created' };
  }

  async getSnapshot(user: PublicUser, viewId: number): Promise<StoredSnapshot> {
    await this.access.open(user.id, viewId, 'viewer');
    return this.storedSnapshot(viewId);
  }

  /** The stored (gzip) snapshot of a view, for members and for share links. */
  async storedSnapshot(viewId: number): Promise<StoredSnapshot> {
    const snapshot = await this.snapshots.get(viewId);
    if (!snapshot) throw new NotFoundError('This view has no snapshot yet.');
    return snapshot;
  }

  static gunzip(snapshot: StoredSnapshot): Promise<Buffer> {
    return gunzip(snapshot.gzip);
  }

  // -------------------------------------------------------------- share by mail

  /** Mails a project member a link to the view (after the answer, as their settings allow). */
  async shareByMail(user: PublicUser, viewId: number, email: string): Promise<{ sharedWith: { name: string; email: string }; followUp: FollowUp }> {
    const { view } = await this.access.open(user.id, viewId, 'engineer', true);
    const recipient = (await this.members.list(view.projectId)).find((m) => m.email.toLowerCase() === email.toLowerCase());
    if (!recipient) throw new ValidationError({ email: 'Not a member of this project: invite them first, or send a share link.' });
    const project = await this.projects.findForUser(view.projectId, user.id);
    await this.activity.add({
      projectId: view.projectId,
      actorId: user.id,
      verb: 'shared',
      objectType: 'view',
      objectId: viewId,
      summary: `shared the view ${view.title} with ${recipient.name}`,
    });
    const followUp =
      recipient.userId === user.id
        ? NOTHING_TO_FOLLOW
        : () =>
            this.notifications.viewShared({
              actor: { id: user.id, name: user.name },
              view,
              projectName: project?.name ?? '',
              recipient,
            });
    return { sharedWith: { name: recipient.name, email: recipient.email }, followUp };
  }
}
