/**
 * A view saved from the Bench: the engineer opens a short synthetic run-up (6 s, 1000 → 9000 rpm,
 * 4 pole pairs, carrier 8 kHz stepping to 10 kHz at 5000 rpm, orders 8 and 48, a 60-pulse tacho), places
 * a point mark with a text and saves the view into the demo project, registering nothing by hand; the
 * viewer then finds it in the project's views table and sees the painted snapshot and the mark.
 */
import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { demoProject } from '../../seeds/demo-scenario';
import { canvasPixels, launchBrowser, screenshot, signIn } from './browser';
import { runUpWav } from './run-up';

const DURATION_S = 6;
const runUp = () =>
  runUpWav(
    DURATION_S,
    [
      { m: 1, n: 1, amplitude: 0.02 },
      { m: 1, n: -1, amplitude: 0.02 },
    ],
    11,
  );



describe('saving a view from the Bench (browser)', () => {
  const baseUrl = inject('baseUrl');
  let browser: Browser;
  beforeAll(async () => {
    browser = await launchBrowser();
  });
  afterAll(() => browser?.close());

  it('the engineer marks the map and saves a view; the viewer opens it from the project and sees the snapshot and the mark', { timeout: 150_000 }, async () => {
    const title = `Bench run-up ${Date.now().toString(36)}`;
    const markText = 'Carrier step heard on the rig';
    const fileName = `save-view-${Date.now()}.wav`;
    const context = await browser.newContext({ viewport: { width: 1680, height: 1050 } });
    const page = await context.newPage();
    const errors: string[] = [];
    page.on('pageerror', (e) => errors.push(e.message));
    await signIn(page, baseUrl, 'engineer@fanlight.test');
    await page.waitForURL(`${baseUrl}/projects`);
    await page.goto(`${baseUrl}/bench`);

    await page.getByTestId('drop-zone-input').setInputFiles({ name: fileName, mimeType: 'audio/wav', buffer: Buffer.from(runUp()) });
    await expect.poll(() => page.getByTestId('channel-list').locator('tbody tr').count(), { timeout: 20_000 }).toBe(2);
    await page.getByLabel('Quantity of channel 1').selectOption('acceleration');
    await page.getByLabel('Quantity of channel 2').selectOption('tacho');
    await expect.poll(() => page.getByTestId('map-done').isVisible(), { timeout: 30_000 }).toBe(true);
    await expect.poll(async () => (await canvasPixels(page, 'map-canvas')).opaque, { timeout: 10_000 }).toBeGreaterThan(0.9);

    // A point mark with a text, in mark mode.
    await page.getByRole('button', { name: 'Add mark' }).click();
    expect(await page.getByRole('button', { name: 'Add mark' }).getAttribute('aria-pressed')).toBe('true');
    await page.getByLabel('Mark text').fill(markText);
    const canvas = page.getByTestId('map-canvas');
    const box = (await canvas.boundingBox())!;
    await canvas.click({ position: { x: box.width * 0.5, y: box.height * 0.6 } });
    const pending = page.getByTestId('pending-marks');
    await expect.poll(async () => (await pending.textContent()) ?? '').toContain(markText);
    expect(await pending.locator('li').count()).toBe(1);

    // Saved into the demo project; the recording is registered there on the way.
    await page.getByLabel('View title').fill(title);
    await page.getByLabel('Save into project').selectOption({ label: demoProject.name });
    await page.getByRole('button', { name: 'Save view' }).click();
    const link = page.getByTestId('saved-view-link');
    await expect.poll(() => link.isVisible(), { timeout: 20_000 }).toBe(true);
    expect(await link.textContent()).toBe(title);
    const href = (await link.getAttribute('href')) ?? '';
    const [, viewId] = /^\/views\/(\d+)$/.exec(href) ?? [];
    expect(viewId, href).toBeTruthy();
    // the pending marks went with the view
    expect(await page.getByTestId('pending-marks').count()).toBe(0);
    await screenshot(page, 'bench-save-view');
    expect(errors).toEqual([]);
    await context.close();

    const viewerContext = await browser.newContext({ viewport: { width: 1440, height: 1000 } });
    const viewer = await viewerContext.newPage();
    await signIn(viewer, baseUrl, 'viewer@fanlight.test');
    await viewer.waitForURL(`${baseUrl}/projects`);
    await viewer.getByRole('link', { name: demoProject.name }).click();
    await viewer.getByLabel('Filter views').fill(title);
    const table = viewer.getByTestId('project-views');
    await expect.poll(() => table.getByRole('link', { name: title }).isVisible(), { timeout: 15_000 }).toBe(true);
    await table.getByRole('link', { name: title }).click();
    await viewer.waitForURL(`${baseUrl}/views/${viewId}`);
    await expect.poll(() => viewer.getByRole('heading', { name: title }).isVisible()).toBe(true);
    // the recording was registered with the project on the way
    expect(await viewer.locator('body').textContent()).toContain(fileName);

    await expect.poll(async () => (await canvasPixels(viewer, 'view-snapshot')).opaque, { timeout: 15_000 }).toBe(1);
    const px = await canvasPixels(viewer, 'view-snapshot');
    expect(px.width).toBeGreaterThan(100);
    expect(px.width).toBeLessThanOrEqual(1024);
    expect(px.height).toBeGreaterThan(100);
    expect(px.height).toBeLessThanOrEqual(768);
    expect(px.colours).toBeGreaterThan(20);
    // the mark, on the map and in its card
    await expect.poll(() => viewer.getByRole('button', { name: `Mark 1: ${markText}` }).count()).toBe(1);
    await expect.poll(async () => (await viewer.locator('[id^="mark-card-"]').first().textContent()) ?? '').toContain(markText);
    await screenshot(viewer, 'bench-saved-view');
    await viewerContext.close();
  });
});
