/**
 * The snapshot file (media type application/vnd.fanlight.snapshot): a view's map small enough to travel
 * without the recording. Pure and universal (no Node or DOM APIs beyond TextEncoder/TextDecoder), so the
 * client can write and read the same bytes.
 *
 *   offset 0   4 bytes   magic, ASCII "FLS1"
 *   offset 4   u32 LE    H, the header's length in bytes
 *   offset 8   H bytes   the header, UTF-8 JSON (snapshotHeader in snapshot-format.ts):
 *                        { width, height, encoding: 'u8-db', dbTop, dbRange,
 *                          axes: { x: {kind, from, to, unit}, y: {…} }, tracks?, findings? }
 *   offset 8+H width×height bytes, nothing after them
 *
 * The map is stored row by row: row 0 is the y axis's `from` end, column 0 its x axis's `from` end. Byte v
 * stands for the level dbTop − dbRange + v·dbRange/255 dB: 0 is at or below the bottom of the colour range,
 * 255 at or above its top.
 */
import type { z } from 'zod';
import { SNAPSHOT_MAGIC, snapshotHeader, type SnapshotHeader } from './snapshot-format';

export const SNAPSHOT_HEADER_MAX_BYTES = 1024 * 1024;
const PREFIX = 8;

export type SnapshotDecodeResult =
  | { ok: true; header: SnapshotHeader; map: Uint8Array }
  | { ok: false; message: string; fields: Record<string, string> };

const fail = (message: string, field = 'snapshot', detail = message): SnapshotDecodeResult => ({
  ok: false,
  message,
  fields: { [field]: detail },
});

function headerProblems(error: z.ZodError): Record<string, string> {
  const fields: Record<string, string> = {};
  for (const issue of error.issues) {
    const key = ['snapshot', 'header', ...issue.path.map(String)].join('.');
    fields[key] ??= issue.message;
  }
  return fields;
}

export function decodeSnapshot(bytes: Uint8Array): SnapshotDecodeResult {
  if (bytes.length < PREFIX) return fail('The snapshot file is too short to hold its magic and header length.');
  const magic = String.fromCharCode(bytes[0], bytes[1], bytes[2], bytes[3]);
  if (magic !== SNAPSHOT_MAGIC) {
    return fail(`The snapshot file does not start with the magic "${SNAPSHOT_MAGIC}".`);
  }
  const headerLength = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength).getUint32(4, true);
  if (headerLength === 0 || headerLength > SNAPSHOT_HEADER_MAX_BYTES) {
    return fail(`The snapshot header length must be 1 to ${SNAPSHOT_HEADER_MAX_BYTES} bytes, not ${headerLength}.`);
  }
  if (PREFIX + headerLength > bytes.length) {
    return fail(`The snapshot header claims ${headerLength} bytes but the file ends before that.`);
  }
  let json: unknown;
  try {
    const text = new TextDecoder('utf-8', { fatal: true }).decode(bytes.subarray(PREFIX, PREFIX + headerLength));
    json = JSON.parse(text);
  } catch {
    return fail('The snapshot header is not UTF-8 JSON.');
  }
  const parsed = snapshotHeader.safeParse(json);
  if (!parsed.success) {
    return { ok: false, message: 'The snapshot header is not valid.', fields: headerProblems(parsed.error) };
  }
  const header = parsed.data;
  const expected = header.width * header.height;
  const map = bytes.subarray(PREFIX + headerLength);
  if (map.length !== expected) {
    return fail(
      `The snapshot map holds ${map.length} bytes, but width × height = ${header.width} × ${header.height} = ${expected}.`,
    );
  }
  return { ok: true, header, map };
}

export function encodeSnapshot(header: SnapshotHeader, map: Uint8Array): Uint8Array {
  if (map.length !== header.width * header.height) throw new Error('The map must hold width × height bytes.');
  const json = new TextEncoder().encode(JSON.stringify(header));
  const out = new Uint8Array(PREFIX + json.length + map.length);
  for (let i = 0; i < 4; i++) out[i] = SNAPSHOT_MAGIC.charCodeAt(i);
  new DataView(out.buffer).setUint32(4, json.length, true);
  out.set(json, PREFIX);
  out.set(map, PREFIX + json.length);
  return out;
}

/** Quantises a level in dB to the byte the map stores (clamped to the colour range). */
export function quantiseDb(levelDb: number, dbTop: number, dbRange: number): number {
  const v = Math.round(((levelDb - (dbTop - dbRange)) / dbRange) * 255);
  return Number.isFinite(v) ? Math.min(255, Math.max(0, v)) : 0;
}

/** The level a stored byte stands for, dB. */
export const levelOfByte = (v: number, dbTop: number, dbRange: number) => dbTop - dbRange + (v * dbRange) / 255;
