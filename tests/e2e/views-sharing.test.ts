/**
 * Findings that travel: a saved view with its snapshot and a mark (made through the API from the
 * engineer's page, as the Bench does), opened by a viewer from the project's views table, replied to,
 * followed back from the mail in the Outbox; then a share link opened without an account and revoked.
 * The snapshot is an invented run-up map (orders 8, 24, 48; a carrier stepping 8 → 10 kHz at 6200 rpm
 * with sidebands fc ± 2fe for 4 pole pairs).
 */
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { SNAPSHOT_CONTENT_TYPE, type SnapshotHeader } from '../../workers/io/snapshot-format';
import { encodeSnapshot, quantiseDb } from '../../workers/io/snapshot-codec';
import { demoProject } from '../../seeds/demo-scenario';
import { startAppServer } from './app-server';
import { canvasPixels, launchBrowser, screenshot, signIn } from './browser';

const W = 480;
const H = 240;
const RPM: [number, number] = [500, 12000];
const HZ: [number, number] = [0, 20000];
const SHIFT_RPM = 6200;

function runUpSnapshot(): Uint8Array {
  const header: SnapshotHeader = {
    width: W,
    height: H,
    encoding: 'u8-db',
    dbTop: 110,
    dbRange: 70,
    axes: { x: { kind: 'speed', from: RPM[0], to: RPM[1], unit: 'rpm' }, y: { kind: 'frequency', from: HZ[0], to: HZ[1], unit: 'Hz' } },
    tracks: [
      {
        name: 'order 24',
        unit: 'dB',
        points: Array.from({ length: 24 }, (_, i) => {
          const rpm = 500 + i * 500;
          return [rpm, i === 9 ? null : 60 + (rpm / 12000) * 14 + 2 * Math.sin(i)] as [number, number | null];
        }),
      },
      { name: 'overall (A)', unit: 'dB', points: Array.from({ length: 24 }, (_, i) => [500 + i * 500, 72 + i * 0.6] as [number, number]) },
    ],
    findings: [
      { kind: 'carrier-shift', summary: 'Carrier 8 → 10 kHz at 6200 rpm', at: { x: SHIFT_RPM, y: 10000 } },
      { kind: 'pole-pairs', summary: '4 pole pairs from the sideband spacing' },
    ],
  };
  let seed = 7;
  const noise = () => {
    seed = (seed * 1103515245 + 12345) % 2147483648;
    return seed / 2147483648 - 0.5;
  };
  const map = new Uint8Array(W * H);
  for (let row = 0; row < H; row++) {
    const f = HZ[0] + ((row + 0.5) / H) * (HZ[1] - HZ[0]);
    for (let col = 0; col < W; col++) {
      const rpm = RPM[0] + ((col + 0.5) / W) * (RPM[1] - RPM[0]);
      const s = (rpm - RPM[0]) / (RPM[1] - RPM[0]);
      const fr = rpm / 60;
      const fe = 4 * fr;
      const fc = rpm < SHIFT_RPM ? 8000 : 10000;
      const lines: [number, number][] = [
        [8 * fr, 92 + 8 * s],
        [24 * fr, 86 + 10 * s],
        [48 * fr, 78 + 8 * s],
        [fc, 88],
        [fc - 2 * fe, 80],
        [fc + 2 * fe, 80],
      ];
      let power = 10 ** ((52 + 8 * s - 6 * (f / HZ[1]) + 4 * noise()) / 10);
      for (const [hz, peak] of lines) {
        const d = (f - hz) / 110;
        if (Math.abs(d) < 4) power += 10 ** ((peak - 6 * d * d) / 10);
      }
      map[row * W + col] = quantiseDb(10 * Math.log10(power), header.dbTop, header.dbRange);
    }
  }
  return encodeSnapshot(header, map);
}

