import type { Knex } from 'knex';
import { NotFoundError, StaleVersionError } from '../errors';
import { ActivityRepository } from '../repositories/activity-repository';
import { CommentRepository } from '../repositories/comment-repository';
import { MarkRepository, type MarkRecord } from '../repositories/mark-repository';
import type { ViewRecord } from '../repositories/view-repository';
import type { PublicUser } from '../schemas/auth';
import type { ProjectRole } from '../schemas/projects';
import type { CreateMarkBody, Mark, ThreadComment, UpdateMarkBody } from '../schemas/views';
import type { FollowUp, NotificationService } from './notification-service';
import { ViewAccess } from './view-access';

const NO_MARK = 'Mark not found.';
export const short = (text: string, max = 60) => {
  const line = text.split('\n')[0];
  return line.length > max ? `${line.slice(0, max - 1)}…` : line;
};

/**
 * Marks on a view and the threads under marks and views. Engineers and leads place marks; their author or
 * a lead edits and deletes them; every member, viewers too, reads and comments.
 */
export class MarkService {
  private readonly access: ViewAccess;
  private readonly marks: MarkRepository;
  private readonly comments: CommentRepository;
  private readonly activity: ActivityRepository;

  constructor(
    private readonly db: Knex,
    private readonly notifications: NotificationService,
  ) {
    this.access = new ViewAccess(db);
    this.marks = new MarkRepository(db);
    this.comments = new CommentRepository(db);
    this.activity = new ActivityRepository(db);
  }

  private async mark(markId: number, db: Knex = this.db): Promise<Mark> {
    const mark = await this.marks.get(markId, db);
    if (!mark) throw new NotFoundError(NO_MARK);
    return mark;
  }

  /** The mark, its view and the caller's role; a non-member gets the same 404 as for a mark that is not there. */
  private async openMark(
    user: PublicUser,
    markId: number,
    min: ProjectRole,
    writable = false,
  ): Promise<{ mark: MarkRecord; view: ViewRecord; role: ProjectRole }> {
    const mark = await this.marks.find(markId);
    if (!mark) throw new NotFoundError(NO_MARK);
    try {
      const { view, role } = await this.access.open(user.id, mark.viewId, min, writable);
      return { mark, view, role };
    } catch (e) {
      if (e instanceof NotFoundError) throw new NotFoundError(NO_MARK);
      throw e;
    }
  }

  async list(user: PublicUser, viewId: number): Promise<Mark[]> {
    await this.access.open(user.id, viewId, 'viewer');
    return this.marks.list(viewId);
  }

  async create(user: PublicUser, viewId: number, body: CreateMarkBody): Promise<{ mark: Mark; followUp: FollowUp }> {
    const { view } = await this.access.open(user.id, viewId, 'engineer', true);
    ViewAccess.requireNotArchived(view);
    const id = await this.db.transaction(async (trx) => {
      const markId = await this.marks.insert({ viewId, kind: body.kind, geometry: body.geometry, text: body.text, authorId: user.id }, trx);
      await this.activity.add(
        {
          projectId: view.projectId,
          actorId: user.id,
          verb: 'placed',
          objectType: 'mark',
          objectId: markId,
          summary: `placed a ${body.kind} mark on ${view.title}${body.text ? `: ${short(body.text)}` : ''}`,
        },
        trx,
      );
      return markId;
    });
    return {
      mark: await this.mark(id),
      followUp: () => this.notifications.markWritten({ actor: user, view, markId: id, text: body.text }),
    };
  }

  /** Changes the text or the place, only from the version the caller last read (else 409 with the current mark). */
  async update(user: PublicUser, markId: number, body: UpdateMarkBody): Promise<{ mark: Mark; followUp: FollowUp }> {
    const { mark, view, role } = await this.openMark(user, markId, 'engineer', true);
    ViewAccess.requireAuthorOrLead(role, mark.authorId, user.id, 'the mark');
    ViewAccess.requireNotArchived(view);
    const changes = { text: body.text, kind: body.place?.kind, geometry: body.place?.geometry };
    const updated = await this.db.transaction(async (trx) => {
      if (!(await this.marks.updateIfVersion(markId, body.version, changes, trx))) return false;
      await this.activity.add(
        {
          projectId: view.projectId,
          actorId: user.id,
          verb: 'edited',
          objectType: 'mark',
          objectId: markId,
          summary: `edited a mark on ${view.title}`,
        },
        trx,
      );
      return true;
    });
    if (!updated) {
      throw new StaleVersionError(
        `This mark was changed by someone else in the meantime (you edited version ${body.version}). The current mark is attached.`,
        await this.mark(markId),
      );
    }
    const text = body.text;
    return {
      mark: await this.mark(markId),
      followUp:
        text === undefined
          ? async () => undefined
          : () => this.notifications.markWritten({ actor: user, view, markId, text, previousText: mark.text }),
    };
  }

  async remove(user: PublicUser, markId: number): Promise<void> {
    const { mark, view, role } = await this.openMark(user, markId, 'engineer', true);
    ViewAccess.requireAuthorOrLead(role, mark.authorId, user.id, 'the mark');
    ViewAccess.requireNotArchived(view);
    await this.db.transaction(async (trx) => {
      // its thread goes with it (ON DELETE CASCADE)
      await this.marks.remove(markId, trx);
      await this.activity.add(
        { projectId: view.projectId, actorId: user.id, verb: 'removed', objectType: 'mark', objectId: markId, summary: `removed a mark from ${view.title}` },
        trx,
      );
    });
  }

  // -------------------------------------------------------------- threads

  async markThread(user: PublicUser, markId: number): Promise<ThreadComment[]> {
    const { mark } = await this.openMark(user, markId, 'viewer');
    return this.comments.thread(mark.viewId, markId);
  }

  async viewThread(user: PublicUser, viewId: number): Promise<ThreadComment[]> {
    await this.access.open(user.id, viewId, 'viewer');
    return this.comments.thread(viewId, null);
  }

  async commentOnMark(user: PublicUser, markId: number, body: string): Promise<{ comment: ThreadComment; followUp: FollowUp }> {
    const { mark, view } = await this.openMark(user, markId, 'viewer', true);
    return this.addComment(user, view, mark, body);
  }

  async commentOnView(user: PublicUser, viewId: number, body: string): Promise<{ comment: ThreadComment; followUp: FollowUp }> {
    const { view } = await this.access.open(user.id, viewId, 'viewer', true);
    return this.addComment(user, view, null, body);
  }

  private async addComment(
    user: PublicUser,
    view: ViewRecord,
    mark: MarkRecord | null,
    body: string,
  ): Promise<{ comment: ThreadComment; followUp: FollowUp }> {
    ViewAccess.requireNotArchived(view);
    const markId = mark?.id ?? null;
    const id = await this.db.transaction(async (trx) => {
      const commentId = await this.comments.insert({ viewId: view.id, markId, body, authorId: user.id }, trx);
      await this.activity.add(
        {
          projectId: view.projectId,
          actorId: user.id,
          verb: 'commented',
          objectType: 'comment',
          objectId: commentId,
          summary: `commented on ${mark ? 'a mark on ' : ''}${view.title}: ${short(body)}`,
        },
        trx,
      );
      return commentId;
    });
    const comment = (await this.comments.get(id))!;
    return {
      comment,
      followUp: () =>
        this.notifications.commentAdded({
          actor: user,
          view,
          markId,
          markAuthorId: mark?.authorId ?? null,
          comment: { id, body },
          viaLink: false,
        }),
    };
  }
}
