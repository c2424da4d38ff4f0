// Imports zod only: the client imports these schemas too.
import { z } from 'zod';

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

export const projectIdParams = z.object({ id: z.coerce.number().int().positive() });
