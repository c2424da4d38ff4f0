/**
 * The Bench gives the map the screen: on a 1600×1000 window the map with its axes and colour bar takes
 * at least 60 % of the window, and the core loop (map, readout, guides, findings, tracks) is on screen
 * without scrolling the page. The side sections fold to a rail, the right column is resized by its edge,
 * and the arrangement comes back for the same user.
 */
import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { demoRecordings } from '../../seeds/demo-recordings';
import { canvasPixels, launchBrowser, screenshot, signedInPage } from './browser';

const W = 1600;
const H = 1000;

describe('the Bench layout (browser)', () => {
  const baseUrl = inject('baseUrl');
  let browser: Browser;
  beforeAll(async () => {
    browser = await launchBrowser();
  });
  afterAll(() => browser?.close());

  it('gives the map at least 60 % of a 1600×1000 window with the core loop on screen and no page scroll', async () => {
    const { page, context, errors } = await signedInPage(browser, baseUrl, 'engineer@fanlight.test', { viewport: { width: W, height: H } });
    await page.getByRole('button', { name: `Open the demo recording ${demoRecordings[0].title}` }).click();
    await expect.poll(() => page.getByTestId('map-done').isVisible(), { timeout: 60_000 }).toBe(true);
    await screenshot(page, 'bench-layout-opened');
    await expect.poll(() => page.getByTestId('finding-carrier-shift').first().isVisible(), { timeout: 60_000 }).toBe(true);
    await page.keyboard.press('c');
    await expect.poll(() => page.getByTestId('tracks-plot').isVisible(), { timeout: 60_000 }).toBe(true);

    const figure = (await page.getByTestId('map-figure').boundingBox())!;
    const share = (figure.width * figure.height) / (W * H);
    expect(share).toBeGreaterThanOrEqual(0.6);
    const scroll = await page.evaluate(() => ({ height: document.documentElement.scrollHeight, width: document.documentElement.scrollWidth }));
    expect(scroll.height).toBeLessThanOrEqual(H);
    expect(scroll.width).toBeLessThanOrEqual(W);
    // each part of the core loop starts on screen
    for (const part of [page.getByTestId('map-readout'), page.getByRole('region', { name: 'Guides' }), page.getByTestId('tracks-plot'), page.getByRole('region', { name: 'Findings' })]) {
      const box = (await part.boundingBox())!;
      expect(box.y).toBeGreaterThanOrEqual(0);
      expect(box.y + Math.min(box.height, 120)).toBeLessThanOrEqual(H);
      expect(box.x + box.width).toBeLessThanOrEqual(W);
    }
    await screenshot(page, 'bench-layout-dark');
    // the light theme beside the dark one: surfaces change, the map keeps its colour scale
    const mapBefore = await canvasPixels(page, 'map-canvas');
    await page.getByRole('button', { name: 'Light theme' }).click();
    expect(await page.evaluate(() => document.documentElement.dataset.theme)).toBe('light');
    const background = await page.evaluate(() => getComputedStyle(document.body).backgroundColor);
    expect(background).not.toBe('rgb(13, 17, 23)');
    expect((await canvasPixels(page, 'map-canvas')).colours).toBeGreaterThan(mapBefore.colours * 0.8);
    await page.waitForTimeout(400); // the buttons' colour transitions end
    await screenshot(page, 'bench-layout-light');
    await page.getByRole('button', { name: 'Light theme' }).click();
    expect(await page.evaluate(() => document.documentElement.dataset.theme)).toBe('dark');

    // a side section opens beside the rail and folds again; the right column widens by its edge
    await page.getByRole('button', { name: 'Channels and speed' }).click();
    await expect.poll(() => page.getByLabel('Name of channel 1').isVisible()).toBe(true);
    const separator = page.getByRole('separator', { name: 'Width of the side column' });
    const before = Number(await separator.getAttribute('aria-valuenow'));
    const edge = (await separator.boundingBox())!;
    await page.mouse.move(edge.x + edge.width / 2, edge.y + edge.height / 2);
    await page.mouse.down();
    await page.mouse.move(edge.x - 100, edge.y + edge.height / 2, { steps: 5 });
    await page.mouse.up();
    expect(Number(await separator.getAttribute('aria-valuenow'))).toBeGreaterThan(before + 80);

    // the same user finds the Bench as left
    // (the address keeps the open recording)
    await page.reload();
    await expect.poll(() => page.getByLabel('Name of channel 1').isVisible(), { timeout: 30_000 }).toBe(true);
    expect(Number(await page.getByRole('separator', { name: 'Width of the side column' }).getAttribute('aria-valuenow'))).toBeGreaterThan(before + 80);
    expect(errors).toEqual([]);
    await context.close();
  }, 180_000);
});
