// Imports zod only: the client imports these schemas too.
import { z } from 'zod';
import { email, newPassword, personName, siteRoles, type SiteRole } from './auth';

export interface AdminUser {
  id: number;
  email: string;
  name: string;
  siteRole: SiteRole;
  disabled: boolean;
  createdAt: string;
  projectCount: number;
}

const siteRole = z.enum(siteRoles, { error: 'Choose admin, staff or guest.' });

export const createUserBody = z.object({ email, name: personName, password: newPassword, siteRole });
export type CreateUserBody = z.infer<typeof createUserBody>;

export const updateUserFields = z
  .object({ name: personName.optional(), siteRole: siteRole.optional(), disabled: z.boolean().optional() })
  .refine((b) => b.name !== undefined || b.siteRole !== undefined || b.disabled !== undefined, {
    error: 'Change the name, the site role or whether the account is disabled.',
    path: ['siteRole'],
  });
export type UpdateUserFields = z.infer<typeof updateUserFields>;

/** PATCH /api/admin/users carries the id in the body; PATCH /api/admin/users/:id in the path. */
export const updateUserBody = z
  .object({
    id: z.number({ error: 'Name the user to change.' }).int().positive(),
    name: personName.optional(),
    siteRole: siteRole.optional(),
    disabled: z.boolean().optional(),
  })
  .refine((b) => b.name !== undefined || b.siteRole !== undefined || b.disabled !== undefined, {
    error: 'Change the name, the site role or whether the account is disabled.',
    path: ['siteRole'],
  });

export const userIdParams = z.object({ id: z.coerce.number().int().positive() });
