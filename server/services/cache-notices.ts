/**
 * Changes that in-process caches must hear about at once: a user's record changed (name, role, disabled), or
 * all of a user's sessions were ended (password reset, account disabled). The caches are short-lived
 * (a few seconds), so another server process learns of a change within that time at the latest.
 */
import { EventEmitter } from 'node:events';

const notices = new EventEmitter();
notices.setMaxListeners(0); // every app instance in a process (tests make many) listens

export function userChanged(userId: number): void {
  notices.emit('user-changed', userId);
}

export function sessionsEndedFor(userId: number): void {
  notices.emit('sessions-ended', userId);
}

export function onUserChanged(listener: (userId: number) => void): () => void {
  notices.on('user-changed', listener);
  return () => notices.off('user-changed', listener);
}

export function onSessionsEnded(listener: (userId: number) => void): () => void {
  notices.on('sessions-ended', listener);
  return () => notices.off('sessions-ended', listener);
}
