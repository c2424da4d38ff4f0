/**
 * The Bench as a workbench: a synthetic run-up whose answers are known by construction (invented
 * levels: 12 s, 1000 → 9000 rpm, 4 pole pairs, carrier 8 kHz stepping to 10 kHz at 5000 rpm,
 * families (1, ±1) and (2, 0), orders 8 and 48, and a 60-pulse tacho), opened, with its speed from the
 * tacho, guides drawn, the readout, the carrier shift found and followed, and the exports.
 */
import { readFileSync } from 'node:fs';
import path from 'node:path';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { ARTEFACTS_DIR, launchBrowser, screenshot, showBenchSection, signedInPage } from './browser';
import { FS_HZ, runUpTimeline, runUpWav } from './run-up';

const DURATION_S = 12;
const { rpmAt, shiftS: SHIFT_S } = runUpTimeline(DURATION_S);
const runUp = () =>
  runUpWav(
    DURATION_S,
    [
      { m: 1, n: 1, amplitude: 0.02 },
      { m: 1, n: -1, amplitude: 0.02 },
      { m: 2, n: 0, amplitude: 0.01 },
    ],
    7,
  );


/** Share of painted (opaque) pixels, and how many distinct colours, of a canvas. */
function canvasPixels(page: Page, testId: string): Promise<{ width: number; height: number; opaque: number; strong: number; colours: number }> {
  return page.evaluate((id) => {
    const canvas = document.querySelector<HTMLCanvasElement>(`[data-testid="${id}"]`)!;
    const { width, height } = canvas;
    const d = canvas.getContext('2d')!.getImageData(0, 0, width, height).data;
    let opaque = 0;
    let strong = 0;
    const colours = new Set<number>();
    for (let i = 0; i < d.length; i += 4) {
      if (d[i + 3] === 255) opaque++;
      if (d[i + 3] > 128) strong++;
      if (i % 64 === 0) colours.add((d[i] << 16) | (d[i + 1] << 8) | d[i + 2]);
    }
    return { width, height, opaque: opaque / (width * height), strong, colours: colours.size };
  }, testId);
}

async function viewRange(page: Page): Promise<[number, number]> {
  const el = page.getByTestId('map-view-range');
  return [Number(await el.getAttribute('data-x0')), Number(await el.getAttribute('data-x1'))];
}

async function download(page: Page, testId: string) {
  const [d] = await Promise.all([page.waitForEvent('download'), page.getByTestId(testId).click()]);
  const file = await d.path();
  return { name: d.suggestedFilename(), bytes: readFileSync(file) };
}

