import { Router, type Request } from 'express';
import { validateBody } from '../middleware/validate';
import { requireSession, currentUser } from '../middleware/require-session';
import { SESSION_COOKIE } from '../middleware/session';
import { signInBody } from '../schemas/auth';
import type { AuthService } from '../services/auth-service';

const regenerate = (req: Request) =>
  new Promise<void>((resolve, reject) => req.session.regenerate((err) => (err ? reject(err) : resolve())));
const destroy = (req: Request) =>
  new Promise<void>((resolve, reject) => req.session.destroy((err) => (err ? reject(err) : resolve())));

export function authRoutes(auth: AuthService): Router {
  const router = Router();

  router.post('/auth/signin', validateBody(signInBody), async (req, res) => {
    const user = await auth.signIn(req.body);
    await regenerate(req); // a fresh id at sign-in: no session fixation
    req.session.userId = user.id;
    res.json({ user });
  });

  router.post('/auth/signout', async (req, res) => {
    if (req.session) await destroy(req);
    res.clearCookie(SESSION_COOKIE);
    res.status(204).end();
  });

  router.get('/auth/me', requireSession, (req, res) => {
    res.json({ user: currentUser(req) });
  });

  return router;
}
