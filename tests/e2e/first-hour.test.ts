/**
 * The first hour: every demo account signs in and finds the finished finding one click away: the demo
 * project lists its recordings and the seeded view; the view shows its snapshot, marks and thread; the run-up
 * opens on the Bench from the project page in one click, and the view opens live there.
 */
import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { DEMO_VIEW_TITLE, demoMarks } from '../../seeds/demo-view';
import { demoProject } from '../../seeds/demo-scenario';
import { canvasPixels, launchBrowser, screenshot, signIn } from './browser';

describe('the first hour with the demo (browser)', () => {
  const baseUrl = inject('baseUrl');
  let browser: Browser;
  beforeAll(async () => {
    browser = await launchBrowser();
  });
  afterAll(() => browser?.close());

  it.each(['viewer@fanlight.test', 'lead@fanlight.test', 'engineer@fanlight.test'])(
    '%s sees the recordings and the finished view, and opens the run-up on the Bench in one click',
    async (email) => {
      const page = await browser.newPage({ viewport: { width: 1600, height: 1000 } });
      await signIn(page, baseUrl, email);
      await page.waitForURL(`${baseUrl}/projects`);
      await page.getByRole('link', { name: demoProject.name }).click();
      const recordings = page.getByTestId('project-recordings');
      await expect.poll(() => recordings.getByText('ca7-run-up-30s.wav', { exact: true }).isVisible()).toBe(true);
      await expect.poll(() => page.getByRole('link', { name: DEMO_VIEW_TITLE }).first().isVisible()).toBe(true);

      // the view: snapshot painted, the marks listed, the thread there
      await page.getByRole('link', { name: DEMO_VIEW_TITLE }).first().click();
      await page.waitForURL(/\/views\/\d+/);
      await expect.poll(() => page.getByText(demoMarks[0].text).first().isVisible()).toBe(true);
      await expect.poll(() => page.getByText(/step at 6000 rpm is the firmware carrier schedule/).first().isVisible()).toBe(true);
      await expect.poll(() => page.getByRole('link', { name: 'Open live on the Bench' }).isVisible()).toBe(true);
      await screenshot(page, `first-hour-view-${email.split('@')[0]}`);

      // back to the project: one click opens the run-up on the Bench, fetched from the server's demo files
      await page.goBack();
      await page.getByRole('link', { name: 'Open ca7-run-up-30s.wav on the Bench' }).click();
      await page.waitForURL(/\/bench\?/);
      await expect.poll(async () => (await canvasPixels(page, 'map-canvas')).opaque, { timeout: 60_000 }).toBeGreaterThan(0.9);
      expect(new URL(page.url()).searchParams.get('open')).toMatch(/^[0-9a-f]{64}$/);
      await page.close();
    },
    120_000,
  );

  it('the view opens live on the Bench with its marks, from the demo files', async () => {
    const page = await browser.newPage({ viewport: { width: 1600, height: 1000 } });
    await signIn(page, baseUrl, 'viewer@fanlight.test');
    await page.waitForURL(`${baseUrl}/projects`);
    await page.getByRole('link', { name: demoProject.name }).click();
    await page.getByRole('link', { name: DEMO_VIEW_TITLE }).first().click();
    await page.getByRole('link', { name: 'Open live on the Bench' }).click();
    await page.waitForURL(/\/bench\?/);
    await expect.poll(async () => (await canvasPixels(page, 'map-canvas')).opaque, { timeout: 60_000 }).toBeGreaterThan(0.9);
    const url = new URL(page.url());
    expect(url.searchParams.get('view')).toMatch(/^\d+$/);
    expect(url.searchParams.get('demo')).toBeNull();
    await screenshot(page, 'first-hour-bench-view');
    await page.close();
  }, 120_000);
});
