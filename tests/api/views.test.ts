import { randomBytes } from 'node:crypto';
import { gunzipSync } from 'node:zlib';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { SNAPSHOT_MAX_BYTES } from '../../workers/io/snapshot-format';
import { makeProject, makeUser, sessionFor, type Session } from '../support/actors';
import { startTestApp } from '../support/test-app';
import { SNAPSHOT_TYPE, binaryParser, insertView, sampleState, snapshotBytes } from './view-fixtures';

const t = startTestApp();
afterAll(() => t.close());

interface Team {
  projectId: number;
  lead: Session;
  engineer: Session;
  otherEngineer: Session;
  viewer: Session;
  outsider: Session;
  engineerId: number;
  recordingId: number;
}

async function team(): Promise<Team> {
  const lead = await makeUser(t.db, 'v-lead', 'staff');
  const engineer = await makeUser(t.db, 'v-engineer', 'staff');
  const otherEngineer = await makeUser(t.db, 'v-engineer2', 'staff');
  const viewer = await makeUser(t.db, 'v-viewer', 'guest');
  const outsider = await makeUser(t.db, 'v-outsider', 'staff');
  const projectId = await makeProject(t.db, [
    { id: lead.id, role: 'lead' },
    { id: engineer.id, role: 'engineer' },
    { id: otherEngineer.id, role: 'engineer' },
    { id: viewer.id, role: 'viewer' },
  ]);
  const [recordingId] = await t.db('recordings').insert({
    project_id: projectId,
    fingerprint: randomBytes(32).toString('hex'),
    name: 'run-up 7.wav',
    sample_rate_hz: 51200,
    duration_s: 30,
    channels: JSON.stringify({ format: 'wav', list: [] }),
    registered_by: engineer.id,
  });
  return {
    projectId,
    recordingId,
    engineerId: engineer.id,
    lead: await sessionFor(t.app, lead.email),
    engineer: await sessionFor(t.app, engineer.email),
    otherEngineer: await sessionFor(t.app, otherEngineer.email),
    viewer: await sessionFor(t.app, viewer.email),
    outsider: await sessionFor(t.app, outsider.email),
  };
}

const putSnapshot = (s: Session, viewId: number, bytes: Buffer, contentType = SNAPSHOT_TYPE, field = 'snapshot') =>
  s.agent.put(`/api/views/${viewId}/snapshot`).set('X-CSRF-Token', s.csrf).attach(field, bytes, { filename: 'map.fls', contentType });

const getSnapshot = (s: Session, viewId: number) => s.agent.get(`/api/views/${viewId}/snapshot`).buffer(true).parse(binaryParser);

