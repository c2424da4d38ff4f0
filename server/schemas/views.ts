// Imports zod only: the client imports these schemas too.
import { z } from 'zod';
import { email, personName } from './auth';

/*
 * Saved views, their compact snapshot, marks and threads, share links and notification settings.
 *
 * The view state is versioned (`stateVersion`) and every object in it is loose: fields this version does
 * not know are kept as they came, so a state written by a newer client survives a round trip through an
 * older server, and a state written today still parses once the schema grows. Growing it: add optional
 * fields (with defaults) to the current version; for a change that breaks the shape, add `viewStateV2`
 * beside `viewStateV1` in the `viewState` union and an upgrade in `upgradeViewState`, never edit v1.
 */

// ---------------------------------------------------------------- view state, version 1

// Numbers in views and marks are axis values (Hz, rpm, s, dB): anything beyond 10¹² in size is an error
// (1e308 would pass as a finite number and then break every drawing of it).
const NUMBER_LIMIT = 1e12;
const finite = z
  .number({ error: 'Enter a number.' })
  .min(-NUMBER_LIMIT, { error: 'Out of range: at most 10¹² in size.' })
  .max(NUMBER_LIMIT, { error: 'Out of range: at most 10¹² in size.' });

const windowNames = ['rect', 'hann', 'hamming', 'blackman-harris', 'flattop'] as const;
const isPowerOfTwo = (n: number) => Number.isInteger(n) && n > 0 && (n & (n - 1)) === 0;

/** How the map is computed from the recording. */
export const processingSettings = z.looseObject({
  /** The channel the map is computed from (its index in the recording). */
  channelIndex: z.number().int().min(0).max(63),
  window: z.enum(windowNames, { error: 'Choose rect, hann, hamming, blackman-harris or flattop.' }),
  blockSize: z
    .number()
    .int()
    .min(256, { error: 'At least 256 samples.' })
    .max(65536, { error: 'At most 65536 samples.' })
    .refine(isPowerOfTwo, { error: 'The block size is a power of two.' }),
  /** Fraction of a block shared with the next, 0 … 0.95. */
  overlap: z.number().min(0).max(0.95, { error: 'At most 0.95.' }),
  scaling: z.enum(['peak', 'rms', 'psd'], { error: 'Choose peak, rms or psd.' }),
  weighting: z.enum(['A', 'C', 'Z'], { error: 'Choose A, C or Z.' }),
  levelScale: z.enum(['db', 'linear']).default('db'),
  /** The reference RMS value of 0 dB, in the channel's unit. */
  dbReference: z.number().positive().optional(),
  /** A map against time, or resampled against speed (a run-up map). */
  against: z.enum(['time', 'speed']).default('time'),
});

export const axisKinds = ['time', 'speed', 'frequency'] as const;

const axisRange = z
  .looseObject({ kind: z.enum(axisKinds), from: finite, to: finite, unit: z.string().trim().max(20) })
  .refine((a) => a.to > a.from, { error: 'The end of the range must lie above its start.', path: ['to'] });

/** What each axis shows and the visible window (the zoom). `swapped`: frequency across rather than up. */
export const axesState = z.looseObject({
  swapped: z.boolean().default(false),
  x: axisRange,
  y: axisRange,
});

/** The colour scale and the level range it spans, top down. */
export const colourRangeState = z.looseObject({
  scale: z.string().trim().min(1).max(40),
  topDb: finite,
  rangeDb: z.number().positive({ error: 'The range must be above 0 dB.' }).max(300),
});

/** An order: f = k·fr, k in shaft orders (may be fractional, e.g. 0.5). */
export const orderGuide = z.looseObject({
  kind: z.literal('order'),
  order: z.number().positive({ error: 'An order is above 0.' }).max(1000),
});
/** A carrier family: f = m·fc ± n·fe (n in electrical orders; n = 0 is the carrier harmonic itself). */
export const familyGuide = z.looseObject({
  kind: z.literal('family'),
  m: z.number().int().min(1, { error: 'm is a whole number from 1.' }).max(50),
  n: z.number().int().min(-100).max(100),
});
export const guideRef = z.discriminatedUnion('kind', [orderGuide, familyGuide], {
  error: 'A guide is an order or a carrier family.',
});
export type GuideRef = z.infer<typeof guideRef>;

