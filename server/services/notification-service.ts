import type { Knex } from 'knex';
import type { Mailer, OutgoingMail } from '../mail/mailer';
import { mentionMail, replyMail, shareMail } from '../mail/templates';
import { NotificationSettingsRepository } from '../repositories/notification-settings-repository';
import { MemberRepository } from '../repositories/project-repository';
import type { PublicUser } from '../schemas/auth';
import type { ProjectMember } from '../schemas/projects';
import type { NotificationSettings, UpdateNotificationsBody } from '../schemas/views';
import { mentionedHandles, mentionedMembers } from './mentions';

/** Work that runs after the answer went out (mail), so responses stay fast. */
export type FollowUp = () => Promise<void>;
export const NOTHING_TO_FOLLOW: FollowUp = async () => undefined;

/** Starts a follow-up without waiting for it; a failure is logged, never thrown at the caller. */
export function runAfterAnswer(followUp: FollowUp): void {
  followUp().catch((e) => console.error('notification mail failed:', e));
}

interface Actor {
  /** null: someone writing through a share link. */
  id: number | null;
  name: string;
}

interface ViewRef {
  id: number;
  projectId: number;
  title: string;
  createdBy: number | null;
}

type Kind = keyof NotificationSettings;

/** Mail for replies, mentions and shares, each kind as the recipient's settings allow. */
export class NotificationService {
  private readonly settings: NotificationSettingsRepository;
  private readonly members: MemberRepository;

  constructor(
    db: Knex,
    private readonly mailer: Mailer,
    private readonly publicOrigin: string,
  ) {
    this.settings = new NotificationSettingsRepository(db);
    this.members = new MemberRepository(db);
  }

  // -------------------------------------------------------------- settings

  get(user: PublicUser): Promise<NotificationSettings> {
    return this.settings.get(user.id);
  }

  async update(user: PublicUser, body: UpdateNotificationsBody): Promise<NotificationSettings> {
    const next = { ...(await this.settings.get(user.id)), ...body };
    await this.settings.save(user.id, next);
    return next;
  }

  // -------------------------------------------------------------- links into the client

  viewLink(viewId: number): string {
    return `${this.publicOrigin}/views/${viewId}`;
  }

  markLink(viewId: number, markId: number): string {
    return `${this.publicOrigin}/views/${viewId}?mark=${markId}`;
  }

  commentLink(viewId: number, markId: number | null, commentId: number): string {
    return `${markId === null ? this.viewLink(viewId) : this.markLink(viewId, markId)}#comment-${commentId}`;
  }

  // -------------------------------------------------------------- the events

  /**
   * A new comment: its mark's author (or, in the view's own thread, the view's author) hears of the
   * reply; every member it @mentions hears of the mention. One mail a person, the mention first; never
   * to the writer. Comments through a share link notify the author but mention nobody.
   */
  async commentAdded(p: {
    actor: Actor;
    view: ViewRef;
    markId: number | null;
    markAuthorId: number | null;
    comment: { id: number; body: string };
    viaLink: boolean;
  }): Promise<void> {
    const members = await this.members.listReachable(p.view.projectId);
    const link = this.commentLink(p.view.id, p.markId, p.comment.id);
    const actorName = p.viaLink ? `${p.actor.name} (through a share link)` : p.actor.name;
    const mentioned = p.viaLink ? [] : mentionedMembers(p.comment.body, members);
    const repliedTo = p.markId === null ? p.view.createdBy : p.markAuthorId;
    const replyTarget = members.find((m) => m.userId === repliedTo);

    const candidates = new Map<number, { member: ProjectMember; kinds: Kind[] }>();
    const want = (member: ProjectMember, kind: Kind) => {
      if (member.userId === p.actor.id) return;
      const entry = candidates.get(member.userId) ?? { member, kinds: [] };
      entry.kinds.push(kind);
      candidates.set(member.userId, entry);
    };
    for (const m of mentioned) want(m, 'mentions');
    if (replyTarget) want(replyTarget, 'replies');

    const settings = await this.settings.forUsers([...candidates.keys()]);
    const mails: OutgoingMail[] = [];
    for (const { member, kinds } of candidates.values()) {
      const s = settings.get(member.userId)!;
      const kind = kinds.find((k) => s[k]);
      if (kind === 'mentions') {
        mails.push(mentionMail({ to: member.email, name: member.name, actorName, viewTitle: p.view.title, body: p.comment.body, link }));
      } else if (kind === 'replies') {
        mails.push(
          replyMail({
            to: member.email,
            name: member.name,
            actorName,
            viewTitle: p.view.title,
            onMark: p.markId !== null,
            body: p.comment.body,
            link,
          }),
        );
      }
    }
    await this.sendAll(mails);
  }

  /** A mark placed or edited: members its text newly @mentions hear of it. */
  async markWritten(p: { actor: Actor; view: ViewRef; markId: number; text: string; previousText?: string }): Promise<void> {
    // most marks mention nobody: then the project's member list (every member, on a big team) is not read
    if (mentionedHandles(p.text).size === 0) return;
    const members = await this.members.listReachable(p.view.projectId);
    const before = new Set(p.previousText ? mentionedMembers(p.previousText, members).map((m) => m.userId) : []);
    const fresh = mentionedMembers(p.text, members).filter((m) => m.userId !== p.actor.id && !before.has(m.userId));
    const settings = await this.settings.forUsers(fresh.map((m) => m.userId));
    const link = this.markLink(p.view.id, p.markId);
    await this.sendAll(
      fresh
        .filter((m) => settings.get(m.userId)!.mentions)
        .map((m) => mentionMail({ to: m.email, name: m.name, actorName: p.actor.name, viewTitle: p.view.title, body: p.text, link })),
    );
  }

  /** A member sent a view to another member. */
  async viewShared(p: { actor: Actor; view: ViewRef; projectName: string; recipient: ProjectMember }): Promise<void> {
    if (!(await this.settings.get(p.recipient.userId)).shares) return;
    await this.sendAll([
      shareMail({
        to: p.recipient.email,
        name: p.recipient.name,
        actorName: p.actor.name,
        viewTitle: p.view.title,
        projectName: p.projectName,
        link: this.viewLink(p.view.id),
      }),
    ]);
  }

  private async sendAll(mails: OutgoingMail[]): Promise<void> {
    for (const mail of mails) {
      try {
        await this.mailer.send(mail);
      } catch (e) {
        console.error('notification mail failed:', e);
      }
    }
  }
}