describe('saving and reading views', () => {
  let x: Team;
  beforeAll(async () => {
    x = await team();
  });

  it('saves a view with its recording and the whole state, and reads it back with the author and the recording name', async () => {
    const res = await x.engineer.request('POST', `/api/projects/${x.projectId}/views`, {
      title: '  Carrier switch at 6200 rpm ',
      recordingId: x.recordingId,
      state: sampleState(),
    });
    expect(res.status).toBe(201);
    expect(res.body.view).toMatchObject({
      projectId: x.projectId,
      title: 'Carrier switch at 6200 rpm',
      recordingId: x.recordingId,
      recordingName: 'run-up 7.wav',
      version: 1,
      author: { id: x.engineerId },
      archived: false,
      snapshot: null,
    });
    expect(res.body.view.state).toEqual(sampleState());
    const read = await x.viewer.request('GET', `/api/views/${res.body.view.id}`);
    expect(read.status).toBe(200);
    expect(read.body.view.state).toEqual(sampleState());
    expect((await x.outsider.request('GET', `/api/views/${res.body.view.id}`)).status).toBe(404);
    expect((await x.viewer.request('POST', `/api/projects/${x.projectId}/views`, { title: 'no', state: sampleState() })).status).toBe(403);
  });

  it('keeps fields the schema does not know yet (a newer client) and opens an old state with the defaults filled in', async () => {
    const future = sampleState({ futureSection: { smoothing: 3 }, processing: { ...sampleState().processing, dither: 'tpdf' } });
    const saved = await x.engineer.request('POST', `/api/projects/${x.projectId}/views`, { title: 'from a newer client', state: future });
    expect(saved.status).toBe(201);
    const read = await x.engineer.request('GET', `/api/views/${saved.body.view.id}`);
    expect(read.body.view.state.futureSection).toEqual({ smoothing: 3 });
    expect(read.body.view.state.processing.dither).toBe('tpdf');

    // a row written by an early client: version 1 with only what it knew
    const early = {
      stateVersion: 1,
      processing: { channelIndex: 1, window: 'hann', blockSize: 4096, overlap: 0.5, scaling: 'peak', weighting: 'Z' },
      axes: { x: { kind: 'time', from: 0, to: 10, unit: 's' }, y: { kind: 'frequency', from: 0, to: 5000, unit: 'Hz' } },
      colourRange: { scale: 'glacier', topDb: 90, rangeDb: 60 },
    };
    const [id] = await t.db('views').insert({ project_id: x.projectId, title: 'early', state: JSON.stringify(early), created_by: x.engineerId });
    const old = await x.viewer.request('GET', `/api/views/${id}`);
    expect(old.status).toBe(200);
    expect(old.body.view.state).toMatchObject({
      ...early,
      guides: [],
      carrierSchedule: [],
      polePairs: null,
      selectedTracks: [],
      axes: { swapped: false },
      processing: { levelScale: 'db', against: 'time' },
    });
  });

  it('answers 400 naming each bad field, and refuses a recording of another project', async () => {
    const bad = await x.engineer.request('POST', `/api/projects/${x.projectId}/views`, {
      title: '',
      state: sampleState({ processing: { ...sampleState().processing, blockSize: 1000, window: 'triangle' }, polePairs: 0 }),
    });
    expect(bad.status).toBe(400);
    expect(bad.body.error.code).toBe('VALIDATION_FAILED');
    expect(Object.keys(bad.body.error.fields).sort()).toEqual(['state.polePairs', 'state.processing.blockSize', 'state.processing.window', 'title']);

    const noVersion = await x.engineer.request('POST', `/api/projects/${x.projectId}/views`, { title: 'x', state: { ...sampleState(), stateVersion: 99 } });
    expect(noVersion.status).toBe(400);
    expect(noVersion.body.error.fields['state.stateVersion']).toMatch(/stateVersion 1/);

    const other = await team();
    const foreign = await x.engineer.request('POST', `/api/projects/${x.projectId}/views`, {
      title: 'borrowed',
      recordingId: other.recordingId,
      state: sampleState(),
    });
    expect(foreign.status).toBe(400);
    expect(foreign.body.error.fields.recordingId).toMatch(/No such recording/);
  });

  it('edits carry the version: a stale one gets 409 with the current view beside the error', async () => {
    const id = (await x.engineer.request('POST', `/api/projects/${x.projectId}/views`, { title: 'v1', state: sampleState() })).body.view.id;
    const first = await x.engineer.request('PATCH', `/api/views/${id}`, { version: 1, title: 'edited once' });
    expect(first.status).toBe(200);
    expect(first.body.view).toMatchObject({ title: 'edited once', version: 2 });

    // a lead still looking at version 1
    const stale = await x.lead.request('PATCH', `/api/views/${id}`, { version: 1, state: sampleState({ polePairs: 5 }) });
    expect(stale.status).toBe(409);
    expect(stale.body.error).toMatchObject({ code: 'CONFLICT', message: expect.stringMatching(/changed by someone else/) });
    expect(stale.body.current).toMatchObject({ id, title: 'edited once', version: 2 });
    expect(stale.body.current.state.polePairs).toBe(4);

    const fresh = await x.lead.request('PATCH', `/api/views/${id}`, { version: 2, state: sampleState({ polePairs: 5 }) });
    expect(fresh.status).toBe(200);
    expect(fresh.body.view).toMatchObject({ version: 3, title: 'edited once' });
    expect(fresh.body.view.state.polePairs).toBe(5);

    // another engineer is neither the author nor a lead; a viewer changes nothing
    expect((await x.otherEngineer.request('PATCH', `/api/views/${id}`, { version: 3, title: 'mine now' })).status).toBe(403);
    expect((await x.viewer.request('PATCH', `/api/views/${id}`, { version: 3, title: 'mine now' })).status).toBe(403);
    const noVersion = await x.engineer.request('PATCH', `/api/views/${id}`, { title: 'no version' });
    expect(noVersion.status).toBe(400);
    expect(noVersion.body.error.fields.version).toBeDefined();
  });

  it('a lead archives a view: it still opens, takes no more changes, and can be restored', async () => {
    const id = (await x.engineer.request('POST', `/api/projects/${x.projectId}/views`, { title: 'to archive', state: sampleState() })).body.view.id;
    expect((await x.engineer.request('POST', `/api/views/${id}/archive`)).status).toBe(403);
    const archived = await x.lead.request('POST', `/api/views/${id}/archive`);
    expect(archived.status).toBe(200);
    expect(archived.body.view).toMatchObject({ archived: true, archivedAt: expect.any(String) });
    expect((await x.viewer.request('GET', `/api/views/${id}`)).body.view.archived).toBe(true);
    const edit = await x.engineer.request('PATCH', `/api/views/${id}`, { version: 1, title: 'too late' });
    expect(edit.status).toBe(409);
    expect(edit.body.error.message).toMatch(/archived/);
    expect((await x.engineer.request('POST', `/api/views/${id}/marks`, { kind: 'point', geometry: { x: 1, y: 2 } })).status).toBe(409);
    const restored = await x.lead.request('POST', `/api/views/${id}/archive`, { archived: false });
    expect(restored.body.view.archived).toBe(false);
    expect((await x.engineer.request('PATCH', `/api/views/${id}`, { version: 1, title: 'back again' })).status).toBe(200);
  });

  it('deleting a view takes its marks, threads, links and snapshot with it', async () => {
    const id = (await x.engineer.request('POST', `/api/projects/${x.projectId}/views`, { title: 'short-lived', state: sampleState() })).body.view.id;
    const mark = (await x.engineer.request('POST', `/api/views/${id}/marks`, { kind: 'point', geometry: { x: 1, y: 2 } })).body.mark;
    await x.viewer.request('POST', `/api/marks/${mark.id}/comments`, { body: 'hm' });
    await x.engineer.request('POST', `/api/views/${id}/links`, {});
    expect((await putSnapshot(x.engineer, id, snapshotBytes(4, 4))).status).toBe(200);
    expect((await x.otherEngineer.request('DELETE', `/api/views/${id}`)).status).toBe(403);
    expect((await x.engineer.request('DELETE', `/api/views/${id}`)).status).toBe(204);
    expect((await x.engineer.request('GET', `/api/views/${id}`)).status).toBe(404);
    for (const table of ['marks', 'comments', 'share_links', 'view_snapshots']) {
      expect(await t.db(table).where({ view_id: id }).count({ n: '*' }), table).toEqual([{ n: 0 }]);
    }
  });

  it('writes activity for saved views, marks, comments and links', async () => {
    const id = (await x.engineer.request('POST', `/api/projects/${x.projectId}/views`, { title: 'Busy view', state: sampleState() })).body.view.id;
    const mark = (await x.engineer.request('POST', `/api/views/${id}/marks`, { kind: 'box', geometry: { x0: 1, x1: 2, y0: 3, y1: 4 }, text: 'sideband hump' }))
      .body.mark;
    await x.viewer.request('POST', `/api/marks/${mark.id}/comments`, { body: 'seen it on the bench too' });
    await x.engineer.request('POST', `/api/views/${id}/links`, { mayReply: true });
    const activity = (await x.viewer.request('GET', `/api/projects/${x.projectId}/activity`)).body.activity as { verb: string; objectType: string; summary: string }[];
    const seen = activity.map((a) => `${a.verb} ${a.objectType}`);
    expect(seen).toEqual(expect.arrayContaining(['saved view', 'placed mark', 'commented comment', 'created share-link']));
    expect(activity.find((a) => a.verb === 'saved')!.summary).toMatch(/Busy view/);
  });
});

