import type { Knex } from 'knex';
import { AppError, ConflictError, ForbiddenError, NotFoundError } from '../errors';
import type { Mailer } from '../mail/mailer';
import { invitationMail } from '../mail/templates';
import { ActivityRepository } from '../repositories/activity-repository';
import { InvitationRepository, type InvitationRecord } from '../repositories/invitation-repository';
import { MemberRepository, ProjectRepository } from '../repositories/project-repository';
import { UserRepository, toPublicUser } from '../repositories/user-repository';
import type { PublicUser } from '../schemas/auth';
import type { AcceptInvitationBody, InvitationPreview, InviteBody, PendingInvitation } from '../schemas/projects';
import { hashPassword } from './passwords';
import { ProjectPolicy, atLeast } from './project-policy';
import { hashToken, newToken } from './tokens';

const INVITATION_DAYS = 7;
const GONE = 'This invitation link is not valid: it may have expired or been used. Ask the project lead for a new one.';

export class InvitationService {
  private readonly invitations: InvitationRepository;
  private readonly members: MemberRepository;
  private readonly projects: ProjectRepository;
  private readonly users: UserRepository;
  private readonly activity: ActivityRepository;
  private readonly policy: ProjectPolicy;

  constructor(
    private readonly db: Knex,
    private readonly mailer: Mailer,
    private readonly publicOrigin: string,
    private readonly now: () => Date = () => new Date(),
  ) {
    this.invitations = new InvitationRepository(db);
    this.members = new MemberRepository(db);
    this.projects = new ProjectRepository(db);
    this.users = new UserRepository(db);
    this.activity = new ActivityRepository(db);
    this.policy = new ProjectPolicy(db);
  }

  /** A lead invites by e-mail; the one-time link is mailed and only its hash is kept. */
  async invite(
    lead: PublicUser,
    projectId: number,
    body: InviteBody,
  ): Promise<{ invitation: PendingInvitation; mailSent: boolean }> {
    await this.policy.requireWritable(projectId, lead.id, 'lead');
    const existing = await this.users.findByEmail(body.email);
    if (existing && (await this.members.roleOf(projectId, existing.id))) {
      throw new ConflictError(`${body.email} is already a member of this project.`, { email: 'Already a member.' });
    }
    const token = newToken();
    const expiresAt = new Date(this.now().getTime() + INVITATION_DAYS * 24 * 3600_000);
    const id = await this.invitations.create({
      projectId,
      email: body.email,
      role: body.role,
      tokenHash: hashToken(token),
      invitedBy: lead.id,
      expiresAt,
    });
    const project = await this.projects.findForUser(projectId, lead.id);
    let mailSent = true;
    try {
      await this.mailer.send(
        invitationMail({
          to: body.email,
          projectName: project!.name,
          inviterName: lead.name,
          role: body.role,
          link: `${this.publicOrigin}/invitations/${token}`,
          expiresAt,
        }),
      );
    } catch (e) {
      mailSent = false;
      console.error('invitation mail failed:', e);
    }
    await this.activity.add({
      projectId,
      actorId: lead.id,
      verb: 'invited',
      objectType: 'invitation',
      objectId: id,
      summary: `invited ${body.email} as ${body.role}`,
    });
    return {
      invitation: { id, email: body.email, role: body.role, expiresAt: expiresAt.toISOString(), invitedBy: lead.name },
      mailSent,
    };
  }

  async revoke(lead: PublicUser, projectId: number, invitationId: number): Promise<void> {
    await this.policy.require(projectId, lead.id, 'lead');
    if (!(await this.invitations.remove(projectId, invitationId))) throw new NotFoundError('No such open invitation.');
  }

  private async open(token: string): Promise<InvitationRecord> {
    const inv = await this.invitations.findByTokenHash(hashToken(token));
    if (!inv || inv.acceptedAt || inv.expiresAt <= this.now()) throw new NotFoundError(GONE);
    return inv;
  }

  async preview(token: string): Promise<InvitationPreview> {
    const inv = await this.open(token);
    return {
      projectName: inv.projectName,
      email: inv.email,
      role: inv.role,
      invitedBy: inv.invitedBy,
      expiresAt: inv.expiresAt.toISOString(),
      accountExists: Boolean(await this.users.findByEmail(inv.email)),
    };
  }

  /**
   * Accepts as the signed-in user (who must own the invited e-mail), or creates the account from
   * {name, password}. Returns the member and whether a new account was made (the route signs it in).
   */
  async accept(
    token: string,
    signedIn: PublicUser | undefined,
    body: AcceptInvitationBody,
  ): Promise<{ user: PublicUser; projectId: number; created: boolean }> {
    const inv = await this.open(token);
    let user: PublicUser;
    let created = false;
    if (signedIn) {
      if (signedIn.email !== inv.email) {
        throw new ForbiddenError(`This invitation is for ${inv.email}. Sign out, then open the link again.`);
      }
      user = signedIn;
    } else {
      if (await this.users.findByEmail(inv.email)) {
        throw new ConflictError(`An account for ${inv.email} exists already: sign in, then accept.`);
      }
      const fields: Record<string, string> = {};
      if (!body.name) fields.name = 'Enter your name.';
      if (!body.password) fields.password = 'Choose a password.';
      if (Object.keys(fields).length) throw new AppError(400, 'VALIDATION_FAILED', 'Some fields are not valid.', fields);
      const passwordHash = await hashPassword(body.password!);
      const id = await this.users.insert({ email: inv.email, name: body.name!, passwordHash, siteRole: 'guest' });
      user = toPublicUser((await this.users.findById(id))!);
      created = true;
    }
    await this.db.transaction(async (trx) => {
      if (!(await this.invitations.markAccepted(inv.id, user.id, trx))) throw new NotFoundError(GONE);
      const current = await this.members.roleOf(inv.projectId, user.id, trx);
      // Accepting never lowers a role someone already has.
      if (!current || !atLeast(current, inv.role)) await this.members.upsert(inv.projectId, user.id, inv.role, trx);
      await this.activity.add(
        { projectId: inv.projectId, actorId: user.id, verb: 'joined', objectType: 'member', objectId: user.id, summary: `joined as ${inv.role}` },
        trx,
      );
    });
    return { user, projectId: inv.projectId, created };
  }
}