const viewState = {
  stateVersion: 1,
  processing: { channelIndex: 0, window: 'hann', blockSize: 8192, overlap: 0.75, scaling: 'rms', weighting: 'A', levelScale: 'db', against: 'speed' },
  axes: { swapped: false, x: { kind: 'speed', from: RPM[0], to: RPM[1], unit: 'rpm' }, y: { kind: 'frequency', from: HZ[0], to: HZ[1], unit: 'Hz' } },
  colourRange: { scale: 'ember', topDb: 110, rangeDb: 70 },
  guides: [
    { kind: 'order', order: 8, visible: true },
    { kind: 'order', order: 24, label: 'stator slots', visible: true },
    { kind: 'order', order: 48, visible: true },
    { kind: 'family', m: 1, n: 2, visible: true },
    { kind: 'family', m: 1, n: -2, visible: true },
  ],
  carrierSchedule: [
    { fromS: 0, toS: 12.5, carrierHz: 8000 },
    { fromS: 12.5, toS: 30, carrierHz: 10000 },
  ],
  polePairs: 4,
  selectedTracks: [{ kind: 'order', order: 24 }, { kind: 'overall', weighting: 'A' }],
};

/** A JSON request from the signed-in page, with the session's CSRF token. */
function api<T = unknown>(page: Page, method: string, path: string, body?: unknown): Promise<{ status: number; body: T }> {
  return page.evaluate(
    async ({ method, path, body }) => {
      const token = ((await (await fetch('/api/auth/csrf')).json()) as { token: string }).token;
      const r = await fetch(`/api${path}`, {
        method,
        headers: { 'Content-Type': 'application/json', 'X-CSRF-Token': token },
        body: body === undefined ? undefined : JSON.stringify(body),
      });
      return { status: r.status, body: await r.json().catch(() => null) };
    },
    { method, path, body },
  );
}

function uploadSnapshot(page: Page, viewId: number, bytes: Uint8Array): Promise<number> {
  return page.evaluate(
    async ({ viewId, base64, type }) => {
      const token = ((await (await fetch('/api/auth/csrf')).json()) as { token: string }).token;
      const raw = Uint8Array.from(atob(base64), (c) => c.charCodeAt(0));
      const form = new FormData();
      form.append('snapshot', new Blob([raw], { type }), 'map.fls');
      const r = await fetch(`/api/views/${viewId}/snapshot`, { method: 'PUT', headers: { 'X-CSRF-Token': token }, body: form });
      return r.status;
    },
    { viewId, base64: Buffer.from(bytes).toString('base64'), type: SNAPSHOT_CONTENT_TYPE },
  );
}

/** Saves a view with the snapshot and one point mark, as the engineer on `page`. */
async function seedView(page: Page, title: string) {
  const projects = await api<{ projects: { id: number; name: string }[] }>(page, 'GET', '/projects');
  const projectId = projects.body.projects.find((p) => p.name === demoProject.name)!.id;
  const view = await api<{ view: { id: number } }>(page, 'POST', `/projects/${projectId}/views`, {
    title,
    recordingId: null,
    state: viewState,
  });
  expect(view.status).toBe(201);
  const viewId = view.body.view.id;
  expect(await uploadSnapshot(page, viewId, runUpSnapshot())).toBe(200);
  const mark = await api<{ mark: { id: number } }>(page, 'POST', `/views/${viewId}/marks`, {
    kind: 'point',
    geometry: { x: SHIFT_RPM, y: 10000 },
    text: 'The carrier steps from 8 to 10 kHz here',
  });
  expect(mark.status).toBe(201);
  return { projectId, viewId, markId: mark.body.mark.id };
}


async function expectPainted(page: Page) {
  await expect.poll(async () => (await canvasPixels(page, 'view-snapshot')).opaque, { timeout: 15_000 }).toBe(1);
  const px = await canvasPixels(page, 'view-snapshot');
  expect([px.width, px.height]).toEqual([W, H]);
  expect(px.colours).toBeGreaterThan(30);
}

const stamp = () => Date.now().toString(36);

