/**
 * The hearing panel on the Bench: on the demo run-up's microphone (sound pressure in Pa), the engineer
 * asks for loudness and tonality; both arrive from their workers without blocking the page, plotted
 * against time and then against speed, with N5, the average tonality and its frequency, and the tonal
 * frequency drawn on the map. On the accelerometer the panel says the methods need sound pressure.
 *
 * The methods themselves are checked against their standards in tests/unit/dsp (ISO 532-1 Annex B,
 * ECMA-418-2's 1 kHz / 40 dB reference). Here the figures are checked against the demo's synthesis
 * (seeds/demo-recordings.ts): the microphone's strongest lines are order 48 (up to 0.03 Pa, 0.4–9.6 kHz
 * over the run-up) and the carrier's fc ± fe (0.025 Pa around 8 and 12 kHz), so the tonal frequency
 * lies among them and the tonality is well above that of noise.
 */
import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { demoRecordings } from '../../seeds/demo-recordings';
import { launchBrowser, screenshot, showMapSettings, signedInPage } from './browser';

const number = (text: string | null, re: RegExp) => Number((text ?? '').match(re)?.[1]?.replace(/\s/g, '') ?? NaN);

describe('the hearing panel (browser)', () => {
  const baseUrl = inject('baseUrl');
  let browser: Browser;
  beforeAll(async () => {
    browser = await launchBrowser();
  });
  afterAll(() => browser?.close());

  it('gives the loudness and tonality of the microphone against time and speed, and draws the tonal frequency on the map', async () => {
    const { page, context, errors } = await signedInPage(browser, baseUrl, 'engineer@fanlight.test', { viewport: { width: 1600, height: 1100 } });
    await page.getByRole('button', { name: `Open the demo recording ${demoRecordings[0].title}` }).click();
    const panel = page.getByTestId('hearing-panel');
    await expect.poll(() => panel.isVisible(), { timeout: 60_000 }).toBe(true);
    // the accelerometer is not sound pressure
    await expect.poll(() => panel.textContent()).toContain('sound-pressure channel in Pa');

    await showMapSettings(page);
    await page.getByLabel('Map channel').selectOption({ label: '2 · mic 1 m' });
    const ask = panel.getByRole('button', { name: 'Compute loudness and tonality' });
    await expect.poll(() => ask.isVisible(), { timeout: 60_000 }).toBe(true);
    await ask.click();
    await expect.poll(() => panel.textContent()).toMatch(/Computing the (loudness|tonality)/);

    const n5 = panel.getByTestId('loudness-n5');
    await expect.poll(() => n5.isVisible(), { timeout: 120_000 }).toBe(true);
    const n5Sone = number(await n5.textContent(), /N5 ([\d\s.]+) sone/);
    // a few sone: 55–60 dB lines in a quiet room-level noise (ISO 532-1: 1 kHz at 60 dB is 4 sone)
    expect(n5Sone).toBeGreaterThan(0.5);
    expect(n5Sone).toBeLessThan(40);
    expect(await page.getByTestId('loudness-plot').locator('canvas').count()).toBeGreaterThan(0);

    const average = panel.getByTestId('tonality-average');
    await expect.poll(() => average.isVisible(), { timeout: 180_000 }).toBe(true);
    const text = await average.textContent();
    const tu = number(text, /([\d.]+) tu_HMS/);
    const hz = number(text, /at ([\d\s]+) Hz/);
    expect(tu).toBeGreaterThan(0.1);
    expect(hz).toBeGreaterThan(350);
    expect(hz).toBeLessThan(13_000);
    const mapBox = page.getByTestId('map-canvas').locator('..');
    await expect.poll(async () => Number(await mapBox.getAttribute('data-tonal-points'))).toBeGreaterThan(10);
    await panel.getByLabel('tonal frequency on the map').uncheck();
    await expect.poll(async () => Number(await mapBox.getAttribute('data-tonal-points'))).toBe(0);

    // against speed: the same figures, placed at the run's speed
    await page.getByRole('group', { name: 'Against' }).getByRole('button', { name: 'Speed' }).click();
    await expect.poll(() => page.getByTestId('tonality-plot').getAttribute('aria-label')).toContain('against speed');
    await screenshot(page, 'bench-hearing');
    expect(errors).toEqual([]);
    await context.close();
  });
});
