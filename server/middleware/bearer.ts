/**
 * Authorization: Bearer flt_… — a personal API token instead of a session, for scripts (RFC 6750 §2.1).
 * A bearer request reads no session and needs no CSRF token: a browser does not add this header to a
 * request another site makes, so forgery has nothing to ride on. It opens only its project's campaign
 * routes, at no more than the token's role (and the user's current role).
 */
import type { Request, RequestHandler } from 'express';
import { NotFoundError, TokenInvalidError, UnauthenticatedError } from '../errors';
import type { PublicUser } from '../schemas/auth';
import type { ProjectRole } from '../schemas/projects';
import type { ApiTokenService } from '../services/api-token-service';
import type { AuthService } from '../services/auth-service';

declare global {
  // eslint-disable-next-line @typescript-eslint/no-namespace -- Express types its Request in a global namespace; augmenting it needs one
  namespace Express {
    interface Request {
      /** Set when the request came with a valid API token. */
      apiToken?: { id: number; projectId: number; role: ProjectRole };
    }
  }
}

const BEARER = /^Bearer[ \t]+(\S+)[ \t]*$/i;
/** The routes a token opens, with the project id they name. */
const TOKEN_ROUTES = /^\/projects\/([^/]+)\/campaigns(?:\/|$)/;

export function bearerAuth(tokens: ApiTokenService, auth: AuthService): RequestHandler {
  return async (req, _res, next) => {
    const header = req.get('authorization');
    if (header === undefined) return next();
    const secret = BEARER.exec(header)?.[1];
    if (!secret) throw new TokenInvalidError('The Authorization header is not of the form "Bearer flt_…".');
    const grant = await tokens.grantFor(secret);
    const user = await auth.activeUser(grant.userId);
    if (!user) throw new TokenInvalidError('The account this API token belongs to is disabled.');
    const route = TOKEN_ROUTES.exec(req.path);
    if (!route) {
      throw new UnauthenticatedError('An API token opens only its project\'s campaign routes (/api/projects/ID/campaigns…); sign in for the rest.');
    }
    // another project is as unknown to the token as a project that does not exist
    if (route[1] !== String(grant.projectId)) throw new NotFoundError('Project not found.');
    req.user = user;
    req.apiToken = { id: grant.id, projectId: grant.projectId, role: grant.role };
    next();
  };
}

/** Runs a session-side middleware (session, user, CSRF) only for requests without a token. */
export function unlessBearer(middleware: RequestHandler): RequestHandler {
  return (req, res, next) => (req.apiToken ? next() : middleware(req, res, next));
}

/** Who is asking, and at most which role an API token lets them act with (null: a session, no cap). */
export interface Caller {
  user: PublicUser;
  cap: ProjectRole | null;
}

export function callerOf(req: Request): Caller {
  if (!req.user) throw new UnauthenticatedError();
  return { user: req.user, cap: req.apiToken?.role ?? null };
}
