/**
 * The demo project's content, so that every demo account sees a finished finding one click after signing
 * in: the demo recordings registered with the project, a saved view of the run-up with its snapshot, two
 * marks and a short thread between the invented engineer and lead, and a saved comparison of the two
 * firmware run-ups against the demo target, with its marks and thread. Idempotent: the recordings are
 * looked up by fingerprint and the views by their titles, so a second run changes nothing.
 */
import { promisify } from 'node:util';
import { gzip as gzipCb } from 'node:zlib';
import path from 'node:path';
import type { Knex } from 'knex';
import { RecordingRepository } from '../server/repositories/recording-repository';
import { SNAPSHOT_CONTENT_TYPE } from '../workers/io/snapshot-format';
import { demoRecordings, ensureDemoRecordings } from './demo-recordings';
import { TargetRepository, type NewTarget } from '../server/repositories/target-repository';
import { describeFile } from './demo-analysis';
import { DEMO_COMPARISON_TITLE, demoComparison } from './demo-comparison';

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
  comparisonCreated: boolean;
}

interface DemoViewRows {
  projectId: number;
  recordingId: number | undefined;
  title: string;
  state: unknown;
  snapshot: Uint8Array;
  marks: { kind: string; geometry: unknown; text: string }[];
  thread: { who: 'engineer' | 'lead'; mark: number; body: string }[];
  engineerId: number;
  leadId: number;
}

/** A view saved by the demo engineer with its snapshot, marks and thread, in one transaction. */
async function insertDemoView(db: Knex, v: DemoViewRows): Promise<void> {
  const { snapshot, engineerId, leadId } = v;
  const header = JSON.parse(new TextDecoder().decode(snapshot.subarray(8, 8 + new DataView(snapshot.buffer, snapshot.byteOffset).getUint32(4, true))));
  const gz = await gzip(snapshot);
  await db.transaction(async (trx) => {
    const [viewId] = await trx('views').insert({
      project_id: v.projectId,
      recording_id: v.recordingId,
      title: v.title,
      state: JSON.stringify(v.state),
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
    for (const m of v.marks) {
      const [id] = await trx('marks').insert({ view_id: viewId, kind: m.kind, geometry: JSON.stringify(m.geometry), body: m.text, author_id: engineerId });
      markIds.push(id);
    }
    for (const c of v.thread) {
      await trx('comments').insert({ view_id: viewId, mark_id: markIds[c.mark], body: c.body, author_id: c.who === 'lead' ? leadId : engineerId });
    }
    await trx('activity').insert({
      project_id: v.projectId,
      actor_id: engineerId,
      verb: 'saved',
      object_type: 'view',
      object_id: String(viewId),
      summary: `saved the view ${v.title}`,
    });
  });
}

export async function seedDemoContent(db: Knex, demoDir: string): Promise<DemoContentReport> {
  const project = await db('projects').where({ name: demoProject.name }).first('id');
  if (!project) return { recordingsRegistered: 0, viewCreated: false, comparisonCreated: false };
  const userIds = new Map<string, number>();
  for (const a of demoAccounts) userIds.set(a.projectRole ?? a.email, (await db('users').where({ email: a.email }).first('id')).id);
  const engineerId = userIds.get('engineer')!;
  const leadId = userIds.get('lead')!;

  ensureDemoRecordings(demoDir);
  const recordings = new RecordingRepository(db);
  let recordingsRegistered = 0;
  const recordingIds = new Map<string, number>();
  const fingerprints = new Map<string, string>();
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
    fingerprints.set(r.file, info.fingerprint);
  }

  // The programme's target for the first lower sideband on the housing (invented): the run-up of firmware A
  // goes above it from about 4200 rpm, firmware B stays under it.
  const targets = new TargetRepository(db);
  if ((await targets.list(project.id)).length === 0) {
    await targets.upsertPoints(project.id, DEMO_TARGETS, leadId);
  }

  const engineer = { engineerId, leadId, projectId: project.id as number };
  const exists = async (title: string) => Boolean(await db('views').where({ project_id: project.id, title }).first('id'));
  const viewCreated = !(await exists(DEMO_VIEW_TITLE));
  const comparisonCreated = !(await exists(DEMO_COMPARISON_TITLE));
  // the comparison's map is the baseline's, the demo view's run-up: one snapshot serves both
  const snapshot = viewCreated || comparisonCreated ? await demoSnapshot(demoDir) : null;
  if (viewCreated) {
    await insertDemoView(db, { ...engineer, recordingId: recordingIds.get(RUN_UP_FILE), title: DEMO_VIEW_TITLE, state: demoViewState(), snapshot: snapshot!, marks: demoMarks, thread: demoThread });
  }
  if (comparisonCreated) {
    const target = DEMO_TARGETS.find((t) => t.track === 'family:1:-1')!;
    const c = await demoComparison(demoDir, fingerprints, target.points);
    await insertDemoView(db, { ...engineer, recordingId: recordingIds.get(RUN_UP_FILE), title: DEMO_COMPARISON_TITLE, state: c.state, snapshot: snapshot!, marks: c.marks, thread: c.thread });
  }
  return { recordingsRegistered, viewCreated, comparisonCreated };
}
