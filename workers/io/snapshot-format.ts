/**
 * The snapshot file's format (media type application/vnd.fanlight.snapshot): its limits and the JSON
 * header inside it. The layout and the codec are in snapshot-codec.ts. A file format of our own, shared
 * by the page (which writes it), the server (which checks it on upload) and the seeds; so it lives with
 * the other pure file code, and keeps its own axis vocabulary (the same words as a view's axes, which a
 * test holds to server/schemas/views.ts).
 */
import { z } from 'zod';

/** The snapshot's own media type. */
export const SNAPSHOT_CONTENT_TYPE = 'application/vnd.fanlight.snapshot';
export const SNAPSHOT_MAGIC = 'FLS1';
/** Upload cap of one snapshot file (before compression). */
export const SNAPSHOT_MAX_BYTES = 4 * 1024 * 1024;
export const SNAPSHOT_MAX_SIDE = 4096;

export const snapshotAxisKinds = ['time', 'speed', 'frequency'] as const;

// Axis values (Hz, rpm, s, dB) beyond 10¹² in size are errors, as in a view.
const NUMBER_LIMIT = 1e12;
const finite = z
  .number({ error: 'Enter a number.' })
  .min(-NUMBER_LIMIT, { error: 'Out of range: at most 10¹² in size.' })
  .max(NUMBER_LIMIT, { error: 'Out of range: at most 10¹² in size.' });

const snapshotAxis = z.looseObject({
  kind: z.enum(snapshotAxisKinds),
  from: finite,
  to: finite,
  unit: z.string().max(20),
});

const snapshotTrack = z.looseObject({
  name: z.string().trim().min(1).max(120),
  unit: z.string().max(20).default('dB'),
  /** [x in the x-axis unit, level in dB or null for a gap]. */
  points: z.array(z.tuple([finite, finite.nullable()])).max(SNAPSHOT_MAX_SIDE * 2),
});

const snapshotFinding = z.looseObject({
  kind: z.string().trim().min(1).max(40),
  summary: z.string().max(300),
  at: z.looseObject({ x: finite, y: finite }).optional(),
});

/** The JSON header inside the snapshot file. */
export const snapshotHeader = z.looseObject({
  width: z.number().int().min(1).max(SNAPSHOT_MAX_SIDE),
  height: z.number().int().min(1).max(SNAPSHOT_MAX_SIDE),
  encoding: z.literal('u8-db', { error: "The only encoding is 'u8-db'." }),
  /** The level of byte 255, dB. */
  dbTop: finite,
  /** The span from byte 0 to byte 255, dB. */
  dbRange: z.number().positive({ error: 'dbRange is above 0.' }).max(300),
  axes: z.object({ x: snapshotAxis, y: snapshotAxis }),
  tracks: z.array(snapshotTrack).max(64).optional(),
  findings: z.array(snapshotFinding).max(200).optional(),
});
export type SnapshotHeader = z.infer<typeof snapshotHeader>;
