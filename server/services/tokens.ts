import { createHash, randomBytes, timingSafeEqual } from 'node:crypto';

/** A one-time token for a link: 32 random bytes, base64url (43 characters). Only its hash is stored. */
export const newToken = () => randomBytes(32).toString('base64url');

/** SHA-256 hex of a token, the form kept in the database. */
export const hashToken = (token: string) => createHash('sha256').update(token).digest('hex');

export function sameToken(a: string | undefined, b: string | undefined): boolean {
  if (!a || !b) return false;
  const x = Buffer.from(a);
  const y = Buffer.from(b);
  return x.length === y.length && timingSafeEqual(x, y);
}
