// Imports zod only: the client imports these schemas too.
import { z } from 'zod';
import { email, newPassword, personName, oneTimeToken } from './auth';

export const projectRoles = ['lead', 'engineer', 'viewer'] as const;
export type ProjectRole = (typeof projectRoles)[number];

export interface ProjectSummary {
  id: number;
  name: string;
  description: string;
  role: ProjectRole;
  memberCount: number;
  recordingCount: number;
  viewCount: number;
  archived: boolean;
  lastActivityAt: string;
}

export interface ProjectDetail extends ProjectSummary {
  createdAt: string;
}

export interface ProjectMember {
  userId: number;
  email: string;
  name: string;
  role: ProjectRole;
  joinedAt: string;
}

export interface PendingInvitation {
  id: number;
  email: string;
  role: ProjectRole;
  expiresAt: string;
  invitedBy: string | null;
}

export interface ActivityEntry {
  id: number;
  actor: string | null;
  verb: string;
  objectType: string;
  summary: string;
  at: string;
}

/** What the Accept invitation page shows before the invitee decides. */
export interface InvitationPreview {
  projectName: string;
  email: string;
  role: ProjectRole;
  invitedBy: string | null;
  expiresAt: string;
  /** An account with the invited e-mail exists: sign in to accept, rather than create one. */
  accountExists: boolean;
}

export const projectIdParams = z.object({ id: z.coerce.number().int().positive() });
export const memberParams = z.object({
  id: z.coerce.number().int().positive(),
  userId: z.coerce.number().int().positive(),
});
export const invitationTokenParams = z.object({ token: oneTimeToken });

const projectName = z
  .string({ error: 'Enter a name.' })
  .trim()
  .min(1, { error: 'Enter a name.' })
  .max(120, { error: 'At most 120 characters.' });
const projectDescription = z.string().trim().max(2000, { error: 'At most 2000 characters.' });

export const createProjectBody = z.object({ name: projectName, description: projectDescription.default('') });
export type CreateProjectBody = z.infer<typeof createProjectBody>;

export const updateProjectBody = z
  .object({ name: projectName.optional(), description: projectDescription.optional() })
  .refine((b) => b.name !== undefined || b.description !== undefined, {
    error: 'Change the name or the description.',
    path: ['name'],
  });
export type UpdateProjectBody = z.infer<typeof updateProjectBody>;

const projectRole = z.enum(projectRoles, { error: 'Choose lead, engineer or viewer.' });

export const inviteBody = z.object({ email, role: projectRole });
export type InviteBody = z.infer<typeof inviteBody>;

export const changeMemberBody = z.object({ role: projectRole });
export type ChangeMemberBody = z.infer<typeof changeMemberBody>;

/** Signed in: an empty body. Not signed in: the new account's name and password. */
export const acceptInvitationBody = z.object({ name: personName.optional(), password: newPassword.optional() });
export type AcceptInvitationBody = z.infer<typeof acceptInvitationBody>;
