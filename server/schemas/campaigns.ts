// Imports zod only: the client imports these schemas too.
import { z } from 'zod';
import type { PersonRef } from './views';

/*
 * Test campaigns: one analysis preset run over many recordings (the CLI's `campaign` command), each file's
 * result posted once as it finishes. Files are named relative to the campaign's folder.
 */

export const CAMPAIGN_NAME_MAX = 120;
/** A file's name (relative path) in a campaign, in characters. */
export const CAMPAIGN_FILE_MAX = 500;
/** The preset and the raw inverter object are stored as JSON text of at most these many bytes. */
export const CAMPAIGN_PRESET_MAX_BYTES = 64 * 1024;
export const CAMPAIGN_INVERTER_MAX_BYTES = 256 * 1024;
export const CAMPAIGN_RESULTS_PAGE_MAX = 500;
export const CAMPAIGN_RESULTS_PAGE_DEFAULT = 100;

const TAG_NAME = /^[^\s,"][^,"]{0,59}$/;
const tagValues = z.record(
  z.string().regex(TAG_NAME, { error: 'A tag name is 1 to 60 characters, without commas or quotes.' }),
  z.string({ error: 'A tag value is text.' }).max(200, { error: 'A tag value is at most 200 characters.' }),
  { error: 'Tags are an object of tag name → text, such as {"build": "B2"}.' },
);
export type TagValues = z.infer<typeof tagValues>;

const fileName = z
  .string({ error: 'Name the file (its path relative to the campaign folder).' })
  .min(1, { error: 'Name the file (its path relative to the campaign folder).' })
  .max(CAMPAIGN_FILE_MAX, { error: `A file name is at most ${CAMPAIGN_FILE_MAX} characters.` })
  .refine((f) => ![...f].some((c) => c.charCodeAt(0) < 0x20), { error: 'A file name holds no control characters.' });

/** tags per file: {"run-01.wav": {"build": "B2", "load": "full"}, …} */
const campaignTags = z.record(fileName, tagValues, { error: 'Tags are an object of file name → {tag: value}.' });

const campaignName = z
  .string({ error: 'Give the campaign a name.' })
  .trim()
  .min(1, { error: 'Give the campaign a name.' })
  .max(CAMPAIGN_NAME_MAX, { error: `A campaign name is at most ${CAMPAIGN_NAME_MAX} characters.` });

const total = z
  .number({ error: 'total is the number of files in the campaign.' })
  .int({ error: 'total is a whole number of files.' })
  .min(0, { error: 'total is 0 or more.' })
  .max(1_000_000, { error: 'total is at most 1 000 000 files.' });

const jsonObject = (what: string) =>
  z.record(z.string(), z.unknown(), { error: `${what} is a JSON object.` });

const byteLength = (v: unknown) => new TextEncoder().encode(JSON.stringify(v)).length;

export const createCampaignBody = z.object({
  name: campaignName,
  preset: jsonObject('The preset').refine((p) => byteLength(p) <= CAMPAIGN_PRESET_MAX_BYTES, {
    error: `The preset is at most ${CAMPAIGN_PRESET_MAX_BYTES / 1024} kB of JSON.`,
  }),
  total: total.nullable().default(null),
  tags: campaignTags.default({}),
});
export type CreateCampaignBody = z.infer<typeof createCampaignBody>;

export const updateCampaignBody = z
  .object({ name: campaignName.optional(), total: total.nullable().optional(), tags: campaignTags.optional() })
  .refine((b) => b.name !== undefined || b.total !== undefined || b.tags !== undefined, {
    error: 'Change the name, the total or the tags.',
    path: ['name'],
  });
export type UpdateCampaignBody = z.infer<typeof updateCampaignBody>;

/** The inverter object's size is checked by the service (413), not here. */
export const postCampaignResultBody = z.object({
  file: fileName,
  ok: z.boolean({ error: 'ok is true (analysed) or false (failed).' }),
  inverter: jsonObject('inverter').nullable().default(null),
  error: z.string({ error: 'error is the failure in one sentence.' }).max(2000, { error: 'error is at most 2000 characters.' }).nullable().default(null),
  tags: tagValues.default({}),
});
export type PostCampaignResultBody = z.infer<typeof postCampaignResultBody>;

/** file (A→Z), the time a result came, the level of the strongest family or the overall level (files without one last), ok (failures first); `-` descends. */
export const campaignResultSorts = ['file', '-file', 'createdAt', '-createdAt', 'peakDb', '-peakDb', 'overallDb', '-overallDb', 'ok', '-ok'] as const;
export type CampaignResultSort = (typeof campaignResultSorts)[number];

export const listCampaignResultsQuery = z.object({
  limit: z.coerce
    .number({ error: 'limit is a number of results.' })
    .int({ error: 'limit is a whole number.' })
    .min(1, { error: 'limit is at least 1.' })
    .default(CAMPAIGN_RESULTS_PAGE_DEFAULT)
    .transform((n) => Math.min(n, CAMPAIGN_RESULTS_PAGE_MAX)),
  offset: z.coerce.number({ error: 'offset is a number of results.' }).int({ error: 'offset is a whole number.' }).min(0, { error: 'offset is 0 or more.' }).default(0),
  sort: z.enum(campaignResultSorts, { error: `sort is one of ${campaignResultSorts.join(', ')}.` }).default('file'),
  /** Part of a file name or error text. */
  q: z.string().trim().max(200, { error: 'Search for at most 200 characters.' }).default(''),
});
export type ListCampaignResultsQuery = z.infer<typeof listCampaignResultsQuery>;

export const campaignParams = z.object({ projectId: z.coerce.number().int().positive(), campaignId: z.coerce.number().int().positive() });
export const campaignProjectParams = z.object({ projectId: z.coerce.number().int().positive() });

export interface Campaign {
  id: number;
  projectId: number;
  name: string;
  preset: Record<string, unknown>;
  /** Files the campaign was started with; null when not told. */
  total: number | null;
  /** Results stored, failed ones included. */
  done: number;
  /** Results with ok false. */
  failed: number;
  tags: Record<string, TagValues>;
  createdBy: PersonRef | null;
  createdAt: string;
  updatedAt: string;
}

/** The list leaves the per-file tags out (they can be large); GET one campaign has them. */
export type CampaignListItem = Omit<Campaign, 'tags'>;

/** What a campaign table shows of one file's inverter analysis, read from the raw inverter object. */
export interface CampaignResultSummary {
  /** The carrier frequencies in the order the run went through them, Hz. */
  carrierScheduleHz: number[];
  shifts: { rpm: number; fromHz: number; toHz: number }[];
  /** Spread-spectrum switching: the measured spread width, Hz, or none. */
  spread: { spread: boolean; widthHz: number | null };
  polePairs: number | null;
  /** The strongest carrier families: peak level in dB re 1 channel unit (RMS), at that speed. */
  strongestFamilies: { m: number; n: number; peakDb: number; peakRpm: number }[];
  /** The overall level in dB, when the analysis gave one. */
  overallDb: number | null;
}

export interface CampaignResult {
  id: number;
  file: string;
  ok: boolean;
  error: string | null;
  /** The campaign's tags for this file, with the result's own on top. */
  tags: TagValues;
  summary: CampaignResultSummary | null;
  inverter: Record<string, unknown> | null;
  createdAt: string;
}

export interface CampaignResultPage {
  results: CampaignResult[];
  /** Results matching q, all pages. */
  total: number;
}
