/**
 * Comparing runs on the Bench: the demo's run-up before and after the firmware change, opened together
 * in one click. The changed run's map follows the baseline's zoom, the comparison shows the tracked
 * family in both runs with the difference (the firmware lowers fc ± fe by 5 dB, invented for the demo),
 * both carrier schedules, and the findings side by side.
 */
import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { demoRecordings } from '../../seeds/demo-recordings';
import { demoProject } from '../../seeds/demo-scenario';
import { synthesiseDrive, synthesiseTacho } from '../../seeds/synthetic-drive';
import { writeWav } from '../../workers/io/wav-writer';
import { launchBrowser, screenshot, showBenchSection, signIn } from './browser';

describe('comparing runs on the Bench (browser)', () => {
  const baseUrl = inject('baseUrl');
  let browser: Browser;
  beforeAll(async () => {
    browser = await launchBrowser();
  });
  afterAll(() => browser?.close());

  it('opens the two demo run-ups together, tracks a family in both with its difference, and compares the carriers and findings', async () => {
    const page = await browser.newPage({ viewport: { width: 1600, height: 1100 } });
    const errors: string[] = [];
    page.on('pageerror', (e) => errors.push(e.message));
    await signIn(page, baseUrl, 'engineer@fanlight.test');
    await page.waitForURL(`${baseUrl}/projects`);
    await page.goto(`${baseUrl}/bench`);
    const changed = demoRecordings.find((d) => d.comparesWith)!;
    const baseline = demoRecordings.find((d) => d.file === changed.comparesWith)!;
    await page.getByRole('button', { name: `Compare with ${baseline.title}` }).click();

    // the baseline opens, the changed run joins it (and the address keeps the comparison)
    const run = page.getByTestId('compared-run');
    await expect.poll(() => run.count(), { timeout: 60_000 }).toBe(1);
    await expect.poll(() => page.url(), { timeout: 30_000 }).toContain('with=');
    const panel = page.getByTestId('compare-panel');
    await expect.poll(() => panel.isVisible(), { timeout: 60_000 }).toBe(true);

    // both carrier schedules are found: 8 → 12 kHz before, 10 → 12 kHz after
    const carriers = page.getByTestId('compare-carriers');
    await expect.poll(async () => (await carriers.textContent())?.replace(/\s/g, ''), { timeout: 90_000 }).toMatch(/Carrier8000Hz,then12000Hz.*Carrier10000Hz,then12000Hz/);
    await expect.poll(() => page.getByTestId('compare-findings-row').count()).toBe(2);

    // against speed, a carrier guide on the detected carrier: its first family is tracked in both runs
    await page.getByRole('button', { name: 'Map against speed' }).click();
    await page.keyboard.press('c');
    const deltas = page.getByTestId('compare-deltas').locator('li');
    await expect.poll(() => deltas.count(), { timeout: 90_000 }).toBe(1);
    await expect.poll(() => page.getByTestId('compare-tracks-plot').isVisible()).toBe(true);
    expect(await page.getByTestId('compare-delta-plot').isVisible()).toBe(true);
    const label = await page.getByLabel('Track to compare').inputValue();
    expect(label).toBeTruthy();
    // fc − fe is 5 dB lower after the change
    const delta = Number(await deltas.first().getAttribute('data-median-delta'));
    expect(Math.abs(delta - -5)).toBeLessThan(1);

    // the difference map of the changed run against the baseline, on the speeds both cover
    await run.getByRole('button', { name: 'Difference' }).click();
    const note = page.getByTestId('difference-map-note');
    await expect.poll(() => note.isVisible(), { timeout: 20_000 }).toBe(true);
    expect(await note.textContent()).toMatch(/−20 dB .* \+20 dB/);

    // the demo project's target for fc − fe (Z): the baseline goes above it from about 4200 rpm (seeded:
    // −25 dB re 1 g at 500 rpm rising to −21 at 12 000 rpm; `analyze compare` on the same files puts the
    // crossing at 4172 rpm), the changed run (5 dB lower) stays more than 1 dB under it
    await page.getByLabel('Project whose targets are checked').selectOption({ label: demoProject.name });
    const exceedance = page.getByTestId('compare-exceedance');
    await expect.poll(() => exceedance.count(), { timeout: 20_000 }).toBeGreaterThan(0);
    // (the carrier's switch at 6000 rpm dents the track briefly, so the baseline's may come in two parts)
    for (const text of await exceedance.allTextContents()) {
      expect(text).toContain(`${baseline.file}:`);
      expect(text).not.toContain(changed.file);
    }
    const from = Number(await exceedance.first().getAttribute('data-from-rpm'));
    expect(Math.abs(from - 4172) / 4172).toBeLessThan(0.05);
    await exceedance.first().click();
    await expect.poll(async () => Number(await page.getByTestId('map-view-range').getAttribute('data-x0'))).toBeGreaterThan(3000);
    await screenshot(page, 'bench-compare');

    // saved as a view: the comparison travels with it, without any raw file
    const title = `Firmware A against B, ${Date.now()}`;
    await showBenchSection(page, 'Register and save');
    await page.getByLabel('View title').fill(title);
    await page.getByLabel('Save into project').selectOption({ label: demoProject.name });
    await page.getByRole('button', { name: 'Save view' }).click();
    await expect.poll(() => page.getByTestId('saved-view-link').isVisible(), { timeout: 20_000 }).toBe(true);
    expect(errors).toEqual([]);
    await page.close();

    // the viewer finds it on the project page and sees the runs compared
    const viewer = await browser.newPage({ viewport: { width: 1400, height: 1100 } });
    await signIn(viewer, baseUrl, 'viewer@fanlight.test');
    await viewer.waitForURL(`${baseUrl}/projects`);
    await viewer.getByRole('link', { name: demoProject.name }).first().click();
    await viewer.getByLabel('Filter views').fill(title);
    await viewer.getByTestId('project-views').getByRole('link', { name: title }).click();
    const comparison = viewer.getByTestId('view-comparison');
    await expect.poll(() => comparison.isVisible(), { timeout: 20_000 }).toBe(true);
    expect(await viewer.getByTestId('view-comparison-levels').isVisible()).toBe(true);
    expect(await viewer.getByTestId('view-comparison-deltas').isVisible()).toBe(true);
    expect(await viewer.getByTestId('view-comparison-carriers').isVisible()).toBe(true);
    expect(await viewer.getByTestId('view-comparison-exceedances').textContent()).toContain(baseline.file);
    const findings = await viewer.getByTestId('view-comparison-findings').textContent();
    expect(findings?.replace(/\s/g, '')).toMatch(/Carrier8000Hz,then12000Hz.*Carrier10000Hz,then12000Hz/);
    await screenshot(viewer, 'view-comparison');

    // and reopens it live on the Bench, with the changed run beside the baseline again
    expect(await viewer.getByRole('link', { name: 'Open live on the Bench' }).getAttribute('href')).toContain(`withDemo=${changed.file}`);
    await viewer.getByRole('link', { name: 'Open live on the Bench' }).click();
    await expect.poll(() => viewer.getByTestId('compared-run').count(), { timeout: 60_000 }).toBe(1);
    await expect.poll(() => viewer.getByTestId('compare-panel').isVisible(), { timeout: 60_000 }).toBe(true);
    await viewer.close();
    // several maps, findings and tracks in two sessions, a save and a reopening: more than the default minute
  }, 240_000);

  it('puts a file of one’s own beside the open recording, and keeps it in the library', async () => {
    const page = await browser.newPage({ viewport: { width: 1600, height: 1100 } });
    await signIn(page, baseUrl, 'engineer@fanlight.test');
    await page.waitForURL(`${baseUrl}/projects`);
    await page.goto(`${baseUrl}/bench`);
    await page.getByRole('button', { name: `Open the demo recording ${demoRecordings[0].title}` }).click();
    await expect.poll(() => page.getByTestId('recording-name').textContent(), { timeout: 30_000 }).toBe(demoRecordings[0].file);
    await showBenchSection(page, 'Recordings');
    // a short run-up of the same drive at 25.6 kHz (invented), accelerometer and tacho
    const fs = 25600;
    const rpm = (t: number) => 1000 + 1500 * t;
    const x = synthesiseDrive({ fsHz: fs, durationS: 4, rpm, polePairs: 4, carrierHz: () => 8000, families: [{ m: 1, n: 1, amplitude: 0.02 }], noiseRms: 0.002, seed: 3 });
    const bytes = writeWav([x, synthesiseTacho(fs, 4, rpm, 60)], { sampleRateHz: fs, bits: 24 });
    await page.getByLabel('A recording to compare with the open one').setInputFiles({ name: 'bench-test-run.wav', mimeType: 'audio/wav', buffer: Buffer.from(bytes) });
    const run = page.getByTestId('compared-run');
    await expect.poll(() => run.count(), { timeout: 60_000 }).toBe(1);
    expect(await run.first().textContent()).toContain('bench-test-run.wav');
    // the open recording stays open; the file is in the library, marked as compared
    expect(await page.getByTestId('recording-name').textContent()).toBe(demoRecordings[0].file);
    expect(await page.getByRole('button', { name: 'Compare bench-test-run.wav with the open recording' }).getAttribute('aria-pressed')).toBe('true');
    await page.close();
  }, 120_000);
});
