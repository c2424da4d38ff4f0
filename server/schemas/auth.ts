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
