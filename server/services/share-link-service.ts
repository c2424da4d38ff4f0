import type { Knex } from 'knex';
import { ConflictError, ForbiddenError, NotFoundError, ValidationError } from '../errors';
import { ActivityRepository } from '../repositories/activity-repository';
import { CommentRepository } from '../repositories/comment-repository';
import { MarkRepository } from '../repositories/mark-repository';
import { ProjectRepository } from '../repositories/project-repository';
import { ShareLinkRepository, type ShareLinkRecord } from '../repositories/share-link-repository';
import type { StoredSnapshot } from '../repositories/view-repository';
import type { PublicUser } from '../schemas/auth';
import type { CreateShareLinkBody, SharedCommentBody, SharedViewBundle, ShareLinkSummary, ThreadComment } from '../schemas/views';
import type { FollowUp, NotificationService } from './notification-service';
import { hashToken, newToken } from './tokens';
import { ViewAccess } from './view-access';
import { readViewState, type ViewService } from './view-service';

const TOKEN_FORM = /^[A-Za-z0-9_-]{43}$/;
const UNKNOWN = 'This share link is not valid. Check that it was copied whole, or ask the person who sent it for a new one.';
const REVOKED = 'This share link was revoked by the project. Ask the person who sent it for a new one.';
const expiredMessage = (at: Date) =>
  `This share link expired on ${at.toISOString().slice(0, 16).replace('T', ' ')} UTC. Ask the person who sent it for a new one.`;

/**
 * Read-only links to one view for people without an account. The token (32 random bytes) is shown once,
 * in the answer that creates the link; only its SHA-256 is stored, and it is never listed or logged.
 */
export class ShareLinkService {
  private readonly access: ViewAccess;
  private readonly links: ShareLinkRepository;
  private readonly marks: MarkRepository;
  private readonly comments: CommentRepository;
  private readonly projects: ProjectRepository;
  private readonly activity: ActivityRepository;

  constructor(
    private readonly db: Knex,
    private readonly views: ViewService,
    private readonly notifications: NotificationService,
    private readonly publicOrigin: string,
    private readonly now: () => Date = () => new Date(),
  ) {
    this.access = new ViewAccess(db);
    this.links = new ShareLinkRepository(db);
    this.marks = new MarkRepository(db);
    this.comments = new CommentRepository(db);
    this.projects = new ProjectRepository(db);
    this.activity = new ActivityRepository(db);
  }

  // -------------------------------------------------------------- for members

  async list(user: PublicUser, viewId: number): Promise<ShareLinkSummary[]> {
    await this.access.open(user.id, viewId, 'engineer');
    return this.links.list(viewId, this.now());
  }

  async create(user: PublicUser, viewId: number, body: CreateShareLinkBody): Promise<{ link: ShareLinkSummary; url: string }> {
    const { view } = await this.access.open(user.id, viewId, 'engineer', true);
    const token = newToken();
    const id = await this.db.transaction(async (trx) => {
      const linkId = await this.links.create(
        { viewId, tokenHash: hashToken(token), mayReply: body.mayReply, expiresAt: body.expiresAt, createdBy: user.id },
        trx,
      );
      await this.activity.add(
        {
          projectId: view.projectId,
          actorId: user.id,
          verb: 'created',
          objectType: 'share-link',
          objectId: linkId,
          summary: `made a ${body.mayReply ? 'reply-enabled' : 'read-only'} share link to the view ${view.title}`,
        },
        trx,
      );
      return linkId;
    });
    return { link: (await this.links.summary(id, this.now()))!, url: `${this.publicOrigin}/shared/${token}` };
  }

  /** Engineers and leads revoke any link of their project's views (also in an archived project). */
  async revoke(user: PublicUser, linkId: number): Promise<void> {
    const link = await this.links.findById(linkId);
    if (!link) throw new NotFoundError('Share link not found.');
    try {
      await this.access.project(link.projectId, user.id, 'engineer');
    } catch (e) {
      if (e instanceof NotFoundError) throw new NotFoundError('Share link not found.');
      throw e;
    }
    if (link.revokedAt) return;
    await this.db.transaction(async (trx) => {
      await this.links.revoke(linkId, trx);
      await this.activity.add(
        { projectId: link.projectId, actorId: user.id, verb: 'revoked', objectType: 'share-link', objectId: linkId, summary: 'revoked a share link' },
        trx,
      );
    });
  }

  // -------------------------------------------------------------- for whoever holds the link

  private async openLink(token: string): Promise<ShareLinkRecord> {
    if (!TOKEN_FORM.test(token)) throw new NotFoundError(UNKNOWN);
    const link = await this.links.findByTokenHash(hashToken(token));
    if (!link) throw new NotFoundError(UNKNOWN);
    if (link.revokedAt) throw new NotFoundError(REVOKED);
    if (link.expiresAt && link.expiresAt <= this.now()) throw new NotFoundError(expiredMessage(link.expiresAt));
    return link;
  }

  async open(token: string): Promise<SharedViewBundle> {
    const link = await this.openLink(token);
    const [detail, marks, comments] = await Promise.all([
      this.access.views.detail(link.viewId),
      this.marks.list(link.viewId),
      this.comments.allForView(link.viewId),
    ]);
    if (!detail) throw new NotFoundError(UNKNOWN);
    return {
      view: {
        id: detail.id,
        title: detail.title,
        state: readViewState(detail.state),
        projectName: link.projectName,
        recordingName: detail.recordingName,
        hasSnapshot: detail.snapshot !== null,
        updatedAt: detail.updatedAt,
      },
      marks,
      comments,
      mayReply: link.mayReply,
    };
  }

  async snapshot(token: string): Promise<StoredSnapshot> {
    const link = await this.openLink(token);
    return this.views.storedSnapshot(link.viewId);
  }

  /** A reply through a reply-enabled link, under the view or one of its marks, signed with a name. */
  async comment(token: string, body: SharedCommentBody): Promise<{ comment: ThreadComment; followUp: FollowUp }> {
    const link = await this.openLink(token);
    if (!link.mayReply) throw new ForbiddenError('This share link is read-only: it does not take replies.');
    const view = await this.access.views.find(link.viewId);
    if (!view) throw new NotFoundError(UNKNOWN);
    if (await this.projects.isArchived(view.projectId)) throw new ConflictError('This project is archived: it takes no replies.');
    ViewAccess.requireNotArchived(view);
    let markAuthorId: number | null = null;
    if (body.markId !== null) {
      const mark = await this.marks.find(body.markId);
      if (!mark || mark.viewId !== view.id) throw new ValidationError({ markId: 'No such mark on this view.' });
      markAuthorId = mark.authorId;
    }
    const id = await this.db.transaction(async (trx) => {
      const commentId = await this.comments.insert(
        { viewId: view.id, markId: body.markId, body: body.body, authorId: null, guestName: body.name, linkId: link.id },
        trx,
      );
      await this.activity.add(
        {
          projectId: view.projectId,
          actorId: null,
          verb: 'commented',
          objectType: 'comment',
          objectId: commentId,
          summary: `${body.name} replied through a share link on ${view.title}`,
        },
        trx,
      );
      return commentId;
    });
    return {
      comment: (await this.comments.get(id))!,
      followUp: () =>
        this.notifications.commentAdded({
          actor: { id: null, name: body.name },
          view,
          markId: body.markId,
          markAuthorId,
          comment: { id, body: body.body },
          viaLink: true,
        }),
    };
  }
}