const viewGuide = z.discriminatedUnion('kind', [
  orderGuide.extend({ label: z.string().max(60).optional(), visible: z.boolean().default(true) }),
  familyGuide.extend({ label: z.string().max(60).optional(), visible: z.boolean().default(true) }),
]);

/** One segment of the carrier frequency over the run (the carrier may switch or drift). */
export const carrierSegment = z
  .looseObject({
    fromS: z.number().min(0),
    toS: z.number().min(0),
    carrierHz: z.number().positive({ error: 'The carrier frequency is above 0 Hz.' }).max(1_000_000),
  })
  .refine((s) => s.toS > s.fromS, { error: 'A segment ends after it starts.', path: ['toS'] });

/** A track the dock shows: the level of a guide, the overall level, or one third-octave band. */
export const trackRef = z.discriminatedUnion('kind', [
  orderGuide,
  familyGuide,
  z.looseObject({ kind: z.literal('overall'), weighting: z.enum(['A', 'C', 'Z']).default('Z') }),
  z.looseObject({ kind: z.literal('band'), centreHz: z.number().positive() }),
]);

/**
 * A carrier guide as the Bench holds it, so a view reopens on the Bench with the same guides: the
 * detected carrier (which follows its shifts) or a typed centre, and its families m·fc + n·fe
 * (per 'electrical') or m·fc + k·fr (per 'shaft').
 */
export const carrierGuideState = z.looseObject({
  source: z.enum(['typed', 'detected']),
  centreHz: z.number().min(0).max(1_000_000),
  per: z.enum(['electrical', 'shaft']).default('electrical'),
  families: z
    .array(z.looseObject({ m: z.number().int().min(1).max(50), n: z.number().int().min(-100).max(100) }))
    .max(50, { error: 'At most 50 families on one carrier.' }),
  visible: z.boolean().default(true),
});

/** Where the map's speed came from: tacho pulses, a speed channel, a typed ramp, or none. */
export const speedSourceState = z.discriminatedUnion(
  'kind',
  [
    z.looseObject({ kind: z.literal('none') }),
    z.looseObject({
      kind: z.literal('tacho'),
      channel: z.number().int().min(0).max(63),
      ppr: z.number().int().min(1).max(100_000),
      triggerLevel: finite.nullable().default(null),
    }),
    z.looseObject({
      kind: z.literal('channel'),
      channel: z.number().int().min(0).max(63),
      rpmPerUnit: finite.refine((v) => v !== 0, { error: 'The scale is not 0.' }),
    }),
    z.looseObject({ kind: z.literal('ramp'), startRpm: z.number().min(0).max(1_000_000), endRpm: z.number().min(0).max(1_000_000) }),
  ],
  { error: 'The speed source is tacho, channel, ramp or none.' },
);

const comparisonLevels = z.array(finite.nullable()).max(4000, { error: 'At most 4000 points on the speed grid.' });
const runText = z.string().max(300);

/**
 * Several runs compared (the Bench's workspace): the runs (the baseline first), one guide's level of
 * each on a common speed grid, the target it was checked against, every exceedance, each run's carrier
 * against speed and its findings in words. The view's map is the baseline's.
 */
export const comparisonState = z.looseObject({
  runs: z
    .array(z.looseObject({ name: z.string().trim().min(1).max(255), fingerprint: z.string().regex(/^[0-9a-f]{16,128}$/i, { error: 'A run is named by its fingerprint.' }) }))
    .min(2, { error: 'A comparison has at least two runs.' })
    .max(6, { error: 'At most six runs.' }),
  track: z.looseObject({ label: z.string().trim().min(1).max(60), guide: guideRef }).nullable(),
  unit: z.string().max(40),
  rpm: z.array(finite).max(4000),
  /** Per run, the track's level on the grid, dB (null outside the run's speed range) */
  levels: z.array(comparisonLevels).max(6),
  /** The target on the grid, dB (null outside it), when the track has one */
  target: comparisonLevels.nullable(),
  exceedances: z
    .array(z.looseObject({ run: z.string().max(255), fromRpm: finite, toRpm: finite, maxExcessDb: finite, atRpm: finite }))
    .max(200),
  carrierRpm: z.array(finite).max(4000),
  carrierHz: z.array(comparisonLevels).max(6),
  findings: z.array(z.looseObject({ carrier: runText, shifts: runText, spread: runText, poles: runText, families: runText })).max(6),
});
export type ComparisonState = z.infer<typeof comparisonState>;

