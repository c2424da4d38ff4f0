// Imports zod only: the client imports these schemas too.
import { z } from 'zod';
import { projectRoles, type ProjectRole } from './projects';

/** Personal API tokens: a script's credential for one project, at most one role, for 1 to 365 days. */

export const API_TOKEN_PREFIX = 'flt_';
/** `flt_` and 32 random bytes in base64url (43 characters). */
export const API_TOKEN_FORM = /^flt_[A-Za-z0-9_-]{43}$/;
export const API_TOKEN_MAX_DAYS = 365;

export const createApiTokenBody = z.object({
  name: z
    .string({ error: 'Give the token a name, such as the machine or script that uses it.' })
    .trim()
    .min(1, { error: 'Give the token a name, such as the machine or script that uses it.' })
    .max(80, { error: 'A token name is at most 80 characters.' }),
  projectId: z.number({ error: 'Name the project the token opens (projectId).' }).int({ error: 'A project id is a whole number.' }).positive({ error: 'A project id is positive.' }),
  role: z.enum(projectRoles, { error: 'The role is viewer, engineer or lead.' }),
  expiresInDays: z
    .number({ error: `The token expires after 1 to ${API_TOKEN_MAX_DAYS} days (expiresInDays).` })
    .int({ error: 'expiresInDays is a whole number of days.' })
    .min(1, { error: 'A token lasts at least 1 day.' })
    .max(API_TOKEN_MAX_DAYS, { error: `A token lasts at most ${API_TOKEN_MAX_DAYS} days.` }),
});
export type CreateApiTokenBody = z.infer<typeof createApiTokenBody>;

export const apiTokenIdParams = z.object({ tokenId: z.coerce.number().int().positive() });

export interface ApiToken {
  id: number;
  name: string;
  projectId: number;
  projectName: string;
  role: ProjectRole;
  expiresAt: string;
  lastUsedAt: string | null;
  revokedAt: string | null;
  createdAt: string;
}

/** The answer to a create: the secret is shown this once and never stored (only its hash). */
export interface CreatedApiToken {
  token: ApiToken;
  secret: string;
}
