import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { wav } from '../unit/io/wav-fixtures';
import path from 'node:path';
import { ARTEFACTS_DIR, launchBrowser, screenshot, showBenchSection, showMapSettings, signIn, signedInPage } from './browser';

const FS_HZ = 51200;
const DURATION_S = 6;
const F0_HZ = 500;
const F1_HZ = 5000;

/** Deterministic noise (a 32-bit LCG), so the map has a floor inside its range. */
function noise(seed: number) {
  let s = seed >>> 0;
  return () => {
    s = (Math.imul(s, 1664525) + 1013904223) >>> 0;
    return s / 2 ** 32 - 0.5;
  };
}

/** Channel 1: a linear sweep 500 → 5000 Hz of amplitude 0.5; channel 2: a steady 1200 Hz tone. Both over a little noise. */
function sweepRecording(): Float32Array[] {
  const n = FS_HZ * DURATION_S;
  const rate = (F1_HZ - F0_HZ) / DURATION_S;
  const r1 = noise(1);
  const r2 = noise(2);
  const sweep = new Float32Array(n);
  const tone = new Float32Array(n);
  for (let i = 0; i < n; i++) {
    const t = i / FS_HZ;
    sweep[i] = 0.5 * Math.sin(2 * Math.PI * (F0_HZ * t + (rate * t * t) / 2)) + 0.02 * r1();
    tone[i] = 0.3 * Math.sin(2 * Math.PI * 1200 * t) + 0.02 * r2();
  }
  return [sweep, tone];
}

interface Pixels {
  width: number;
  height: number;
  painted: number;
  /** Row (from the top) of the brightest pixel in columns at 15 %, 50 % and 85 % of the width */
  brightestRows: number[];
}

function mapPixels(page: Page): Promise<Pixels> {
  return page.evaluate(() => {
    const canvas = document.querySelector<HTMLCanvasElement>('[data-testid="map-canvas"]')!;
    const { width, height } = canvas;
    const d = canvas.getContext('2d')!.getImageData(0, 0, width, height).data;
    let painted = 0;
    for (let i = 3; i < d.length; i += 4) if (d[i] !== 0) painted++;
    const brightestRows = [0.15, 0.5, 0.85].map((fx) => {
      const x = Math.floor(fx * width);
      let best = -1;
      let at = -1;
      for (let y = 0; y < height; y++) {
        const p = (y * width + x) * 4;
        const lum = 0.2126 * d[p] + 0.7152 * d[p + 1] + 0.0722 * d[p + 2];
        if (lum > best) {
          best = lum;
          at = y;
        }
      }
      return at;
    });
    return { width, height, painted: painted / (width * height), brightestRows };
  });
}