export const viewStateV1 = z.looseObject({
  stateVersion: z.literal(1),
  processing: processingSettings,
  axes: axesState,
  colourRange: colourRangeState,
  guides: z.array(viewGuide).max(200, { error: 'At most 200 guides.' }).default([]),
  carrierSchedule: z.array(carrierSegment).max(200, { error: 'At most 200 segments.' }).default([]),
  polePairs: z.number().int().min(1).max(64).nullable().default(null),
  selectedTracks: z.array(trackRef).max(50, { error: 'At most 50 tracks.' }).default([]),
  /** Added after the first views were saved: absent in those, which reopen with the carriers of `guides`. */
  carrierGuides: z.array(carrierGuideState).max(20, { error: 'At most 20 carrier guides.' }).optional(),
  /** The speed source the map against speed and the guides were computed with. */
  speedSource: speedSourceState.optional(),
  /** Whether `polePairs` was typed on the Bench or inferred from the sideband spacing. */
  polePairsSource: z.enum(['typed', 'inferred']).optional(),
  /** Saved from a comparison of runs (absent in a view of one run). */
  comparison: comparisonState.optional(),
});
export type ViewStateV1 = z.infer<typeof viewStateV1>;

export const VIEW_STATE_VERSION = 1;

/** Every state version still readable; the newest is what the client writes. */
export const viewState = z.discriminatedUnion('stateVersion', [viewStateV1], {
  error: `The view state needs stateVersion ${VIEW_STATE_VERSION}.`,
});
export type ViewState = z.infer<typeof viewState>;

/** Brings a parsed state of any known version to the newest shape (v1 is the newest: nothing to do yet). */
export const upgradeViewState = (s: ViewState): ViewStateV1 => s;

// ---------------------------------------------------------------- views

const title = z
  .string({ error: 'Give the view a title.' })
  .trim()
  .min(1, { error: 'Give the view a title.' })
  .max(191, { error: 'At most 191 characters.' });
const version = z.number({ error: 'Send the version you edited.' }).int().positive();
const id = z.coerce.number().int().positive();

export const viewIdParams = z.object({ id });
export const markIdParams = z.object({ id });
export const linkIdParams = z.object({ id });

export const createViewBody = z.object({
  title,
  /** The registered recording this view was made from (same project), if any. */
  recordingId: z.number().int().positive().nullable().default(null),
  state: viewState,
});
export type CreateViewBody = z.infer<typeof createViewBody>;

export const updateViewBody = z
  .object({ version, title: title.optional(), state: viewState.optional() })
  .refine((b) => b.title !== undefined || b.state !== undefined, {
    error: 'Change the title or the state.',
    path: ['title'],
  });
export type UpdateViewBody = z.infer<typeof updateViewBody>;

export const archiveViewBody = z.object({ archived: z.boolean().default(true) });

export const viewSorts = ['updated', 'created', 'title', 'author', 'recording', 'threads'] as const;

/** Query of the project's list of views. */
export const listViewsQuery = z.object({
  sort: z.enum(viewSorts, { error: `Sort by ${viewSorts.join(', ')}.` }).default('updated'),
  order: z.enum(['asc', 'desc'], { error: 'Order asc or desc.' }).optional(),
  /** Words found in the title, the author's name or the recording's name. */
  q: z.string().trim().max(191).default(''),
  archived: z.enum(['exclude', 'include', 'only'], { error: 'Choose exclude, include or only.' }).default('exclude'),
  page: z.coerce.number({ error: 'A page is a number from 1.' }).int().min(1).default(1),
  pageSize: z.coerce.number({ error: 'A page size is a number from 1 to 100.' }).int().min(1).max(100).default(20),
});
export type ListViewsQuery = z.infer<typeof listViewsQuery>;

