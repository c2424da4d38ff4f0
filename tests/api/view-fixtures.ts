/** Views, marks, snapshots and share links for API tests, made straight in the test database where a test needs a target. */
import { gzipSync } from 'node:zlib';
import type { Knex } from 'knex';
import { SNAPSHOT_CONTENT_TYPE, type SnapshotHeader } from '../../workers/io/snapshot-format';
import { encodeSnapshot } from '../../workers/io/snapshot-codec';
import { hashToken, newToken } from '../../server/services/tokens';

/** A whole view state of version 1, as the Bench would save it. */
export const sampleState = (overrides: Record<string, unknown> = {}) => ({
  stateVersion: 1,
  processing: { channelIndex: 0, window: 'hann', blockSize: 8192, overlap: 0.75, scaling: 'rms', weighting: 'A', levelScale: 'db', against: 'speed' },
  axes: {
    swapped: false,
    x: { kind: 'speed', from: 500, to: 12000, unit: 'rpm' },
    y: { kind: 'frequency', from: 0, to: 20000, unit: 'Hz' },
  },
  colourRange: { scale: 'ember', topDb: 110, rangeDb: 70 },
  guides: [
    { kind: 'order', order: 24, label: 'stator slots', visible: true },
    { kind: 'family', m: 1, n: 2, visible: true },
  ],
  carrierSchedule: [
    { fromS: 0, toS: 12.5, carrierHz: 8000 },
    { fromS: 12.5, toS: 30, carrierHz: 10000 },
  ],
  polePairs: 4,
  selectedTracks: [{ kind: 'order', order: 24 }, { kind: 'overall', weighting: 'A' }],
  ...overrides,
});

/** A snapshot header; `extra` may make it invalid on purpose (it is not checked here). */
export const sampleHeader = (width: number, height: number, extra: Partial<SnapshotHeader> = {}): SnapshotHeader =>
  ({
    width,
    height,
    encoding: 'u8-db',
    dbTop: 110,
    dbRange: 70,
    axes: { x: { kind: 'speed', from: 500, to: 12000, unit: 'rpm' }, y: { kind: 'frequency', from: 0, to: 20000, unit: 'Hz' } },
    tracks: [{ name: 'order 24', unit: 'dB', points: [[1000, 62.5], [2000, null], [3000, 71]] }],
    findings: [{ kind: 'carrier-shift', summary: 'carrier 8 → 10 kHz at 6200 rpm', at: { x: 6200, y: 10000 } }],
    ...extra,
  }) as SnapshotHeader;

/** A snapshot file of width × height with a gradient map. */
export function snapshotBytes(width = 64, height = 32, extra: Partial<SnapshotHeader> = {}): Buffer {
  const map = new Uint8Array(width * height);
  for (let i = 0; i < map.length; i++) map[i] = (i * 7 + Math.floor(i / width)) & 0xff;
  return Buffer.from(encodeSnapshot(sampleHeader(width, height, extra), map));
}

export const SNAPSHOT_TYPE = SNAPSHOT_CONTENT_TYPE;

export async function insertView(db: Knex, projectId: number, authorId: number, title = 'Fixture view'): Promise<number> {
  const [id] = await db('views').insert({ project_id: projectId, title, state: JSON.stringify(sampleState()), created_by: authorId });
  return id;
}

export async function insertSnapshot(db: Knex, viewId: number, bytes = snapshotBytes(8, 4)): Promise<void> {
  await db('view_snapshots').insert({
    view_id: viewId,
    content_type: SNAPSHOT_CONTENT_TYPE,
    gzip_bytes: gzipSync(bytes),
    raw_size: bytes.length,
    width: 8,
    height: 4,
  });
}

export async function insertMark(db: Knex, viewId: number, authorId: number, text = 'a fixture mark'): Promise<number> {
  const [id] = await db('marks').insert({ view_id: viewId, kind: 'point', geometry: JSON.stringify({ x: 3000, y: 8000 }), body: text, author_id: authorId });
  return id;
}

export async function insertLink(
  db: Knex,
  viewId: number,
  createdBy: number,
  opts: { mayReply?: boolean; expiresAt?: Date | null } = {},
): Promise<{ id: number; token: string }> {
  const token = newToken();
  const [id] = await db('share_links').insert({
    view_id: viewId,
    token_hash: hashToken(token),
    may_reply: opts.mayReply ?? false,
    expires_at: opts.expiresAt ?? null,
    created_by: createdBy,
  });
  return { id, token };
}

/** superagent parser that keeps a binary answer as a Buffer (after it undid Content-Encoding). */
export function binaryParser(res: object, done: (err: Error | null, body: Buffer) => void): void {
  const stream = res as NodeJS.ReadableStream;
  const chunks: Buffer[] = [];
  stream.on('data', (c: Buffer) => chunks.push(c));
  stream.on('end', () => done(null, Buffer.concat(chunks)));
}