describe('the Bench computes the map of the open recording (browser)', () => {
  const baseUrl = inject('baseUrl');
  let browser: Browser;
  beforeAll(async () => {
    browser = await launchBrowser();
  });
  afterAll(() => browser?.close());

  it('paints a sweep rising from left to right, reads it under the pointer and recomputes on a new window', async () => {
    const { context, page, errors } = await signedInPage(browser, baseUrl, 'engineer@fanlight.test', { viewport: { width: 1440, height: 1000 } });

    const bytes = wav(sweepRecording(), { bits: 24, sampleRateHz: FS_HZ });
    await page.getByTestId('drop-zone-input').setInputFiles({ name: 'sweep-run-up.wav', mimeType: 'audio/wav', buffer: Buffer.from(bytes) });
    await showBenchSection(page, 'Channels and speed');
    await showMapSettings(page);

    const map = page.getByRole('region', { name: 'Map' });
    const progress = page.getByRole('progressbar', { name: 'Computing the map' });
    const done = page.getByTestId('map-done');
    await expect.poll(() => done.isVisible(), { timeout: 30_000 }).toBe(true);
    expect(await progress.count()).toBe(0);
    // computed in the analysis workers by PFFFT (WASM SIMD) with the WASM readout kernel, not a fallback
    expect(await done.getAttribute('data-engine')).toBe('pffft-simd+kernel');
    // the page is cross-origin isolated, so the map's mean squares sit in shared memory: the speed map,
    // the findings and the tracks read them in their workers without a copy
    expect(await page.evaluate(() => crossOriginIsolated)).toBe(true);
    expect(await done.getAttribute('data-shared')).toBe('true');
    expect(await map.getByLabel('Window').inputValue()).toBe('hann');
    expect(await map.getByLabel('Block size').inputValue()).toBe('8192');
    expect(await map.getByLabel('Overlap').inputValue()).toBe('0.75');
    expect(await map.getByLabel('Weighting').inputValue()).toBe('Z');
    expect(await map.getByLabel('Range (dB)').inputValue()).toBe('80');
    const top = Number(await map.getByLabel('Top (dB)').inputValue());
    expect(Number.isInteger(top / 5)).toBe(true);
    expect(top).toBeLessThanOrEqual(0);
    expect(top).toBeGreaterThan(-30);

    // Painted, and the brightest row climbs with the sweep where its frequency says it should.
    await expect.poll(async () => (await mapPixels(page)).painted, { timeout: 10_000 }).toBeGreaterThan(0.3);
    const px = await mapPixels(page);
    const [left, middle, right] = px.brightestRows;
    expect(left).toBeGreaterThan(middle);
    expect(middle).toBeGreaterThan(right);
    const nyquist = FS_HZ / 2;
    const rowOf = (fHz: number) => (1 - fHz / nyquist) * px.height;
    const sweepAt = (fx: number) => F0_HZ + (F1_HZ - F0_HZ) * fx;
    for (const [i, fx] of [0.15, 0.5, 0.85].entries()) {
      expect(Math.abs(px.brightestRows[i] - rowOf(sweepAt(fx)))).toBeLessThan(0.02 * px.height);
    }
    expect(await page.getByTestId('map-scale').textContent()).toMatch(/dB\s*re\s*1/);

    // The readout on the sweep at mid-time: about 3 s, about 2750 Hz, a level near the top.
    const canvas = page.getByTestId('map-canvas');
    const box = (await canvas.boundingBox())!;
    await canvas.hover({ position: { x: box.width * 0.5, y: (middle / px.height) * box.height } });
    const readout = page.getByTestId('map-readout');
    await expect.poll(() => readout.textContent()).toMatch(/\d+\.\d{3} s/);
    const text = (await readout.textContent()) ?? '';
    const m = /(\d+\.\d+) s.*?(\d+(?:\.\d+)?) Hz.*?(-?\d+\.\d) dB/.exec(text);
    expect(m, text).not.toBeNull();
    const [timeS, frequencyHz, levelDb] = [Number(m![1]), Number(m![2]), Number(m![3])];
    expect(Math.abs(timeS - DURATION_S / 2)).toBeLessThan(0.2);
    expect(Math.abs(frequencyHz - sweepAt(0.5))).toBeLessThan(250);
    expect(levelDb).toBeLessThanOrEqual(top);
    expect(levelDb).toBeGreaterThan(top - 30);

    await screenshot(page, 'bench-map');
    await map.screenshot({ path: path.join(ARTEFACTS_DIR, 'bench-map-panel.png') });

    // Another window: the map is computed again.
    await map.getByLabel('Window').selectOption('blackman-harris');
    await expect.poll(() => done.textContent(), { timeout: 30_000 }).toContain('Blackman-Harris window');
    expect(await progress.count()).toBe(0);
    await expect.poll(async () => (await mapPixels(page)).painted, { timeout: 10_000 }).toBeGreaterThan(0.3);
    const topBlackmanHarris = Number(await map.getByLabel('Top (dB)').inputValue());

    // The calibration reaches the analysis: ten units per file unit lift every level by 20 dB.
    await page.getByLabel('Factor of channel 1').fill('10');
    await expect
      .poll(async () => Number(await map.getByLabel('Top (dB)').inputValue()), { timeout: 30_000 })
      .toBe(topBlackmanHarris + 20);

    expect(errors).toEqual([]);
    await context.close();
  });

  it('computes the map on the page when no analysis worker can start', async () => {
    const context = await browser.newContext();
    const page = await context.newPage();
    const errors: string[] = [];
    page.on('pageerror', (e) => errors.push(e.message));
    let blocked = 0;
    await page.route(/analysis\.worker[^/]*\.js/, (route) => {
      blocked++;
      return route.abort();
    });
    await signIn(page, baseUrl, 'engineer@fanlight.test');
    await page.waitForURL(`${baseUrl}/projects`);
    await page.goto(`${baseUrl}/bench`);
    const [sweep] = sweepRecording();
    const bytes = wav([sweep.subarray(0, FS_HZ * 2)], { bits: 24, sampleRateHz: FS_HZ });
    await page.getByTestId('drop-zone-input').setInputFiles({ name: 'sweep-short.wav', mimeType: 'audio/wav', buffer: Buffer.from(bytes) });
    await expect.poll(() => page.getByTestId('map-done').isVisible(), { timeout: 30_000 }).toBe(true);
    expect(blocked).toBeGreaterThan(0);
    await expect.poll(async () => (await mapPixels(page)).painted, { timeout: 10_000 }).toBeGreaterThan(0.3);
    const [left, , right] = (await mapPixels(page)).brightestRows;
    expect(left).toBeGreaterThan(right);
    expect(errors).toEqual([]);
    await context.close();
  });

  it('keeps a typed speed ramp with the recording: it opens with it again from the library', async () => {
    const { context, page, errors } = await signedInPage(browser, baseUrl, 'engineer@fanlight.test', { viewport: { width: 1600, height: 1000 } });
    const [sweep] = sweepRecording();
    const name = `ramp-${Date.now()}.wav`;
    await page.getByTestId('drop-zone-input').setInputFiles({ name, mimeType: 'audio/wav', buffer: Buffer.from(wav([sweep.subarray(0, FS_HZ * 2)], { bits: 24, sampleRateHz: FS_HZ })) });
    await expect.poll(() => page.getByTestId('map-done').isVisible(), { timeout: 30_000 }).toBe(true);
    await showBenchSection(page, 'Channels and speed');
    const panel = page.getByRole('region', { name: 'Speed source' });
    await panel.getByLabel('Speed from').selectOption('ramp');
    await panel.getByLabel('Start (rpm)').fill('500');
    await panel.getByLabel('End (rpm)').fill('4500');
    await expect.poll(() => page.getByTestId('speed-summary').textContent(), { timeout: 20_000 }).toMatch(/500–4500 rpm/);
    await page.waitForTimeout(800); // the choice is kept a moment after the last edit

    await page.getByRole('button', { name: 'Close' }).click();
    await expect.poll(() => page.getByTestId('bench-empty').isVisible()).toBe(true);
    await page.reload();
    await page.getByRole('button', { name, exact: true }).click();
    await expect.poll(() => page.getByTestId('map-done').isVisible(), { timeout: 30_000 }).toBe(true);
    expect(await panel.getByLabel('Speed from').inputValue()).toBe('ramp');
    expect(await panel.getByLabel('Start (rpm)').inputValue()).toBe('500');
    expect(await panel.getByLabel('End (rpm)').inputValue()).toBe('4500');
    await expect.poll(() => page.getByTestId('speed-summary').textContent(), { timeout: 20_000 }).toMatch(/500–4500 rpm/);
    expect(errors).toEqual([]);
    await context.close();
  });
});