describe('the overview of a project’s views', () => {
  let x: Team;
  const ids: Record<string, number> = {};
  beforeAll(async () => {
    x = await team();
    for (const title of ['Bearing tone', 'Alpha carrier', 'Coast-down sidebands']) {
      const res = await x.engineer.request('POST', `/api/projects/${x.projectId}/views`, {
        title,
        recordingId: title === 'Bearing tone' ? x.recordingId : null,
        state: sampleState(),
      });
      ids[title] = res.body.view.id;
    }
    // threads: two marks with comments and the view's own thread on 'Alpha carrier'; one mark without comments
    const alpha = ids['Alpha carrier'];
    const m1 = (await x.engineer.request('POST', `/api/views/${alpha}/marks`, { kind: 'point', geometry: { x: 1, y: 1 } })).body.mark.id;
    const m2 = (await x.engineer.request('POST', `/api/views/${alpha}/marks`, { kind: 'point', geometry: { x: 2, y: 2 } })).body.mark.id;
    await x.engineer.request('POST', `/api/views/${alpha}/marks`, { kind: 'point', geometry: { x: 3, y: 3 } });
    await x.viewer.request('POST', `/api/marks/${m1}/comments`, { body: 'one' });
    await x.viewer.request('POST', `/api/marks/${m1}/comments`, { body: 'two' });
    await x.viewer.request('POST', `/api/marks/${m2}/comments`, { body: 'three' });
    await x.viewer.request('POST', `/api/views/${alpha}/comments`, { body: 'four' });
    await x.lead.request('POST', `/api/views/${ids['Coast-down sidebands']}/archive`);
  });

  it('lists each view with author, recording, dates, open threads and the archived flag', async () => {
    const res = await x.viewer.request('GET', `/api/projects/${x.projectId}/views?archived=include&sort=title`);
    expect(res.status).toBe(200);
    expect(res.body.total).toBe(3);
    expect(res.body.views.map((v: { title: string }) => v.title)).toEqual(['Alpha carrier', 'Bearing tone', 'Coast-down sidebands']);
    const [alpha, bearing, coast] = res.body.views;
    expect(alpha).toMatchObject({ id: ids['Alpha carrier'], authorName: 'Test v-engineer', markCount: 3, openThreads: 3, archived: false });
    expect(bearing).toMatchObject({ recordingName: 'run-up 7.wav', recordingId: x.recordingId, openThreads: 0 });
    expect(coast.archived).toBe(true);
    expect(alpha).toMatchObject({ createdAt: expect.any(String), updatedAt: expect.any(String), hasSnapshot: false });
  });

  it('leaves archived views out by default, filters by text, sorts, and pages with the total', async () => {
    const plain = await x.lead.request('GET', `/api/projects/${x.projectId}/views`);
    expect(plain.body).toMatchObject({ total: 2, page: 1, pageSize: 20 });
    const only = await x.lead.request('GET', `/api/projects/${x.projectId}/views?archived=only`);
    expect(only.body.views.map((v: { title: string }) => v.title)).toEqual(['Coast-down sidebands']);

    const byRecording = await x.lead.request('GET', `/api/projects/${x.projectId}/views?q=run-up`);
    expect(byRecording.body.views.map((v: { title: string }) => v.title)).toEqual(['Bearing tone']);
    const byTitle = await x.lead.request('GET', `/api/projects/${x.projectId}/views?q=CARRIER`);
    expect(byTitle.body.views.map((v: { title: string }) => v.title)).toEqual(['Alpha carrier']);
    // the LIKE pattern characters are text, not wildcards
    expect((await x.lead.request('GET', `/api/projects/${x.projectId}/views?q=%25`)).body.total).toBe(0);

    const threads = await x.lead.request('GET', `/api/projects/${x.projectId}/views?sort=threads&archived=include`);
    expect(threads.body.views[0].title).toBe('Alpha carrier');
    const page2 = await x.lead.request('GET', `/api/projects/${x.projectId}/views?sort=title&order=desc&archived=include&page=2&pageSize=2`);
    expect(page2.body).toMatchObject({ total: 3, page: 2, pageSize: 2 });
    expect(page2.body.views.map((v: { title: string }) => v.title)).toEqual(['Alpha carrier']);
  });

  it('answers 400 naming bad query parameters, and 404 to a non-member', async () => {
    const bad = await x.lead.request('GET', `/api/projects/${x.projectId}/views?sort=colour&page=0&pageSize=1000&archived=maybe`);
    expect(bad.status).toBe(400);
    expect(Object.keys(bad.body.error.fields).sort()).toEqual(['archived', 'page', 'pageSize', 'sort']);
    expect((await x.outsider.request('GET', `/api/projects/${x.projectId}/views`)).status).toBe(404);
  });
});

