import { Router } from 'express';
import { csrfTokenFor } from '../middleware/csrf';
import { passwordResetLimits, signInLimits } from '../middleware/rate-limits';
import { currentUser, requireSession } from '../middleware/require-session';
import { SESSION_COOKIE } from '../middleware/session';
import { validateBody } from '../middleware/validate';
import { passwordResetConfirmBody, passwordResetRequestBody, signInBody } from '../schemas/auth';
import type { AuthService } from '../services/auth-service';
import type { PasswordResetService } from '../services/password-reset-service';
import { destroySession, startSession } from './session-helpers';

export function authRoutes(auth: AuthService, resets: PasswordResetService): Router {
  const router = Router();

  // Rate limits run before validation, so malformed attempts count as failures too.
  router.post('/auth/signin', ...signInLimits(), validateBody(signInBody), async (req, res) => {
    const user = await auth.signIn(req.body);
    await startSession(req, user.id);
    res.json({ user });
  });

  router.post('/auth/signout', async (req, res) => {
    if (req.session) await destroySession(req);
    res.clearCookie(SESSION_COOKIE);
    res.status(204).end();
  });

  router.get('/auth/me', requireSession, (req, res) => {
    res.json({ user: currentUser(req) });
  });

  // "Who am I?" for a page that may have no session: 200 with user null rather than a 401 (which a browser
  // logs as an error in every anonymous visitor's console). Scripts keep /auth/me and its 401.
  router.get('/auth/session', (req, res) => {
    res.set('Cache-Control', 'no-store').json({ user: req.user ?? null });
  });

  router.get('/auth/csrf', (req, res) => {
    res.set('Cache-Control', 'no-store').json({ token: csrfTokenFor(req) });
  });

  router.post(
    '/auth/password-reset/request',
    ...passwordResetLimits(),
    validateBody(passwordResetRequestBody),
    (req, res) => {
      // Answer first, work after: the same 202 and the same timing whether or not the account exists.
      res.status(202).json({});
      resets.request(req.body.email).catch((e) => console.error('password reset mail failed:', e));
    },
  );

  router.post('/auth/password-reset/confirm', validateBody(passwordResetConfirmBody), async (req, res) => {
    await resets.confirm(req.body.token, req.body.password, req.session?.userId ? req.sessionID : undefined);
    res.status(204).end();
  });

  return router;
}
