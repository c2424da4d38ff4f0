// Imports zod only: the client imports these schemas too.
import { z } from 'zod';
import type { PersonRef } from './views';

/*
 * A project's targets: limit curves of a track's level against speed, piecewise linear between their
 * points, in dB re the channel's reference with the weighting stated. The track grammar and the point
 * limits are those of workers/io/target-csv.ts (parseTrackKey, MAX_TARGET_POINTS), written again here
 * because schemas import only zod; tests/unit/io/shared-vocabulary.test.ts keeps the two equal.
 */

export const targetWeightings = ['A', 'Z'] as const;
export type TargetWeighting = (typeof targetWeightings)[number];

/** At most this many points in one target (MAX_TARGET_POINTS in workers/io/target-csv.ts). */
export const TARGET_MAX_POINTS = 500;
/** The largest CSV text an import takes, in characters. */
export const TARGET_CSV_MAX_CHARS = 200_000;

/** order:K (0 < K ≤ 1000, decimals allowed), family:M:N (1 ≤ M ≤ 8, |N| ≤ 40) or overall; lower case, no spaces. */
const TRACK_FORM = /^(?:overall|order:(\d+(?:\.\d+)?)|family:(\d+):([+-]?\d+))$/;

/** The track in its one written form (order:48, family:1:-2, overall), or null when the text is no track. */
export function canonicalTrackText(text: string): string | null {
  const m = TRACK_FORM.exec(text.trim().toLowerCase());
  if (!m) return null;
  if (m[1] !== undefined) {
    const order = Number(m[1]);
    return order > 0 && order <= 1000 ? `order:${order}` : null;
  }
  if (m[2] !== undefined) {
    const fm = Number(m[2]);
    const fn = Number(m[3]);
    return fm >= 1 && fm <= 8 && Math.abs(fn) <= 40 ? `family:${fm}:${fn}` : null;
  }
  return 'overall';
}

const TRACK_ERROR = 'Name the track as order:K (0 < K ≤ 1000), family:M:N (M 1…8, N −40…40) or overall.';

/** A track, given in any case and spacing, answered in its one written form. */
export const targetTrack = z
  .string({ error: TRACK_ERROR })
  .max(40, { error: TRACK_ERROR })
  .refine((t) => canonicalTrackText(t) !== null, { error: TRACK_ERROR })
  .transform((t) => canonicalTrackText(t)!);

export const targetWeighting = z.enum(targetWeightings, { error: 'The weighting is A or Z.' });

const rpm = z
  .number({ error: 'A speed is a number in rpm.' })
  .min(0, { error: 'A speed is 0 rpm or more.' })
  .max(1_000_000, { error: 'A speed is at most 1 000 000 rpm.' });
const level = z
  .number({ error: 'A level is a number in dB.' })
  .min(-1000, { error: 'A level lies within ±1000 dB.' })
  .max(1000, { error: 'A level lies within ±1000 dB.' });

/** [rpm, dB] pairs, 2 … 500 of them, the speeds rising from point to point. */
export const targetPoints = z
  .array(z.tuple([rpm, level], { error: 'A point is a pair [rpm, dB].' }), { error: 'Send the points as a list of [rpm, dB] pairs.' })
  .min(2, { error: 'A target needs at least two points (rpm, dB).' })
  .max(TARGET_MAX_POINTS, { error: `A target has at most ${TARGET_MAX_POINTS} points.` })
  .superRefine((points, ctx) => {
    for (let i = 1; i < points.length; i++) {
      if (!(points[i][0] > points[i - 1][0])) {
        ctx.addIssue({
          code: 'custom',
          path: [i],
          message: `The speeds must rise from point to point: point ${i + 1} (${points[i][0]} rpm) does not lie above point ${i} (${points[i - 1][0]} rpm).`,
        });
        return;
      }
    }
  });
export type TargetPoints = z.infer<typeof targetPoints>;

/** A short name for the curve; empty is none. */
const label = z
  .string({ error: 'A label is text.' })
  .trim()
  .max(120, { error: 'At most 120 characters.' })
  .nullable()
  .transform((l) => (l ? l : null));

const version = z.number({ error: 'Send the version you edited.' }).int().positive();
const id = z.coerce.number().int().positive();

export const targetIdParams = z.object({ id });

export const createTargetBody = z.object({
  track: targetTrack,
  weighting: targetWeighting,
  points: targetPoints,
  label: label.default(null),
});
export type CreateTargetBody = z.infer<typeof createTargetBody>;

export const updateTargetBody = z
  .object({
    version,
    track: targetTrack.optional(),
    weighting: targetWeighting.optional(),
    points: targetPoints.optional(),
    label: label.optional(),
  })
  .refine((b) => b.track !== undefined || b.weighting !== undefined || b.points !== undefined || b.label !== undefined, {
    error: 'Change the track, the weighting, the points or the label.',
    path: ['points'],
  });
export type UpdateTargetBody = z.infer<typeof updateTargetBody>;

/** A CSV file of targets (header track,rpm,db; one row per point), all of one weighting. */
export const importTargetsBody = z.object({
  csv: z
    .string({ error: 'Send the CSV text in "csv".' })
    .min(1, { error: 'The CSV text is empty.' })
    .max(TARGET_CSV_MAX_CHARS, { error: `A CSV of targets is at most ${TARGET_CSV_MAX_CHARS / 1000} kB.` }),
  weighting: targetWeighting,
  /** true: the project's targets of this weighting become exactly those of the file. */
  replace: z.boolean({ error: 'replace is true or false.' }).default(false),
});
export type ImportTargetsBody = z.infer<typeof importTargetsBody>;

export interface Target {
  id: number;
  projectId: number;
  /** order:48, family:1:2 or overall */
  track: string;
  weighting: TargetWeighting;
  /** [rpm, dB], ascending in rpm */
  points: [number, number][];
  label: string | null;
  version: number;
  createdBy: PersonRef | null;
  createdAt: string;
  updatedAt: string;
}

export interface ImportTargetsResult {
  /** The project's targets after the import, every weighting. */
  targets: Target[];
  created: number;
  updated: number;
  /** Targets of the weighting removed because the file did not have them (replace only). */
  removed: number;
}
