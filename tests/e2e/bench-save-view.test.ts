/**
 * The whole path of a finding, in one browser run: the engineer opens a short synthetic run-up (6 s,
 * 1000 → 9000 rpm, 4 pole pairs, carrier 8 kHz stepping to 10 kHz at 5000 rpm, orders 8 and 48, a
 * 60-pulse tacho) on the Bench, sets it up (Hamming window, Glacier colours, against speed, zoomed, order
 * 8 tracked), places a point mark and saves the view into the demo project; the viewer opens it from the
 * project's views table, sees the snapshot, the mark and the track, and replies; the engineer follows the
 * mail in the Outbox to the mark, opens the view live on the Bench at the same state, edits the mark
 * there and saves one more mark into the same view.
 */
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { demoProject } from '../../seeds/demo-scenario';
import { canvasPixels, launchBrowser, screenshot, showBenchSection, showMapSettings, signIn, signedInPage } from './browser';
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

async function viewRange(page: Page): Promise<[number, number]> {
  const el = page.getByTestId('map-view-range');
  return [Number(await el.getAttribute('data-x0')), Number(await el.getAttribute('data-x1'))];
}

describe('a finding from the Bench to a colleague and back (browser)', () => {
  const baseUrl = inject('baseUrl');
  let browser: Browser;
  beforeAll(async () => {
    browser = await launchBrowser();
  });
  afterAll(() => browser?.close());

  it('saved with a mark on the Bench, opened and replied to by a viewer, followed back from the mail and reopened live on the Bench', { timeout: 240_000 }, async () => {
    const title = `Bench run-up ${Date.now().toString(36)}`;
    const markText = 'Carrier step heard on the rig';
    const fileName = `save-view-${Date.now()}.wav`;
    const { context, page, errors } = await signedInPage(browser, baseUrl, 'engineer@fanlight.test', { viewport: { width: 1680, height: 1050 } });

    await page.getByTestId('drop-zone-input').setInputFiles({ name: fileName, mimeType: 'audio/wav', buffer: Buffer.from(runUp()) });
    await showBenchSection(page, 'Channels and speed');
    await showBenchSection(page, 'Register and save');
    await showMapSettings(page);
    await expect.poll(() => page.getByTestId('channel-list').locator('tbody tr').count(), { timeout: 20_000 }).toBe(2);
    await page.getByLabel('Quantity of channel 1').selectOption('acceleration');
    await page.getByLabel('Quantity of channel 2').selectOption('tacho');
    await page.getByLabel('Window').selectOption('hamming');
    await page.getByLabel('Colours').selectOption('glacier');
    await expect.poll(() => page.getByTestId('map-done').isVisible(), { timeout: 30_000 }).toBe(true);

    // Order 8, tracked; the map against speed, zoomed in.
    const guides = page.getByRole('region', { name: 'Guides' });
    await guides.getByLabel('Order k').fill('8');
    await guides.getByRole('button', { name: 'Add order' }).click();
    await expect.poll(() => guides.getByTestId('guide-order').count()).toBe(1);
    await page.getByRole('group', { name: 'Against' }).getByRole('button', { name: 'Speed' }).click();
    await expect.poll(() => page.getByTestId('map-view-range').textContent(), { timeout: 30_000 }).toMatch(/rpm/);
    await expect.poll(async () => (await canvasPixels(page, 'map-canvas')).opaque, { timeout: 15_000 }).toBeGreaterThan(0.9);
    const full = await viewRange(page);
    await page.getByTestId('map-canvas').hover();
    await page.keyboard.press('+');
    await expect.poll(async () => (await viewRange(page)).join(',')).not.toBe(full.join(','));
    const zoomed = await viewRange(page);
    expect(zoomed[1] - zoomed[0]).toBeLessThan(full[1] - full[0]);
    await expect.poll(() => page.getByTestId('tracks-legend').textContent(), { timeout: 20_000 }).toContain('8·fr');

    // A point mark with a text, in mark mode.
    await page.getByRole('button', { name: 'Add mark' }).click();
    expect(await page.getByRole('button', { name: 'Add mark' }).getAttribute('aria-pressed')).toBe('true');
    await page.getByLabel('Mark text').fill(markText);
    const canvas = page.getByTestId('map-canvas');
    const box = (await canvas.boundingBox())!;
    await canvas.click({ position: { x: box.width * 0.5, y: box.height * 0.6 } });
    await expect.poll(() => page.getByLabel('Text of pending mark 1').inputValue()).toBe(markText);
    // and a mark on the whole order-8 line
    const guideText = 'Order 8 rises with speed';
    await page.getByLabel('Mark text').fill(guideText);
    expect(await page.getByLabel('Guide to mark').locator('option:checked').textContent()).toBe('8·fr');
    await page.getByRole('button', { name: 'Mark guide' }).click();
    await expect.poll(() => page.getByLabel('Text of pending mark 2').inputValue()).toBe(guideText);
    expect(await page.getByTestId('pending-marks').textContent()).toContain('on 8·fr');
    expect(await page.getByTestId('pending-marks').locator('li').count()).toBe(2);

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

    // The viewer finds it in the project, sees the snapshot, the mark and the track, and replies.
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
    expect(px.height).toBeGreaterThan(50);
    expect(px.height).toBeLessThanOrEqual(768);
    expect(px.colours).toBeGreaterThan(20);
    // the track of order 8 came with the snapshot
    await expect.poll(async () => (await viewer.getByTestId('view-tracks').textContent()) ?? '').toContain('8·fr');
    expect(await viewer.getByTestId('view-tracks').textContent()).toContain('dB re 1 µm/s² against speed');
    // the mark, on the map and in its card
    const markButton = viewer.getByRole('button', { name: `Mark 1: ${markText}` });
    await expect.poll(() => markButton.count()).toBe(1);
    const card = viewer.locator('[id^="mark-card-"]').first();
    await expect.poll(async () => (await card.textContent()) ?? '').toContain(markText);
    await expect.poll(async () => (await viewer.locator('[id^="mark-card-"]').nth(1).textContent()) ?? '').toContain(guideText);
    const markId = ((await card.getAttribute('id')) ?? '').replace('mark-card-', '');
    await markButton.click();
    await expect.poll(() => viewer.getByTestId('selected-mark').getAttribute('data-mark-id')).toBe(markId);
    const reply = 'I hear it on the rig too, from 5000 rpm on';
    await card.getByLabel('Reply').fill(reply);
    await card.getByRole('button', { name: 'Send reply' }).click();
    await expect.poll(async () => (await card.textContent()) ?? '').toContain(reply);
    await screenshot(viewer, 'bench-saved-view');
    await viewerContext.close();

    // The engineer gets the mail; its link opens the mark.
    await page.goto(`${baseUrl}/outbox`);
    const mail = page.locator('article').filter({ hasText: `Priya Holm replied on your mark in "${title}"` });
    await expect.poll(() => mail.isVisible(), { timeout: 20_000 }).toBe(true);
    await mail.getByRole('link', { name: /\/views\// }).click();
    await page.waitForURL(new RegExp(`/views/${viewId}\\?mark=${markId}#comment-\\d+$`));
    await expect.poll(() => page.getByTestId('selected-mark').getAttribute('data-mark-id')).toBe(markId);
    await expect.poll(() => page.locator('[id^="comment-"]').filter({ hasText: reply }).isVisible()).toBe(true);

    // This browser's library holds the recording: the view opens live on the Bench at the same state.
    await page.getByRole('link', { name: 'Open live on the Bench' }).click();
    await page.waitForURL(new RegExp(`/bench\\?.*view=${viewId}`));
    await expect.poll(() => page.getByTestId('bench-from-view').isVisible(), { timeout: 30_000 }).toBe(true);
    expect(await page.getByTestId('bench-from-view').textContent()).toContain(title);
    expect(await page.getByLabel('Window').inputValue()).toBe('hamming');
    expect(await page.getByLabel('Colours').inputValue()).toBe('glacier');
    await expect.poll(() => page.getByRole('group', { name: 'Against' }).getByRole('button', { name: 'Speed' }).getAttribute('aria-pressed'), { timeout: 40_000 }).toBe('true');
    await expect.poll(() => page.getByTestId('map-view-range').textContent(), { timeout: 30_000 }).toMatch(/rpm/);
    const restored = await viewRange(page);
    expect(Math.abs(restored[0] - zoomed[0])).toBeLessThan(1);
    expect(Math.abs(restored[1] - zoomed[1])).toBeLessThan(1);
    expect(await guides.getByTestId('guide-order').count()).toBe(1);
    await expect.poll(() => page.getByTestId('tracks-legend').textContent(), { timeout: 20_000 }).toContain('8·fr');

    // The saved mark is on the Bench, with its thread; its author edits it there.
    const saved = page.getByTestId(`saved-mark-${markId}`);
    await expect.poll(async () => (await saved.textContent()) ?? '', { timeout: 15_000 }).toContain(markText);
    expect(await page.getByTestId('saved-marks').textContent()).toContain(`on 8·fr`);
    expect(await saved.textContent()).toContain('Thread (1)');
    const edited = 'Carrier step at 5000 rpm, heard on the rig';
    await saved.getByRole('button', { name: 'Edit mark 1' }).click();
    await saved.getByLabel('Text of mark 1').fill(edited);
    await saved.getByRole('button', { name: 'Save' }).click();
    await expect.poll(async () => (await saved.textContent()) ?? '').toContain('· edited');
    expect(await saved.textContent()).toContain(edited);

    // One more mark, saved into the same view.
    await page.getByRole('button', { name: 'Add mark' }).click();
    await page.getByLabel('Mark text').fill('Order 8 peak');
    await canvas.click({ position: { x: box.width * 0.3, y: box.height * 0.7 } });
    await expect.poll(() => page.getByLabel('Text of pending mark 3').inputValue()).toBe('Order 8 peak');
    await page.getByRole('button', { name: `Save changes to “${title}”` }).click();
    await expect.poll(() => page.getByTestId('saved-view-link').isVisible(), { timeout: 20_000 }).toBe(true);
    await expect.poll(() => page.getByTestId('pending-marks').count()).toBe(0);
    await expect.poll(() => page.getByTestId('saved-marks').locator('li').count()).toBe(3);
    await screenshot(page, 'bench-from-view');

    await page.goto(`${baseUrl}/views/${viewId}`);
    await expect.poll(() => page.getByRole('button', { name: `Mark 1: ${edited}` }).count(), { timeout: 15_000 }).toBe(1);
    await expect.poll(() => page.getByRole('button', { name: 'Mark 3: Order 8 peak' }).count()).toBe(1);
    expect(errors).toEqual([]);
    await context.close();
  });
});
