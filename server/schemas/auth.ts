// Imports zod only: the client imports these schemas too.
import { z } from 'zod';

export const email = z
  .string({ error: 'Enter an e-mail address.' })
  .trim()
  .toLowerCase()
  .pipe(z.email({ error: 'Enter a valid e-mail address.' }).max(191, { error: 'At most 191 characters.' }));

export const signInBody = z.object({
  email,
  password: z.string({ error: 'Enter your password.' }).min(1, { error: 'Enter your password.' }).max(200),
});
export type SignInBody = z.infer<typeof signInBody>;

export const siteRoles = ['admin', 'staff', 'guest'] as const;
export type SiteRole = (typeof siteRoles)[number];

export interface PublicUser {
  id: number;
  email: string;
  name: string;
  siteRole: SiteRole;
}

export const newPassword = z
  .string({ error: 'Enter a password.' })
  .min(10, { error: 'Use at least 10 characters.' })
  .max(200, { error: 'At most 200 characters.' });

export const personName = z
  .string({ error: 'Enter a name.' })
  .trim()
  .min(1, { error: 'Enter a name.' })
  .max(120, { error: 'At most 120 characters.' });

export const passwordResetRequestBody = z.object({ email });
export type PasswordResetRequestBody = z.infer<typeof passwordResetRequestBody>;

export const oneTimeToken = z
  .string({ error: 'The link is incomplete.' })
  .regex(/^[A-Za-z0-9_-]{43}$/, { error: 'The link is not valid.' });

export const passwordResetConfirmBody = z.object({ token: oneTimeToken, password: newPassword });
export type PasswordResetConfirmBody = z.infer<typeof passwordResetConfirmBody>;