describe('the snapshot of a view', () => {
  let x: Team;
  let viewId: number;
  beforeAll(async () => {
    x = await team();
    viewId = await insertView(t.db, x.projectId, x.engineerId, 'With a snapshot');
  });

  it('has none at first (404), then round-trips: PUT, then GET gives the same bytes with content-encoding gzip', async () => {
    expect((await x.viewer.request('GET', `/api/views/${viewId}/snapshot`)).status).toBe(404);
    const bytes = snapshotBytes(300, 200);
    const put = await putSnapshot(x.engineer, viewId, bytes);
    expect(put.status).toBe(200);
    expect(put.body.snapshot).toMatchObject({ rawSize: bytes.length, width: 300, height: 200 });
    expect(put.body.snapshot.storedSize).toBeLessThan(bytes.length);

    const got = await getSnapshot(x.viewer, viewId);
    expect(got.status).toBe(200);
    expect(got.headers['content-encoding']).toBe('gzip');
    expect(got.headers['content-type']).toMatch(/^application\/vnd\.fanlight\.snapshot/);
    expect(Buffer.compare(got.body as Buffer, bytes)).toBe(0);

    // stored compressed, in the database
    const row = await t.db('view_snapshots').where({ view_id: viewId }).first();
    expect(row.raw_size).toBe(bytes.length);
    expect(Buffer.compare(gunzipSync(row.gzip_bytes), bytes)).toBe(0);
    expect((await x.viewer.request('GET', `/api/views/${viewId}`)).body.view.snapshot).toMatchObject({ width: 300, height: 200 });

    // a second upload replaces the first
    const smaller = snapshotBytes(10, 10);
    expect((await putSnapshot(x.lead, viewId, smaller)).status).toBe(200);
    expect(Buffer.compare((await getSnapshot(x.viewer, viewId)).body as Buffer, smaller)).toBe(0);
  });

  it('is sent decompressed to a client that does not take gzip', async () => {
    const bytes = snapshotBytes(16, 16);
    await putSnapshot(x.engineer, viewId, bytes).expect(200);
    const got = await x.viewer.agent.get(`/api/views/${viewId}/snapshot`).set('Accept-Encoding', 'identity').buffer(true).parse(binaryParser);
    expect(got.headers['content-encoding']).toBeUndefined();
    expect(Buffer.compare(got.body as Buffer, bytes)).toBe(0);
  });

  it('refuses a file over the cap with 413 in the error shape', async () => {
    // a valid header whose map alone is over 4 MB
    const big = snapshotBytes(4096, 1100);
    expect(big.length).toBeGreaterThan(SNAPSHOT_MAX_BYTES);
    const res = await putSnapshot(x.engineer, viewId, big);
    expect(res.status).toBe(413);
    expect(res.body.error).toMatchObject({ code: 'PAYLOAD_TOO_LARGE', message: expect.stringMatching(/4 MB/) });
  });

  it('refuses another content type with 415, both for the file and for a request that is not multipart', async () => {
    const wrong = await putSnapshot(x.engineer, viewId, snapshotBytes(4, 4), 'image/png');
    expect(wrong.status).toBe(415);
    expect(wrong.body.error.code).toBe('UNSUPPORTED_MEDIA_TYPE');
    const raw = await x.engineer.agent
      .put(`/api/views/${viewId}/snapshot`)
      .set('X-CSRF-Token', x.engineer.csrf)
      .set('Content-Type', SNAPSHOT_TYPE)
      .send(snapshotBytes(4, 4));
    expect(raw.status).toBe(415);
    expect(raw.body.error.code).toBe('UNSUPPORTED_MEDIA_TYPE');
  });

  it('refuses a malformed file with 400 naming the problem', async () => {
    const good = snapshotBytes(8, 8);
    const badMagic = Buffer.from(good);
    badMagic.write('PNG!', 0, 'latin1');
    const magic = await putSnapshot(x.engineer, viewId, badMagic);
    expect(magic.status).toBe(400);
    expect(magic.body.error.message).toMatch(/magic "FLS1"/);
    expect(magic.body.error.fields.snapshot).toMatch(/FLS1/);

    const short = await putSnapshot(x.engineer, viewId, good.subarray(0, good.length - 3));
    expect(short.status).toBe(400);
    expect(short.body.error.message).toMatch(/width × height = 8 × 8 = 64/);

    const header = await putSnapshot(x.engineer, viewId, snapshotBytes(8, 8, { encoding: 'f32' as 'u8-db', dbRange: -1 }));
    expect(header.status).toBe(400);
    expect(Object.keys(header.body.error.fields).sort()).toEqual(['snapshot.header.dbRange', 'snapshot.header.encoding']);

    const notJson = Buffer.concat([Buffer.from('FLS1'), Buffer.from([3, 0, 0, 0]), Buffer.from('{x}')]);
    expect((await putSnapshot(x.engineer, viewId, notJson)).body.error.message).toMatch(/not UTF-8 JSON/);

    const otherField = await putSnapshot(x.engineer, viewId, good, SNAPSHOT_TYPE, 'picture');
    expect(otherField.status).toBe(400);
    expect(otherField.body.error.fields.snapshot).toMatch(/field "snapshot"/);

    const none = await x.engineer.agent.put(`/api/views/${viewId}/snapshot`).set('X-CSRF-Token', x.engineer.csrf).field('note', 'no file');
    expect(none.status).toBe(400);
  });

  it('takes uploads only from the author or a lead', async () => {
    expect((await putSnapshot(x.otherEngineer, viewId, snapshotBytes(4, 4))).status).toBe(403);
    expect((await putSnapshot(x.viewer, viewId, snapshotBytes(4, 4))).status).toBe(403);
    expect((await putSnapshot(x.outsider, viewId, snapshotBytes(4, 4))).status).toBe(404);
  });
});