describe('views, marks, threads and share links (browser)', () => {
  const baseUrl = inject('baseUrl');
  let browser: Browser;
  beforeAll(async () => {
    browser = await launchBrowser();
  });
  afterAll(() => browser?.close());

  it('a viewer opens a view from the project, sees the snapshot and the mark, replies; the mail leads the engineer back to the mark', async () => {
    const title = `Carrier step at 6200 rpm ${stamp()}`;
    const engineerContext = await browser.newContext({ viewport: { width: 1440, height: 1000 } });
    const engineer = await engineerContext.newPage();
    await signIn(engineer, baseUrl, 'engineer@fanlight.test');
    await engineer.waitForURL(`${baseUrl}/projects`);
    const { viewId, markId } = await seedView(engineer, title);

    const viewerContext = await browser.newContext({ viewport: { width: 1440, height: 1000 } });
    const viewer = await viewerContext.newPage();
    await signIn(viewer, baseUrl, 'viewer@fanlight.test');
    await viewer.waitForURL(`${baseUrl}/projects`);
    await viewer.getByRole('link', { name: demoProject.name }).click();
    await viewer.getByLabel('Filter views').fill(title);
    const table = viewer.getByTestId('project-views');
    await expect.poll(() => table.getByRole('link', { name: title }).isVisible()).toBe(true);
    const titleHeader = table.getByRole('columnheader', { name: /Title/ });
    expect(await titleHeader.getAttribute('aria-sort')).toBe('none');
    await titleHeader.getByRole('button').click();
    await expect.poll(() => titleHeader.getAttribute('aria-sort')).toBe('ascending');
    expect(await viewer.getByTestId('views-page').textContent()).toBe('Page 1 of 1');
    await screenshot(viewer, 'project-views');
    // a viewer leads nothing: no archive buttons
    expect(await table.getByRole('button', { name: /^Archive / }).count()).toBe(0);
    await table.getByRole('link', { name: title }).click();
    await viewer.waitForURL(`${baseUrl}/views/${viewId}`);

    await expect.poll(() => viewer.getByRole('heading', { name: title }).isVisible()).toBe(true);
    await expectPainted(viewer);
    await expect.poll(() => viewer.getByTestId(`mark-shape-${markId}`).isVisible()).toBe(true);
    const card = viewer.locator(`#mark-card-${markId}`);
    expect(await card.textContent()).toContain('The carrier steps from 8 to 10 kHz here');
    expect(await card.textContent()).toContain('Tomas Irvine');
    // read-only for a viewer: no placing, no sharing, no editing
    expect(await viewer.getByRole('button', { name: 'Place mark' }).count()).toBe(0);
    expect(await viewer.getByRole('heading', { name: 'Share' }).count()).toBe(0);
    expect(await viewer.getByRole('button', { name: 'Edit mark 1' }).count()).toBe(0);
    // order guides against speed are drawn; the families wait for a steady carrier and are listed
    const guides = viewer.getByTestId('view-guides');
    expect(await guides.textContent()).toContain('stator slots');
    expect(await guides.textContent()).toMatch(/carrier changes during the run/);

    // the reply box opens under the selected mark: select it on the map
    expect(await card.getByLabel('Reply').count()).toBe(0);
    await viewer.getByTestId(`mark-shape-${markId}`).click();
    await expect.poll(() => viewer.getByTestId('selected-mark').getAttribute('data-mark-id')).toBe(String(markId));
    expect(new URL(viewer.url()).searchParams.get('mark')).toBe(String(markId));
    const reply = 'I hear it on the rig too, from 6000 rpm on';
    await card.getByLabel('Reply').fill(reply);
    await card.getByRole('button', { name: 'Send reply' }).click();
    await expect.poll(async () => (await card.textContent()) ?? '').toContain(reply);
    await viewerContext.close();

    await engineer.goto(`${baseUrl}/outbox`);
    const mail = engineer.locator('article').filter({ hasText: `Priya Holm replied on your mark in "${title}"` });
    await expect.poll(() => mail.isVisible(), { timeout: 20_000 }).toBe(true);
    await mail.getByRole('link', { name: /\/views\// }).click();
    await engineer.waitForURL(new RegExp(`/views/${viewId}\\?mark=${markId}#comment-\\d+$`));
    const selected = engineer.getByTestId('selected-mark');
    await expect.poll(() => selected.isVisible()).toBe(true);
    expect(await selected.getAttribute('data-mark-id')).toBe(String(markId));
    const comment = engineer.locator(`[id^="comment-"]`).filter({ hasText: reply });
    await expect.poll(() => comment.isVisible()).toBe(true);
    expect(`#${await comment.getAttribute('id')}`).toBe(new URL(engineer.url()).hash);
    await expectPainted(engineer);
    await engineer.evaluate(() => window.scrollTo(0, 0));
    await screenshot(engineer, 'view-page');
    await engineerContext.close();
  });

  it('a share link opens the view without an account; once revoked, the same address says it is no longer valid', async () => {
    const title = `Sidebands around the carrier ${stamp()}`;
    const context = await browser.newContext({ viewport: { width: 1440, height: 1000 } });
    const page = await context.newPage();
    await signIn(page, baseUrl, 'engineer@fanlight.test');
    await page.waitForURL(`${baseUrl}/projects`);
    const { viewId, markId } = await seedView(page, title);

    // the notification settings save as they change
    await page.goto(`${baseUrl}/settings`);
    const mentions = page.getByLabel('Mail me when someone mentions me');
    await expect.poll(() => mentions.isChecked()).toBe(true);
    await mentions.uncheck();
    await expect.poll(() => page.getByText('Saved.').isVisible()).toBe(true);
    await page.reload();
    await expect.poll(() => page.getByLabel('Mail me replies on my marks and views').isChecked()).toBe(true);
    expect(await page.getByLabel('Mail me when someone mentions me').isChecked()).toBe(false);
    expect(await page.getByLabel('Mail me views shared with me').isChecked()).toBe(true);
    await page.getByLabel('Mail me when someone mentions me').check();
    await expect.poll(() => page.getByText('Saved.').isVisible()).toBe(true);

    await page.goto(`${baseUrl}/views/${viewId}`);
    await expectPainted(page);

    // an edit against a mark someone changed meanwhile: the newer text comes back, nothing is overwritten
    await page.getByRole('button', { name: 'Edit mark 1' }).click();
    expect((await api(page, 'PATCH', `/marks/${markId}`, { version: 1, text: 'Changed from another tab' })).status).toBe(200);
    await page.getByLabel('Text of mark 1').fill('My own words');
    await page.getByRole('button', { name: 'Save', exact: true }).click();
    await expect.poll(() => page.getByText('Someone changed this mark; here is the newer text.').isVisible()).toBe(true);
    expect(await page.getByLabel('Text of mark 1').inputValue()).toBe('Changed from another tab');
    await page.getByRole('button', { name: 'Save', exact: true }).click();
    await expect.poll(async () => (await page.locator(`#mark-card-${markId}`).textContent()) ?? '').toContain('Changed from another tab');

    // a box mark by Shift-drag on the snapshot
    const box = (await page.getByTestId('view-snapshot').boundingBox())!;
    await page.keyboard.down('Shift');
    await page.mouse.move(box.x + box.width * 0.55, box.y + box.height * 0.45);
    await page.mouse.down();
    await page.mouse.move(box.x + box.width * 0.75, box.y + box.height * 0.3, { steps: 6 });
    await page.mouse.up();
    await page.keyboard.up('Shift');
    await expect.poll(async () => (await page.getByTestId('pending-place').textContent()) ?? '').toMatch(/New box mark/);
    await page.getByLabel('Mark text').fill('Sideband hump above 6200 rpm');
    await page.getByRole('button', { name: 'Place mark' }).click();
    await expect.poll(async () => (await page.getByTestId('selected-mark').textContent()) ?? '').toContain('Sideband hump above 6200 rpm');

    await page.getByLabel('Visitors may reply').check();
    await page.getByRole('button', { name: 'Create share link' }).click();
    const urlBox = page.getByTestId('share-link-url');
    await expect.poll(() => urlBox.isVisible()).toBe(true);
    const url = (await urlBox.textContent())!.trim();
    expect(url).toMatch(new RegExp(`^${baseUrl}/shared/[A-Za-z0-9_-]{43}$`));

    const guestContext = await browser.newContext({ viewport: { width: 1440, height: 1000 } });
    const guest = await guestContext.newPage();
    await guest.goto(url);
    await expect.poll(() => guest.getByRole('heading', { name: title }).isVisible()).toBe(true);
    await expectPainted(guest);
    expect(await guest.getByText('Sideband hump above 6200 rpm').count()).toBeGreaterThan(0);
    const discussion = guest.getByRole('region', { name: 'Discussion' });
    await discussion.getByLabel('Your name').fill('Gearbox supplier');
    await discussion.getByLabel('Reply').fill('We measured the same hump on our rig.');
    await discussion.getByRole('button', { name: 'Send reply' }).click();
    await expect.poll(async () => (await discussion.textContent()) ?? '').toContain('through a share link');
    await screenshot(guest, 'shared-view');

    const links = page.getByTestId('share-links');
    await expect.poll(() => links.isVisible()).toBe(true);
    await links.getByRole('button', { name: /^Revoke the link/ }).first().click();
    await expect.poll(async () => (await links.textContent()) ?? '').toContain('revoked');

    await guest.reload();
    await expect.poll(() => guest.getByRole('heading', { name: 'This link is no longer valid' }).isVisible()).toBe(true);
    expect(await guest.getByTestId('shared-link-invalid').textContent()).toMatch(/revoked/);
    expect(await guest.getByTestId('view-snapshot').count()).toBe(0);
    await screenshot(guest, 'shared-view-revoked');
    await guestContext.close();
    await context.close();
  });

  it('a lead archives a view from the table and restores it', async () => {
    const title = `Coast-down orders ${stamp()}`;
    const context = await browser.newContext({ viewport: { width: 1440, height: 1000 } });
    const engineer = await context.newPage();
    await signIn(engineer, baseUrl, 'engineer@fanlight.test');
    await engineer.waitForURL(`${baseUrl}/projects`);
    const { projectId } = await seedView(engineer, title);
    await context.close();

    const leadContext = await browser.newContext({ viewport: { width: 1440, height: 1000 } });
    const lead = await leadContext.newPage();
    await signIn(lead, baseUrl, 'lead@fanlight.test');
    await lead.waitForURL(`${baseUrl}/projects`);
    await lead.goto(`${baseUrl}/projects/${projectId}`);
    await lead.getByLabel('Filter views').fill(title);
    const table = lead.getByTestId('project-views');
    await expect.poll(() => table.getByRole('link', { name: title }).isVisible()).toBe(true);
    await table.getByRole('button', { name: `Archive ${title}` }).click();
    await expect.poll(() => lead.getByText('No views match.').isVisible()).toBe(true);
    await lead.getByLabel('Archived').selectOption('only');
    await expect.poll(() => table.getByRole('link', { name: title }).isVisible()).toBe(true);
    await table.getByRole('button', { name: `Restore ${title}` }).click();
    await expect.poll(() => lead.getByText('No views match.').isVisible()).toBe(true);
    await lead.getByLabel('Archived').selectOption('exclude');
    await expect.poll(() => table.getByRole('link', { name: title }).isVisible()).toBe(true);
    await leadContext.close();
  });

  it('a view saved before the server restarts opens after it, with its snapshot, mark and reply, in the same session', async () => {
    // A server of this test's own, so that it can be stopped and a new one started on the same port.
    let server = await startAppServer();
    const port = server.port;
    const title = `Saved before a restart ${stamp()}`;
    const reply = 'Still here after the restart?';
    const context = await browser.newContext({ viewport: { width: 1440, height: 1000 } });
    try {
      const engineer = await context.newPage();
      await signIn(engineer, server.baseUrl, 'engineer@fanlight.test');
      await engineer.waitForURL(`${server.baseUrl}/projects`);
      const { viewId, markId } = await seedView(engineer, title);
      expect((await api(engineer, 'POST', `/marks/${markId}/comments`, { body: reply })).status).toBe(201);

      await server.stop();
      server = await startAppServer(port);

      await engineer.goto(`${server.baseUrl}/views/${viewId}?mark=${markId}`);
      await expect.poll(() => engineer.getByRole('heading', { name: title }).isVisible(), { timeout: 15_000 }).toBe(true);
      expect(new URL(engineer.url()).pathname).toBe(`/views/${viewId}`); // the session survived: no sign-in page
      await expectPainted(engineer);
      await expect.poll(() => engineer.getByTestId(`mark-shape-${markId}`).isVisible()).toBe(true);
      await expect.poll(() => engineer.locator('[id^="comment-"]').filter({ hasText: reply }).isVisible()).toBe(true);
    } finally {
      await context.close();
      await server.stop();
    }
  });
});
