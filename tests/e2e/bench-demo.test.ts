import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { demoRecordings } from '../../seeds/demo-recordings';
import { launchBrowser, screenshot, showBenchSection, signIn } from './browser';

describe('the demo recordings on the Bench (browser)', () => {
  const baseUrl = inject('baseUrl');
  let browser: Browser;
  beforeAll(async () => {
    browser = await launchBrowser();
  });
  afterAll(() => browser?.close());

  it('open in one click with their channels set up, and the carrier switch is found', async () => {
    const page = await browser.newPage({ viewport: { width: 1600, height: 1100 } });
    await signIn(page, baseUrl, 'engineer@fanlight.test');
    await page.waitForURL(`${baseUrl}/projects`);
    await page.goto(`${baseUrl}/bench`);
    await page.getByRole('button', { name: `Open the demo recording ${demoRecordings[0].title}` }).click();
    await showBenchSection(page, 'Channels and speed');
    const rows = page.getByTestId('channel-list').locator('tbody tr');
    await expect.poll(() => rows.count(), { timeout: 30_000 }).toBe(3);
    expect(await page.getByLabel('Name of channel 1').inputValue()).toBe('acc inverter housing');
    expect(await page.getByLabel('Quantity of channel 3').inputValue()).toBe('tacho');
    // the tacho is picked up as the speed source and the 8 → 12 kHz switch at 6000 rpm is listed
    const shift = page.getByTestId('finding-carrier-shift').first();
    await expect.poll(() => shift.isVisible(), { timeout: 60_000 }).toBe(true);
    expect((await shift.textContent())?.replace(/\s/g, '')).toMatch(/8000→12000Hz/);
    await screenshot(page, 'bench-demo');
    await page.close();
  });
});