export interface PersonRef {
  id: number;
  name: string;
}

export interface ViewSummary {
  id: number;
  title: string;
  authorName: string | null;
  recordingId: number | null;
  recordingName: string | null;
  createdAt: string;
  updatedAt: string;
  markCount: number;
  /** Threads (each mark's, plus the view's own) with at least one comment. */
  openThreads: number;
  archived: boolean;
  hasSnapshot: boolean;
}

export interface ViewList {
  views: ViewSummary[];
  total: number;
  page: number;
  pageSize: number;
}

export interface SnapshotInfo {
  rawSize: number;
  storedSize: number;
  width: number;
  height: number;
  updatedAt: string;
}

export interface ViewDetail {
  id: number;
  projectId: number;
  title: string;
  recordingId: number | null;
  recordingName: string | null;
  state: ViewState;
  version: number;
  author: PersonRef | null;
  createdAt: string;
  updatedAt: string;
  archived: boolean;
  archivedAt: string | null;
  snapshot: SnapshotInfo | null;
}

// ---------------------------------------------------------------- marks and comments

export const MARK_TEXT_MAX = 2000;
export const COMMENT_MAX = 2000;

const markText = z
  .string({ error: 'Write a text (it may be empty).' })
  .max(MARK_TEXT_MAX, { error: `At most ${MARK_TEXT_MAX} characters.` })
  .transform((s) => s.trim());

export const pointGeometry = z.object({ x: finite, y: finite });
export const boxGeometry = z
  .object({ x0: finite, x1: finite, y0: finite, y1: finite })
  .refine((b) => b.x1 > b.x0, { error: 'x1 lies right of x0.', path: ['x1'] })
  .refine((b) => b.y1 > b.y0, { error: 'y1 lies above y0.', path: ['y1'] });
export const guideGeometry = z.object({ guide: guideRef });

export const markKinds = ['point', 'box', 'guide'] as const;
export type MarkKind = (typeof markKinds)[number];

export const geometryOf = { point: pointGeometry, box: boxGeometry, guide: guideGeometry } as const;
export type MarkGeometry = z.infer<typeof pointGeometry> | z.infer<typeof boxGeometry> | z.infer<typeof guideGeometry>;

export const createMarkBody = z.discriminatedUnion(
  'kind',
  [
    z.object({ kind: z.literal('point'), geometry: pointGeometry, text: markText.default('') }),
    z.object({ kind: z.literal('box'), geometry: boxGeometry, text: markText.default('') }),
    z.object({ kind: z.literal('guide'), geometry: guideGeometry, text: markText.default('') }),
  ],
  { error: 'Choose point, box or guide.' },
);
export type CreateMarkBody = z.infer<typeof createMarkBody>;

/** An edit: the text, the place (kind and geometry together), or both; always with the version edited. */
export const updateMarkBody = z
  .object({
    version,
    text: markText.optional(),
    kind: z.enum(markKinds, { error: 'Choose point, box or guide.' }).optional(),
    geometry: z.unknown().optional(),
  })
  .superRefine((b, ctx) => {
    if (b.text === undefined && b.kind === undefined && b.geometry === undefined) {
      ctx.addIssue({ code: 'custom', message: 'Change the text or the place.', path: ['text'] });
      return;
    }
    if ((b.kind === undefined) !== (b.geometry === undefined)) {
      const missing = b.kind === undefined ? 'kind' : 'geometry';
      ctx.addIssue({ code: 'custom', message: 'Send the kind and the geometry together.', path: [missing] });
      return;
    }
    if (b.kind !== undefined) {
      const parsed = geometryOf[b.kind].safeParse(b.geometry);
      if (!parsed.success) {
        for (const issue of parsed.error.issues) {
          ctx.addIssue({ code: 'custom', message: issue.message, path: ['geometry', ...issue.path] });
        }
      }
    }
  })
  .transform((b) => ({
    version: b.version,
    text: b.text,
    place: b.kind === undefined ? undefined : { kind: b.kind, geometry: geometryOf[b.kind].parse(b.geometry) as MarkGeometry },
  }));
export type UpdateMarkBody = z.infer<typeof updateMarkBody>;

