import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { wav } from '../unit/io/wav-fixtures';
import { launchBrowser, screenshot, showMapSettings, signedInPage } from './browser';

const FS_HZ = 51200;
const DURATION_S = 60;

/** A slow sweep 8000 → 17 600 Hz over a minute, amplitude 0.5: at 30 s it is at 12.8 kHz, the map's middle. */
function sweep(): Float32Array {
  const n = FS_HZ * DURATION_S;
  const rate = (17_600 - 8000) / DURATION_S;
  const x = new Float32Array(n);
  for (let i = 0; i < n; i++) {
    const t = i / FS_HZ;
    x[i] = 0.5 * Math.sin(2 * Math.PI * (8000 * t + (rate * t * t) / 2));
  }
  return x;
}

describe('a long map zoomed in (browser)', () => {
  const baseUrl = inject('baseUrl');
  let browser: Browser;
  beforeAll(async () => {
    browser = await launchBrowser();
  });
  afterAll(() => browser?.close());

  it('draws the part in view one pixel per column once zoomed in, and the pooled map again zoomed out', async () => {
    const { context, page, errors } = await signedInPage(browser, baseUrl, 'engineer@fanlight.test', { viewport: { width: 1440, height: 1000 } });
    await page.getByTestId('drop-zone-input').setInputFiles({ name: 'long-sweep.wav', mimeType: 'audio/wav', buffer: Buffer.from(wav([sweep()], { sampleRateHz: FS_HZ })) });
    const done = page.getByTestId('map-done');
    await expect.poll(() => done.isVisible(), { timeout: 30_000 }).toBe(true);
    // block 1024 at 75 % overlap: 11 997 spectra, more than the 4096 columns of the map's image
    await showMapSettings(page);
    await page.getByRole('region', { name: 'Map' }).getByLabel('Block size').selectOption('1024');
    await expect.poll(() => done.textContent(), { timeout: 30_000 }).toMatch(/11997 spectra of 0\.020 s/);

    const canvas = page.getByTestId('map-canvas');
    const box = canvas.locator('..');
    expect(await box.getAttribute('data-detail')).toBe('');
    const at = (await canvas.boundingBox())!;
    await page.mouse.move(at.x + at.width / 2, at.y + at.height / 2);
    // the + button zooms along time about the middle
    for (let i = 0; i < 3; i++) await page.getByRole('button', { name: 'Zoom in', exact: true }).click();
    await expect.poll(() => box.getAttribute('data-detail'), { timeout: 10_000 }).toMatch(/^\d+-\d+$/);
    const [a, b] = (await box.getAttribute('data-detail'))!.split('-').map(Number);
    // the part around the middle of the run, at most the image's width
    expect(b - a).toBeLessThanOrEqual(4096);
    expect(a).toBeLessThan(11997 / 2);
    expect(b).toBeGreaterThan(11997 / 2);
    // painted where it belongs: zoomed about the middle (30 s, 12.8 kHz), the sweep crosses the middle
    // column at mid-height; most of the canvas is opaque
    const seen = await canvas.evaluate((c: HTMLCanvasElement) => {
      const img = c.getContext('2d')!.getImageData(0, 0, c.width, c.height);
      const d = img.data;
      let n = 0;
      for (let i = 3; i < d.length; i += 4) if (d[i] > 0) n++;
      const x = Math.floor(c.width / 2);
      let best = -1;
      let at = -1;
      for (let y = 0; y < c.height; y++) {
        const q = (y * c.width + x) * 4;
        const lum = d[q] + d[q + 1] + d[q + 2];
        if (lum > best) {
          best = lum;
          at = y;
        }
      }
      return { painted: n / (c.width * c.height), brightestAt: at / c.height };
    });
    expect(seen.painted).toBeGreaterThan(0.9);
    expect(Math.abs(seen.brightestAt - 0.5)).toBeLessThan(0.03);
    await screenshot(page, 'bench-map-detail');

    await canvas.dblclick();
    await expect.poll(() => box.getAttribute('data-detail'), { timeout: 10_000 }).toBe('');
    expect(errors).toEqual([]);
    await context.close();
  });
});
