import type { Knex } from 'knex';
import { NotFoundError, TokenInvalidError, ValidationError } from '../errors';
import { ApiTokenRepository, type TokenGrant } from '../repositories/api-token-repository';
import { API_TOKEN_FORM, API_TOKEN_PREFIX, type ApiToken, type CreateApiTokenBody, type CreatedApiToken } from '../schemas/api-tokens';
import type { PublicUser } from '../schemas/auth';
import { atLeast, ProjectPolicy } from './project-policy';
import { hashToken, newToken } from './tokens';

const DAY_MS = 24 * 3600_000;

/**
 * Personal API tokens: each user makes, lists and revokes their own. A token opens one project at a role
 * no higher than the user's there; at use, the lower of the token's role and the user's current role holds.
 */
export class ApiTokenService {
  private readonly tokens: ApiTokenRepository;
  private readonly policy: ProjectPolicy;

  constructor(db: Knex, private readonly now: () => Date = () => new Date()) {
    this.tokens = new ApiTokenRepository(db);
    this.policy = new ProjectPolicy(db);
  }

  list(user: PublicUser): Promise<ApiToken[]> {
    return this.tokens.listOf(user.id);
  }

  async create(user: PublicUser, body: CreateApiTokenBody): Promise<CreatedApiToken> {
    const memberRole = await this.policy.require(body.projectId, user.id, 'viewer');
    if (!atLeast(memberRole, body.role)) {
      throw new ValidationError(
        { role: `You are ${memberRole === 'engineer' ? 'an engineer' : 'a viewer'} in this project; a token can have that role or a lower one.` },
        'A token cannot have a higher role than yours.',
      );
    }
    const secret = API_TOKEN_PREFIX + newToken();
    const id = await this.tokens.insert({
      userId: user.id,
      projectId: body.projectId,
      role: body.role,
      name: body.name,
      tokenHash: hashToken(secret),
      expiresAt: new Date(this.now().getTime() + body.expiresInDays * DAY_MS),
    });
    return { token: (await this.tokens.get(id))!, secret };
  }

  async revoke(user: PublicUser, tokenId: number): Promise<void> {
    if (!(await this.tokens.revoke(user.id, tokenId))) throw new NotFoundError('Token not found.');
  }

  /** The grant of a bearer secret that still holds (its use noted), or TOKEN_INVALID saying why not. */
  async grantFor(secret: string): Promise<TokenGrant> {
    const grant = API_TOKEN_FORM.test(secret) ? await this.tokens.grantOf(hashToken(secret)) : null;
    if (!grant) throw new TokenInvalidError('This API token is not known. Make one under Settings → API tokens.');
    if (grant.revokedAt) throw new TokenInvalidError('This API token was revoked. Make a new one under Settings → API tokens.');
    const now = this.now();
    if (grant.expiresAt.getTime() <= now.getTime()) {
      throw new TokenInvalidError(`This API token expired on ${grant.expiresAt.toISOString().slice(0, 10)}. Make a new one under Settings → API tokens.`);
    }
    if (!grant.lastUsedAt || now.getTime() - grant.lastUsedAt.getTime() >= 60_000) await this.tokens.touch(grant.id, now);
    return grant;
  }
}