export interface Mark {
  id: number;
  viewId: number;
  kind: MarkKind;
  geometry: MarkGeometry;
  text: string;
  version: number;
  author: PersonRef | null;
  createdAt: string;
  updatedAt: string;
  commentCount: number;
}

const commentText = z
  .string({ error: 'Write a comment.' })
  .trim()
  .min(1, { error: 'Write a comment.' })
  .max(COMMENT_MAX, { error: `At most ${COMMENT_MAX} characters.` });

export const createCommentBody = z.object({ body: commentText });
export type CreateCommentBody = z.infer<typeof createCommentBody>;

/** A reply through a share link: a name instead of an account; markId answers in that mark's thread. */
export const sharedCommentBody = z.object({
  name: personName,
  body: commentText,
  markId: z.number().int().positive().nullable().default(null),
});
export type SharedCommentBody = z.infer<typeof sharedCommentBody>;

export interface ThreadComment {
  id: number;
  viewId: number;
  /** null: the view's own thread. */
  markId: number | null;
  body: string;
  author: { id: number | null; name: string; viaLink: boolean };
  createdAt: string;
}

// ---------------------------------------------------------------- share links

export const createShareLinkBody = z.object({
  expiresAt: z.iso
    .datetime({ offset: true, error: 'Give a date and time such as 2027-01-31T18:00:00Z.' })
    .transform((s) => new Date(s))
    .refine((d) => d.getTime() > Date.now(), { error: 'Choose a time in the future.' })
    .nullable()
    .default(null),
  mayReply: z.boolean().default(false),
});
export type CreateShareLinkBody = z.infer<typeof createShareLinkBody>;

export const shareTokenParams = z.object({ token: z.string().regex(/^[A-Za-z0-9_-]{43}$/) });

export interface ShareLinkSummary {
  id: number;
  viewId: number;
  mayReply: boolean;
  expiresAt: string | null;
  revokedAt: string | null;
  status: 'active' | 'expired' | 'revoked';
  createdBy: string | null;
  createdAt: string;
}

export interface SharedViewBundle {
  view: {
    id: number;
    title: string;
    state: ViewState;
    projectName: string;
    recordingName: string | null;
    hasSnapshot: boolean;
    updatedAt: string;
  };
  marks: Mark[];
  /** The view's thread and every mark's, oldest first. */
  comments: ThreadComment[];
  mayReply: boolean;
}

/** POST /api/views/:id/share: mail a project member a link to the view. */
export const shareByMailBody = z.object({ email });
export type ShareByMailBody = z.infer<typeof shareByMailBody>;

// ---------------------------------------------------------------- notifications

export interface NotificationSettings {
  /** A comment on your mark or your view. */
  replies: boolean;
  /** Someone wrote your @handle. */
  mentions: boolean;
  /** A view shared with you by mail. */
  shares: boolean;
}

export const updateNotificationsBody = z
  .object({ replies: z.boolean().optional(), mentions: z.boolean().optional(), shares: z.boolean().optional() })
  .refine((b) => b.replies !== undefined || b.mentions !== undefined || b.shares !== undefined, {
    error: 'Turn replies, mentions or shares on or off.',
    path: ['replies'],
  });
export type UpdateNotificationsBody = z.infer<typeof updateNotificationsBody>;

// ---------------------------------------------------------------- a view saved whole

/** At most this many new marks travel with one save. */
export const MAX_MARKS_PER_SAVE = 200;
const marksOfSave = z
  .array(createMarkBody)
  .max(MAX_MARKS_PER_SAVE, { error: `At most ${MAX_MARKS_PER_SAVE} marks in one save.` })
  .default([]);

/**
 * A new view with its snapshot and its marks, stored in one transaction: the form field `view` holds this
 * as JSON, the file field `snapshot` the snapshot (multipart/form-data).
 */
export const saveViewBody = createViewBody.extend({ marks: marksOfSave });
export type SaveViewBody = z.infer<typeof saveViewBody>;

/** Changes to a view saved whole: its state, a new snapshot and more marks, from the version edited. */
export const saveViewChangesBody = z.object({ version, title: title.optional(), state: viewState, marks: marksOfSave });
export type SaveViewChangesBody = z.infer<typeof saveViewChangesBody>;