describe('restart safety', () => {
  it('a view, its snapshot and a mark made by one app instance are read back by a new one', async () => {
    const first = startTestApp();
    const lead = await makeUser(first.db, 'restart-lead', 'staff');
    const engineer = await makeUser(first.db, 'restart-engineer', 'staff');
    const projectId = await makeProject(first.db, [
      { id: lead.id, role: 'lead' },
      { id: engineer.id, role: 'engineer' },
    ]);
    const bytes = snapshotBytes(120, 80);
    let viewId: number;
    let markId: number;
    try {
      const s = await sessionFor(first.app, engineer.email);
      viewId = (await s.request('POST', `/api/projects/${projectId}/views`, { title: 'Survives a restart', state: sampleState() })).body.view.id;
      await s.agent
        .put(`/api/views/${viewId}/snapshot`)
        .set('X-CSRF-Token', s.csrf)
        .attach('snapshot', bytes, { filename: 'map.fls', contentType: SNAPSHOT_TYPE })
        .expect(200);
      markId = (await s.request('POST', `/api/views/${viewId}/marks`, { kind: 'guide', geometry: { guide: { kind: 'family', m: 2, n: -3 } }, text: '2fc − 3fe' }))
        .body.mark.id;
    } finally {
      await first.close();
    }

    const second = startTestApp();
    try {
      const s = await sessionFor(second.app, lead.email);
      const view = await s.request('GET', `/api/views/${viewId}`);
      expect(view.status).toBe(200);
      expect(view.body.view).toMatchObject({ title: 'Survives a restart', version: 1, snapshot: { rawSize: bytes.length } });
      expect(view.body.view.state).toEqual(sampleState());
      const snapshot = await s.agent.get(`/api/views/${viewId}/snapshot`).buffer(true).parse(binaryParser);
      expect(Buffer.compare(snapshot.body as Buffer, bytes)).toBe(0);
      const marks = await s.request('GET', `/api/views/${viewId}/marks`);
      expect(marks.body.marks).toEqual([
        expect.objectContaining({ id: markId, kind: 'guide', geometry: { guide: { kind: 'family', m: 2, n: -3 } }, text: '2fc − 3fe', version: 1 }),
      ]);
    } finally {
      await second.close();
    }
  });
});

