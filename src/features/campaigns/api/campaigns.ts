import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { CAMPAIGN_RESULTS_PAGE_MAX, type CampaignResultSort } from '../../../../server/schemas/campaigns';
import { api } from '../../../lib/api-client';
import { projectKeys } from '../../projects/api/projects';

// Parsed, not cast: results come from scripts through the API, and the page reads deep into them
const person = z.object({ id: z.number(), name: z.string() }).nullable();
const tagValues = z.record(z.string(), z.string());

const campaignListItemWire = z.object({
  id: z.number(),
  name: z.string(),
  preset: z.record(z.string(), z.unknown()),
  total: z.number().nullable(),
  done: z.number(),
  failed: z.number(),
  createdBy: person,
  createdAt: z.string(),
  updatedAt: z.string(),
});
export type CampaignListRow = z.infer<typeof campaignListItemWire>;

const campaignWire = campaignListItemWire.extend({ tags: z.record(z.string(), tagValues).default({}) });
export type CampaignDetail = z.infer<typeof campaignWire>;

const summaryWire = z.object({
  carrierScheduleHz: z.array(z.number()),
  shifts: z.array(z.object({ rpm: z.number(), fromHz: z.number(), toHz: z.number() })),
  spread: z.object({ spread: z.boolean(), widthHz: z.number().nullable() }),
  polePairs: z.number().nullable(),
  strongestFamilies: z.array(z.object({ m: z.number(), n: z.number(), peakDb: z.number(), peakRpm: z.number() })),
  overallDb: z.number().nullable(),
});
export type ResultSummary = z.infer<typeof summaryWire>;

const resultWire = z.object({
  id: z.number(),
  file: z.string(),
  ok: z.boolean(),
  error: z.string().nullable(),
  tags: tagValues,
  summary: summaryWire.nullable(),
  inverter: z.record(z.string(), z.unknown()).nullable(),
  createdAt: z.string(),
});
export type ResultRow = z.infer<typeof resultWire>;

const resultPageWire = z.object({ results: z.array(resultWire), total: z.number() });
export type ResultPage = z.infer<typeof resultPageWire>;

export const campaignKeys = {
  list: (projectId: number) => [...projectKeys.detail(projectId), 'campaigns'] as const,
  detail: (projectId: number, campaignId: number) => [...campaignKeys.list(projectId), campaignId] as const,
  results: (projectId: number, campaignId: number, page: ResultPageRequest) => [...campaignKeys.detail(projectId, campaignId), 'results', page] as const,
  allResults: (projectId: number, campaignId: number, done: number) => [...campaignKeys.detail(projectId, campaignId), 'all-results', done] as const,
};

/** Results still coming in show without a reload: the list and the open campaign ask again this often. */
const LIVE_REFRESH_MS = 10_000;

export const campaignListQuery = (projectId: number) =>
  queryOptions({
    queryKey: campaignKeys.list(projectId),
    queryFn: async () => z.object({ campaigns: z.array(campaignListItemWire) }).parse(await api.get<unknown>(`/projects/${projectId}/campaigns`)).campaigns,
    refetchInterval: LIVE_REFRESH_MS,
  });

export const useCampaigns = (projectId: number) => useQuery(campaignListQuery(projectId));

export const campaignQuery = (projectId: number, campaignId: number) =>
  queryOptions({
    queryKey: campaignKeys.detail(projectId, campaignId),
    queryFn: async () => z.object({ campaign: campaignWire }).parse(await api.get<unknown>(`/projects/${projectId}/campaigns/${campaignId}`)).campaign,
    refetchInterval: LIVE_REFRESH_MS,
  });

export const useCampaign = (projectId: number, campaignId: number) => useQuery(campaignQuery(projectId, campaignId));

export interface ResultPageRequest {
  limit: number;
  offset: number;
  sort: CampaignResultSort;
  q: string;
}

const resultsPath = (projectId: number, campaignId: number, r: ResultPageRequest) =>
  `/projects/${projectId}/campaigns/${campaignId}/results?${new URLSearchParams({ limit: String(r.limit), offset: String(r.offset), sort: r.sort, q: r.q })}`;

/** One page of results, in the server's order and filter (the table pages through them). */
export const useCampaignResults = (projectId: number, campaignId: number, page: ResultPageRequest) =>
  useQuery({
    queryKey: campaignKeys.results(projectId, campaignId, page),
    queryFn: async () => resultPageWire.parse(await api.get<unknown>(resultsPath(projectId, campaignId, page))),
    placeholderData: keepPreviousData,
    refetchInterval: LIVE_REFRESH_MS,
  });

/**
 * Trends plot every result at once: read page by page at the API's cap, up to TRENDS_MAX_RESULTS (a
 * few thousand raw inverter objects is what a browser tab holds comfortably; more are left out and said so).
 */
export const TRENDS_MAX_RESULTS = 5000;

export const useAllCampaignResults = (projectId: number, campaignId: number, done: number) =>
  useQuery({
    // read again when the campaign's count of results moves (the campaign itself is polled), not on a timer:
    // this is every result's raw object
    queryKey: campaignKeys.allResults(projectId, campaignId, done),
    placeholderData: keepPreviousData,
    queryFn: async () => {
      const results: ResultRow[] = [];
      let total = 0;
      for (let offset = 0; offset < TRENDS_MAX_RESULTS; offset += CAMPAIGN_RESULTS_PAGE_MAX) {
        const page = resultPageWire.parse(await api.get<unknown>(resultsPath(projectId, campaignId, { limit: CAMPAIGN_RESULTS_PAGE_MAX, offset, sort: 'file', q: '' })));
        results.push(...page.results);
        total = page.total;
        if (results.length >= total || page.results.length === 0) break;
      }
      return { results, total };
    },
  });
