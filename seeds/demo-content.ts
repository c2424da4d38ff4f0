/**
 * The demo project's content, so that every demo account sees a finished finding one click after signing
 * in: the demo recordings registered with the project, and a saved view of the run-up with its snapshot,
 * two marks and a short thread between the invented engineer and lead. Idempotent: the recordings are
 * looked up by fingerprint and the view by its title, so a second run changes nothing.
 */
import { promisify } from 'node:util';
import { gzip as gzipCb } from 'node:zlib';
import path from 'node:path';
import type { Knex } from 'knex';
import { openFileSource } from '../server/cli/node-file-source';
import { RecordingRepository } from '../server/repositories/recording-repository';
import { SNAPSHOT_CONTENT_TYPE } from '../workers/io/snapshot-format';
import { fingerprint } from '../workers/io/fingerprint';
import { readRecordingHeader } from '../workers/io/decode-recording';
import { demoRecordings, ensureDemoRecordings } from './demo-recordings';
import { TargetRepository, type NewTarget } from '../server/repositories/target-repository';

/** dB re 1 g on the inverter housing, Z-weighted (invented for the demo). */
export const DEMO_TARGETS: NewTarget[] = [
  {
    track: 'family:1:-1',
    weighting: 'Z',
    points: [
      [500, -25],
      [12000, -21],
    ],
    label: 'fc − fe on the inverter housing, programme limit',
  },
];
import { demoAccounts, demoProject } from './demo-scenario';
import { DEMO_VIEW_TITLE, RUN_UP_FILE, demoMarks, demoSnapshot, demoThread, demoViewState } from './demo-view';

const gzip = promisify(gzipCb);

export interface DemoContentReport {
  recordingsRegistered: number;
  viewCreated: boolean;
}

async function describeFile(file: string): Promise<{ fingerprint: string; sampleRateHz: number; durationS: number }> {
  const source = await openFileSource(file);
  try {
    const header = await readRecordingHeader(source);
    return { fingerprint: await fingerprint(source), sampleRateHz: header.sampleRateHz, durationS: header.durationS };
  } finally {
    await source.close();
  }
}

export async function seedDemoContent(db: Knex, demoDir: string): Promise<DemoContentReport> {
  const project = await db('projects').where({ name: demoProject.name }).first('id');
  if (!project) return { recordingsRegistered: 0, viewCreated: false };
  const userIds = new Map<string, number>();
  for (const a of demoAccounts) userIds.set(a.projectRole ?? a.email, (await db('users').where({ email: a.email }).first('id')).id);
  const engineerId = userIds.get('engineer')!;
  const leadId = userIds.get('lead')!;

  ensureDemoRecordings(demoDir);
  const recordings = new RecordingRepository(db);
  let recordingsRegistered = 0;
  const recordingIds = new Map<string, number>();
  for (const r of demoRecordings) {
    const info = await describeFile(path.join(demoDir, r.file));
    if (!(await recordings.find(project.id, info.fingerprint))) {
      await recordings.upsert(project.id, engineerId, {
        name: r.file,
        fingerprint: info.fingerprint,
        format: 'wav',
        sampleRateHz: info.sampleRateHz,
        durationS: info.durationS,
        channels: r.channels.map((c, index) => ({ index, name: c.name, quantity: c.quantity, unit: c.unit, calibration: { kind: 'scale', factor: c.factor } })),
      });
      recordingsRegistered++;
    }
    recordingIds.set(r.file, (await recordings.find(project.id, info.fingerprint))!.id);
  }

  // The programme's target for the first lower sideband on the housing (invented): the run-up of firmware A
  // goes above it from about 4200 rpm, firmware B stays under it.
  const targets = new TargetRepository(db);
  if ((await targets.list(project.id)).length === 0) {
    await targets.upsertPoints(project.id, DEMO_TARGETS, leadId);
  }

  if (await db('views').where({ project_id: project.id, title: DEMO_VIEW_TITLE }).first('id')) return { recordingsRegistered, viewCreated: false };
  const snapshot = await demoSnapshot(demoDir);
  const header = JSON.parse(new TextDecoder().decode(snapshot.subarray(8, 8 + new DataView(snapshot.buffer, snapshot.byteOffset).getUint32(4, true))));
  const gz = await gzip(snapshot);
  await db.transaction(async (trx) => {
    const [viewId] = await trx('views').insert({
      project_id: project.id,
      recording_id: recordingIds.get(RUN_UP_FILE),
      title: DEMO_VIEW_TITLE,
      state: JSON.stringify(demoViewState()),
      created_by: engineerId,
    });
    await trx('view_snapshots').insert({
      view_id: viewId,
      content_type: SNAPSHOT_CONTENT_TYPE,
      gzip_bytes: gz,
      raw_size: snapshot.length,
      width: header.width,
      height: header.height,
      uploaded_by: engineerId,
    });
    const markIds: number[] = [];
    for (const m of demoMarks) {
      const [id] = await trx('marks').insert({ view_id: viewId, kind: m.kind, geometry: JSON.stringify(m.geometry), body: m.text, author_id: engineerId });
      markIds.push(id);
    }
    for (const c of demoThread) {
      await trx('comments').insert({ view_id: viewId, mark_id: markIds[c.mark], body: c.body, author_id: c.who === 'lead' ? leadId : engineerId });
    }
    await trx('activity').insert({
      project_id: project.id,
      actor_id: engineerId,
      verb: 'saved',
      object_type: 'view',
      object_id: String(viewId),
      summary: `saved the view ${DEMO_VIEW_TITLE}`,
    });
  });
  return { recordingsRegistered, viewCreated: true };
}
