import type { Request } from 'express';

export const regenerateSession = (req: Request) =>
  new Promise<void>((resolve, reject) => req.session.regenerate((err) => (err ? reject(err) : resolve())));

export const destroySession = (req: Request) =>
  new Promise<void>((resolve, reject) => req.session.destroy((err) => (err ? reject(err) : resolve())));

/** Signs a user in on this request: a fresh session id (no fixation), then the user's id in it. */
export async function startSession(req: Request, userId: number): Promise<void> {
  await regenerateSession(req);
  req.session.userId = userId;
}
