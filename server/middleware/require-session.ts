import type { RequestHandler } from 'express';
import { UnauthenticatedError } from '../errors';
import type { PublicUser } from '../schemas/auth';
import type { AuthService } from '../services/auth-service';

declare global {
  // eslint-disable-next-line @typescript-eslint/no-namespace -- Express types its Request in a global namespace; augmenting it needs one
  namespace Express {
    interface Request {
      user?: PublicUser;
    }
  }
}

/** Loads the signed-in user for every request; a disabled or deleted user's session is ended. */
export function loadUser(auth: AuthService): RequestHandler {
  return async (req, _res, next) => {
    const id = req.session?.userId;
    if (!id) return next();
    const user = await auth.activeUser(id);
    if (user) {
      req.user = user;
      return next();
    }
    req.session.destroy(() => next());
  };
}

export const requireSession: RequestHandler = (req, _res, next) => {
  next(req.user ? undefined : new UnauthenticatedError());
};

export function currentUser(req: Express.Request): PublicUser {
  if (!req.user) throw new UnauthenticatedError();
  return req.user;
}