describe('the Bench as a workbench (browser)', () => {
  const baseUrl = inject('baseUrl');
  let browser: Browser;
  beforeAll(async () => {
    browser = await launchBrowser();
  });
  afterAll(() => browser?.close());

  it('opens a run-up, takes the speed from the tacho, draws guides, reads them, finds the carrier shift and exports', { timeout: 150_000 }, async () => {
    const { context, page, errors } = await signedInPage(browser, baseUrl, 'engineer@fanlight.test', { viewport: { width: 1680, height: 1050 }, acceptDownloads: true });

    await page.getByTestId('drop-zone-input').setInputFiles({ name: 'drive-run-up.wav', mimeType: 'audio/wav', buffer: Buffer.from(runUp()) });
    await showBenchSection(page, 'Channels and speed');
    await expect.poll(() => page.getByTestId('channel-list').locator('tbody tr').count(), { timeout: 20_000 }).toBe(2);
    await page.getByLabel('Quantity of channel 1').selectOption('acceleration');
    await page.getByLabel('Quantity of channel 2').selectOption('tacho');

    // The map has painted: most pixels opaque, and many colours (a map, not a flat fill).
    await expect.poll(() => page.getByTestId('map-done').isVisible(), { timeout: 30_000 }).toBe(true);
    await expect.poll(async () => (await canvasPixels(page, 'map-canvas')).opaque, { timeout: 10_000 }).toBeGreaterThan(0.9);
    // (polled: the tacho channel read after the quantity is chosen may still be repainting the map)
    await expect.poll(async () => (await canvasPixels(page, 'map-canvas')).colours, { timeout: 10_000 }).toBeGreaterThan(30);

    // The speed from the tacho channel, found by default at 60 pulses per revolution.
    const speed = page.getByTestId('speed-summary');
    await expect.poll(() => speed.textContent(), { timeout: 20_000 }).toMatch(/Speed \d+–\d+ rpm/);
    const [, lo, hi] = /Speed (\d+)–(\d+) rpm/.exec((await speed.textContent()) ?? '')!;
    expect(Math.abs(Number(lo) - 1000)).toBeLessThan(60);
    expect(Math.abs(Number(hi) - 9000)).toBeLessThan(60);

    // The findings with the speed: pole pairs inferred from the sideband spacing. This run's one pair,
    // fc ± fe, fits p = 4 (force pattern) or p = 2 (voltage pattern); the channel is an accelerometer,
    // whose sidebands follow the force, so 4, with a note saying the channel chose it. Then typed.
    const poles = page.getByTestId('finding-pole-pairs');
    await expect.poll(() => poles.textContent(), { timeout: 40_000 }).toMatch(/Pole pairs\s*4\s*\(inferred\)/);
    expect(await page.getByTestId('pole-pairs-settled').textContent()).toContain("the channel's quantity chose this one");
    const speedPanel = page.getByRole('region', { name: 'Speed source' });
    await speedPanel.getByLabel('Pole pairs').selectOption('typed');
    await speedPanel.getByLabel('p', { exact: true }).fill('4');
    await expect.poll(() => poles.textContent(), { timeout: 40_000 }).toMatch(/Pole pairs\s*4\s*\(typed\)/);

    // A typed carrier centre: its guides appear on the overlay and in the guides panel.
    const guides = page.getByRole('region', { name: 'Guides' });
    const before = (await canvasPixels(page, 'map-guides')).strong;
    await guides.getByLabel('Carrier centre (Hz)').fill('8000');
    await guides.getByRole('button', { name: 'Add carrier guide' }).click();
    await expect.poll(async () => (await canvasPixels(page, 'map-guides')).strong, { timeout: 10_000 }).toBeGreaterThan(before + 500);
    const card = guides.getByTestId('carrier-guide');
    expect(await card.textContent()).toContain('Carrier 8000 Hz');
    await expect.poll(() => card.getByTestId('guide-family').count()).toBeGreaterThan(3);
    await card.getByRole('button', { name: 'Add family' }).click(); // m 1, n ±1
    await expect.poll(() => card.getByLabel('Track fc+fe').count()).toBe(1);
    await card.getByLabel('Track fc+fe').check();

    // A centre picked on the map snaps to the line nearest the click: 2fc at 1.5 s (16 000 Hz; this
    // run has no line at fc itself, only fc ± fe), clicked a little above it.
    {
      const canvas = page.getByTestId('map-canvas');
      const box = (await canvas.boundingBox())!;
      const [x0, x1] = await viewRange(page);
      await guides.getByRole('button', { name: 'Pick on map' }).click();
      await canvas.click({ position: { x: ((1.5 - x0) / (x1 - x0)) * box.width, y: (1 - 16080 / (FS_HZ / 2)) * box.height } });
      await expect.poll(() => card.count()).toBe(2);
      const picked = card.nth(1);
      const title = (await picked.locator('p').first().textContent()) ?? '';
      const [, hz] = /Carrier (\d+) Hz/.exec(title) ?? [];
      expect(Math.abs(Number(hz) - 16000), title).toBeLessThanOrEqual(FS_HZ / 8192);
      await picked.getByRole('button', { name: `Remove ${title}`, exact: true }).click();
      await expect.poll(() => card.count()).toBe(1);
    }

    // Orders 8 and 48, tracked.
    for (const k of ['8', '48']) {
      await guides.getByLabel('Order k').fill(k);
      await guides.getByRole('button', { name: 'Add order' }).click();
    }
    await expect.poll(() => guides.getByTestId('guide-order').count()).toBe(2);

    // The readout on fc + fe at 3 s (3000 rpm: 8000 + 4 × 50 = 8200 Hz).
    const canvas = page.getByTestId('map-canvas');
    const box = (await canvas.boundingBox())!;
    const [x0, x1] = await viewRange(page);
    const nyquist = FS_HZ / 2;
    await canvas.hover({ position: { x: ((3 - x0) / (x1 - x0)) * box.width, y: (1 - 8200 / nyquist) * box.height } });
    const readout = page.getByTestId('map-readout');
    await expect.poll(() => readout.textContent()).toMatch(/\d+\.\d{3} s/);
    const text = (await readout.textContent()) ?? '';
    const m = /(\d+\.\d{3}) s.*?(\d+) rpm.*?(\d+(?:\.\d+)?) Hz.*?(-?\d+\.\d) dB.*?nearest\s*(\S+) \(([^)]+)\) Δ ([+−])([\d.]+) Hz/.exec(text);
    expect(m, text).not.toBeNull();
    expect(Math.abs(Number(m![1]) - 3)).toBeLessThan(0.2);
    expect(Math.abs(Number(m![2]) - rpmAt(3))).toBeLessThan(150);
    expect(Math.abs(Number(m![3]) - 8200)).toBeLessThan(60);
    expect(m![5]).toBe('fc+fe');
    expect(m![6]).toBe('m 1, n +1');
    expect(Number(m![8])).toBeLessThan(60);

    // The carrier shift is found; clicking it brings the view to it.
    const shift = page.getByTestId('finding-carrier-shift');
    await expect.poll(() => shift.count()).toBeGreaterThan(0);
    expect(await shift.first().textContent()).toMatch(/8\s?000 → 10\s?000 Hz/);
    expect(await page.getByTestId('finding-carrier').textContent()).toMatch(/Carrier 8\s?000 Hz, then 10\s?000 Hz/);
    const [a0, a1] = await viewRange(page);
    await shift.first().click();
    await expect.poll(async () => (await viewRange(page)).join(',')).not.toBe([a0, a1].join(','));
    const [b0, b1] = await viewRange(page);
    expect(b1 - b0).toBeLessThan((a1 - a0) / 2);
    expect(b0).toBeLessThan(SHIFT_S);
    expect(b1).toBeGreaterThan(SHIFT_S);

    // PNG of the map: a real PNG of the composed size.
    const png = await download(page, 'export-map-png');
    expect(png.name).toBe('drive-run-up-map.png');
    expect([...png.bytes.subarray(0, 8)]).toEqual([137, 80, 78, 71, 13, 10, 26, 10]);
    expect(png.bytes.subarray(12, 16).toString('ascii')).toBe('IHDR');
    const size = await page.getByTestId('export-map-png').getAttribute('data-export-size');
    expect(`${png.bytes.readUInt32BE(16)}x${png.bytes.readUInt32BE(20)}`).toBe(size);
    const mapSize = await canvas.evaluate((c: HTMLCanvasElement) => [c.width, c.height]);
    expect(png.bytes.readUInt32BE(16)).toBeGreaterThan(mapSize[0]);
    expect(png.bytes.readUInt32BE(20)).toBeGreaterThan(mapSize[1]);

    // Tracks as CSV, with units in the header.
    await page.getByRole('button', { name: 'Reset view' }).click();
    await expect.poll(() => page.getByTestId('tracks-legend').textContent(), { timeout: 20_000 }).toContain('48·fr');
    const tracks = await download(page, 'export-tracks-csv');
    expect(tracks.name).toBe('drive-run-up-tracks.csv');
    const lines = tracks.bytes.toString('utf8').replace(/^\uFEFF/, '').trim().split(/\r\n/);
    const header = lines[0].split(',');
    expect(header.slice(0, 2)).toEqual(['time (s)', 'speed (rpm)']);
    for (const col of ['fc+fe level (dB re 1 µm/s²)', 'fc+fe crossing', '8·fr level (dB re 1 µm/s²)', '8·fr crossing', '48·fr level (dB re 1 µm/s²)', '48·fr crossing']) {
      expect(header).toContain(col);
    }
    expect(lines.length).toBeGreaterThan(100);
    const row = lines[Math.floor(lines.length / 2)].split(',');
    expect(Number.isFinite(Number(row[0]))).toBe(true);
    expect(Math.abs(Number(row[1]) - rpmAt(Number(row[0])))).toBeLessThan(100);
    // order 8 at its level: 0.05 peak → 0.0354 RMS → 91.0 dB re 1 µm/s² (the file holds it at full scale 1)
    const k8 = Number(row[header.indexOf('8·fr level (dB re 1 µm/s²)')]);
    expect(Math.abs(k8 - 20 * Math.log10(0.05 / Math.SQRT2 / 1e-6))).toBeLessThan(1.5);

    const bands = await download(page, 'export-bands-csv');
    expect(bands.bytes.toString('utf8').replace(/^\uFEFF/, '').split(/\r\n/)[0]).toBe('nominal frequency (Hz),centre frequency (Hz),level (dB re 1 µm/s²)');
    await screenshot(page, 'bench-workbench');
    await page.getByRole('region', { name: 'Map' }).screenshot({ path: path.join(ARTEFACTS_DIR, 'bench-workbench-map.png') });

    // Against speed: the run-up map, painted; keys swap the axes and show the list of shortcuts.
    await page.getByRole('group', { name: 'Against' }).getByRole('button', { name: 'Speed' }).click();
    await expect.poll(() => page.getByTestId('map-view-range').textContent(), { timeout: 20_000 }).toMatch(/rpm/);
    await expect.poll(async () => (await canvasPixels(page, 'map-canvas')).opaque, { timeout: 10_000 }).toBeGreaterThan(0.9);
    await page.locator('body').click({ position: { x: 5, y: 5 } });
    await page.keyboard.press('s');
    await expect.poll(() => page.getByTestId('map-frequency-axis').textContent()).toMatch(/Frequency/);
    expect(await page.getByRole('button', { name: 'Swap axes' }).getAttribute('aria-pressed')).toBe('true');
    await page.keyboard.press('?');
    const dialog = page.getByRole('dialog', { name: 'Keyboard shortcuts' });
    await expect.poll(() => dialog.isVisible()).toBe(true);
    await screenshot(page, 'bench-workbench-shortcuts');
    await page.keyboard.press('Escape');
    await expect.poll(() => dialog.count()).toBe(0);
    await screenshot(page, 'bench-workbench-speed');

    expect(errors).toEqual([]);
    await context.close();
  });
});
