import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { projectRoles, type ProjectRole } from '../../../../server/schemas/projects';
import type { CreateApiTokenBody } from '../../../../server/schemas/api-tokens';
import { api } from '../../../lib/api-client';

// The answers are parsed, not cast: a token's secret is shown once, so a changed shape should fail loudly here
const apiTokenWire = z.object({
  id: z.number(),
  name: z.string(),
  projectId: z.number(),
  projectName: z.string(),
  role: z.enum(projectRoles),
  expiresAt: z.string(),
  lastUsedAt: z.string().nullable(),
  revokedAt: z.string().nullable(),
  createdAt: z.string(),
});
export type ApiTokenRow = z.infer<typeof apiTokenWire>;

const tokenListWire = z.object({ tokens: z.array(apiTokenWire) });
const createdTokenWire = z.object({ token: apiTokenWire, secret: z.string().startsWith('flt_') });

export const apiTokenKeys = { all: ['me', 'api-tokens'] as const };

export const apiTokensQuery = queryOptions({
  queryKey: apiTokenKeys.all,
  queryFn: async () => tokenListWire.parse(await api.get<unknown>('/me/tokens')).tokens,
});

export const useApiTokens = () => useQuery(apiTokensQuery);

export function useCreateApiToken() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: async (body: CreateApiTokenBody) => createdTokenWire.parse(await api.create<unknown>('/me/tokens', body)),
    onSettled: () => qc.invalidateQueries({ queryKey: apiTokenKeys.all }),
  });
}

export function useRevokeApiToken() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (tokenId: number) => api.delete<void>(`/me/tokens/${tokenId}`),
    onSettled: () => qc.invalidateQueries({ queryKey: apiTokenKeys.all }),
  });
}

const rank: Record<ProjectRole, number> = { viewer: 0, engineer: 1, lead: 2 };

/** The roles a token may carry in a project where its user is `mine`: never more than the user has. */
export const grantableRoles = (mine: ProjectRole): ProjectRole[] =>
  (['viewer', 'engineer', 'lead'] as const).filter((r) => rank[r] <= rank[mine]);

/** Where a token stands now: revoked, expired, or live. */
export function tokenState(t: Pick<ApiTokenRow, 'expiresAt' | 'revokedAt'>, now = Date.now()): 'revoked' | 'expired' | 'live' {
  if (t.revokedAt) return 'revoked';
  return Date.parse(t.expiresAt) <= now ? 'expired' : 'live';
}