describe('a saved comparison of runs', () => {
  // a comparison as the Bench saves it: two runs, one family on a 3-point grid with its target
  const comparison = {
    runs: [
      { name: 'before.wav', fingerprint: 'a'.repeat(64) },
      { name: 'after.wav', fingerprint: 'b'.repeat(64) },
    ],
    track: { label: 'fc−fe', guide: { kind: 'family', m: 1, n: -1 } },
    unit: 'dB re 1 g',
    rpm: [1025, 1075, 1125],
    levels: [
      [-24, -23.5, null],
      [-29, -28.5, -28],
    ],
    target: [-24.2, -24.1, -24],
    exceedances: [{ run: 'before.wav', fromRpm: 1040, toRpm: 1075, maxExcessDb: 0.6, atRpm: 1075 }],
    carrierRpm: [1025, 1075, 1125],
    carrierHz: [
      [8000, 8000, 12000],
      [10000, 10000, 10000],
    ],
    findings: [
      { carrier: 'Carrier 8 000 Hz, then 12 000 Hz', shifts: '8 000 → 12 000 Hz at 1 100 rpm', spread: 'steady', poles: '4', families: 'fc−fe −24.0 dB' },
      { carrier: 'Carrier 10 000 Hz', shifts: 'none', spread: 'steady', poles: '4', families: 'fc−fe −28.0 dB' },
    ],
  };

  it('is saved and read back whole, by a new app instance too (after a restart)', async () => {
    const first = startTestApp();
    const engineer = await makeUser(first.db, 'compare-engineer', 'staff');
    const viewer = await makeUser(first.db, 'compare-viewer', 'guest');
    const projectId = await makeProject(first.db, [
      { id: engineer.id, role: 'engineer' },
      { id: viewer.id, role: 'viewer' },
    ]);
    let viewId: number;
    try {
      const s = await sessionFor(first.app, engineer.email);
      const saved = await s.request('POST', `/api/projects/${projectId}/views`, { title: 'Firmware A against B', state: sampleState({ comparison }) });
      expect(saved.status).toBe(201);
      viewId = saved.body.view.id;
      expect(saved.body.view.state.comparison).toEqual(comparison);
    } finally {
      await first.close();
    }
    const second = startTestApp();
    try {
      const s = await sessionFor(second.app, viewer.email);
      const read = await s.request('GET', `/api/views/${viewId}`);
      expect(read.status).toBe(200);
      expect(read.body.view.state.comparison).toEqual(comparison);
    } finally {
      await second.close();
    }
  });

  it('answers 400 naming the field of a comparison with one run, or a run not named by its fingerprint', async () => {
    const x = await team();
    const one = await x.engineer.request('POST', `/api/projects/${x.projectId}/views`, { title: 'one run', state: sampleState({ comparison: { ...comparison, runs: comparison.runs.slice(0, 1) } }) });
    expect(one.status).toBe(400);
    expect(Object.keys(one.body.error.fields)).toContain('state.comparison.runs');
    const unnamed = await x.engineer.request('POST', `/api/projects/${x.projectId}/views`, {
      title: 'bad run',
      state: sampleState({ comparison: { ...comparison, runs: [comparison.runs[0], { name: 'x.wav', fingerprint: 'not hex' }] } }),
    });
    expect(unnamed.status).toBe(400);
    expect(Object.keys(unnamed.body.error.fields)).toContain('state.comparison.runs.1.fingerprint');
  });
});
