/**
 * Listening on the Bench: the demo run-up plays (the AudioContext runs, the play head moves on the
 * map), the ticked carrier families are heard alone or taken out — checked on the exported sound of a
 * speed range, whose spectrum must hold the families at their synthesised level and not the machine
 * orders, or the reverse — and in the demo comparison the other run is heard at the same speed.
 *
 * The reference levels are the demo's own synthesis (seeds/demo-recordings.ts: the accelerometer's
 * fc ± fe at 0.18 / 0.16 g × (0.35 + 0.65·rpm/12000), orders 8 and 48 at 0.06 / 0.09 g × the same); the
 * band levels are Parseval sums over a Hann-windowed FFT (fft.js, an independent library), RMS² =
 * 2·Σ_band|X|² / (N·Σw²) (Harris, Proc. IEEE 66 (1978), on windowed power).
 */
import { readFileSync } from 'node:fs';
import FFT from 'fft.js';
import type { Browser, Page } from 'playwright-core';
import wavDecoder from 'wav-decoder';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { demoRecordings } from '../../seeds/demo-recordings';
import { launchBrowser, screenshot, signedInPage } from './browser';

/** The demo run-up (seeds/demo-recordings.ts): its pole pairs and its carrier above 6000 rpm. */
const POLE_PAIRS = 4;
const CARRIER_HZ = 12000;
const withSpeed = (base: number, rpm: number) => base * (0.35 + 0.65 * Math.min(1, rpm / 12000));

/** RMS of a band [f0, f1] of x (Hann window, zero-padded FFT, Parseval). */
function bandRms(x: Float32Array, fsHz: number, f0: number, f1: number): number {
  let n = 1;
  while (n < x.length) n *= 2;
  const input = new Array<number>(n).fill(0);
  let sw2 = 0;
  for (let i = 0; i < x.length; i++) {
    const w = 0.5 - 0.5 * Math.cos((2 * Math.PI * i) / (x.length - 1));
    input[i] = x[i] * w;
    sw2 += w * w;
  }
  const fft = new FFT(n);
  const out = fft.createComplexArray();
  fft.realTransform(out, input);
  let s = 0;
  for (let k = Math.ceil((f0 * n) / fsHz); k <= Math.floor((f1 * n) / fsHz); k++) s += out[2 * k] ** 2 + out[2 * k + 1] ** 2;
  return Math.sqrt((2 * s) / (n * sw2));
}

const db = (a: number, b: number) => 20 * Math.log10(a / b);

async function exportedSound(page: Page): Promise<{ x: Float32Array; fsHz: number; name: string }> {
  const download = page.waitForEvent('download', { timeout: 60_000 });
  await page.getByRole('button', { name: 'Export WAV' }).click();
  const file = await download;
  const bytes = readFileSync((await file.path())!);
  const decoded = await wavDecoder.decode(bytes.buffer.slice(bytes.byteOffset, bytes.byteOffset + bytes.byteLength) as ArrayBuffer);
  return { x: decoded.channelData[0], fsHz: decoded.sampleRate, name: file.suggestedFilename() };
}

describe('listening on the Bench (browser)', () => {
  const baseUrl = inject('baseUrl');
  let browser: Browser;
  beforeAll(async () => {
    browser = await launchBrowser();
  });
  afterAll(() => browser?.close());

  it('plays the run-up with a moving play head, hears the ticked families alone or taken out, and exports what is heard', async () => {
    const { page, context, errors } = await signedInPage(browser, baseUrl, 'engineer@fanlight.test', { viewport: { width: 1600, height: 1100 }, acceptDownloads: true });
    await page.getByRole('button', { name: `Open the demo recording ${demoRecordings[0].title}` }).click();
    const findings = page.getByTestId('finding-carrier-shift').first();
    await expect.poll(() => findings.isVisible(), { timeout: 90_000 }).toBe(true);

    // Play: the caution comes first (once per user), then the sound runs and the play head moves on the map
    await page.getByRole('button', { name: 'Play', exact: true }).click();
    await page.getByRole('button', { name: 'I understand, play' }).click();
    const position = page.getByTestId('play-position');
    await expect.poll(() => position.getAttribute('data-audio-state'), { timeout: 20_000 }).toBe('running');
    const mapBox = page.getByTestId('map-canvas').locator('..');
    await expect.poll(async () => Number(await mapBox.getAttribute('data-play-x')), { timeout: 10_000 }).toBeGreaterThan(0.2);
    const first = Number(await mapBox.getAttribute('data-play-x'));
    await expect.poll(async () => Number(await mapBox.getAttribute('data-play-x')), { timeout: 10_000 }).toBeGreaterThan(first + 0.2);
    await page.getByRole('button', { name: 'Pause' }).click();
    await expect.poll(() => position.getAttribute('data-playing')).toBe('no');

    // the first sidebands of the detected carrier, ticked
    await page.keyboard.press('c');
    await page.getByLabel('Track fc+fe', { exact: true }).first().check();
    // a speed range around 8000 rpm, the families alone
    await page.getByRole('button', { name: 'Listening options' }).click();
    await page.getByLabel('Loop', { exact: true }).selectOption('speed');
    await page.getByLabel('Loop from rpm').fill('7800');
    await page.getByLabel('Loop to rpm').fill('8200');
    await page.getByLabel('Ticked guides').selectOption('isolate');

    const rpm = 8000;
    const fe = (POLE_PAIRS * rpm) / 60;
    const sweepHz = (POLE_PAIRS * 400) / 60 / 2 + 20;
    const families = [
      { f: CARRIER_HZ - fe, rms: withSpeed(0.16, rpm) / Math.SQRT2 },
      { f: CARRIER_HZ + fe, rms: withSpeed(0.18, rpm) / Math.SQRT2 },
    ];
    const orders = [
      { f0: 7800 * (8 / 60) - 20, f1: 8200 * (8 / 60) + 20, rms: withSpeed(0.06, rpm) / Math.SQRT2 },
      { f0: 7800 * (48 / 60) - 20, f1: 8200 * (48 / 60) + 20, rms: withSpeed(0.09, rpm) / Math.SQRT2 },
    ];
    const alone = await exportedSound(page);
    expect(alone.name).toMatch(/guides-alone/);
    // 7800 → 8200 rpm takes 400 / (11500 / 30) s of the run
    expect(alone.x.length / alone.fsHz).toBeCloseTo(400 / (11500 / 30), 1);
    for (const fam of families) expect(Math.abs(db(bandRms(alone.x, alone.fsHz, fam.f - sweepHz, fam.f + sweepHz), fam.rms))).toBeLessThan(1);
    for (const o of orders) expect(db(bandRms(alone.x, alone.fsHz, o.f0, o.f1), o.rms)).toBeLessThan(-30);

    // taken out: the families go, the orders stay
    await page.getByLabel('Ticked guides').selectOption('remove');
    const without = await exportedSound(page);
    expect(without.name).toMatch(/without-guides/);
    for (const fam of families) expect(db(bandRms(without.x, without.fsHz, fam.f - sweepHz, fam.f + sweepHz), fam.rms)).toBeLessThan(-30);
    for (const o of orders) expect(Math.abs(db(bandRms(without.x, without.fsHz, o.f0, o.f1), o.rms))).toBeLessThan(1);

    // playing the loop, processed and original switch at the same place (p)
    await page.getByRole('button', { name: 'Play', exact: true }).click();
    await expect.poll(() => position.getAttribute('data-playing'), { timeout: 10_000 }).toBe('yes');
    expect(await position.getAttribute('data-hearing')).toBe('processed');
    await page.keyboard.press('p');
    await expect.poll(() => position.getAttribute('data-hearing')).toBe('original');
    const loopRpm = Number(await position.getAttribute('data-rpm'));
    expect(loopRpm).toBeGreaterThan(7700);
    expect(loopRpm).toBeLessThan(8300);
    await screenshot(page, 'bench-listen');
    await page.getByRole('button', { name: 'Pause' }).click();
    expect(errors).toEqual([]);
    await context.close();
  });

  it('in the demo comparison, hears the other run at the same speed', async () => {
    const { page, context, errors } = await signedInPage(browser, baseUrl, 'engineer@fanlight.test', { viewport: { width: 1600, height: 1100 } });
    const changed = demoRecordings.find((d) => d.comparesWith)!;
    const baseline = demoRecordings.find((d) => d.file === changed.comparesWith)!;
    await page.getByRole('button', { name: `Compare with ${baseline.title}` }).click();
    await expect.poll(() => page.getByTestId('compared-run').count(), { timeout: 60_000 }).toBe(1);
    const runChoice = page.getByLabel('Run heard');
    await expect.poll(() => runChoice.locator('option').count(), { timeout: 60_000 }).toBe(2);
    // the speed of both runs is known before they are heard
    await expect.poll(() => page.getByTestId('compare-panel').isVisible(), { timeout: 90_000 }).toBe(true);

    await page.getByLabel('Play from rpm').fill('8000');
    await page.getByRole('button', { name: 'Go' }).click();
    await page.getByRole('button', { name: 'I understand, play' }).click();
    const position = page.getByTestId('play-position');
    await expect.poll(() => position.getAttribute('data-audio-state'), { timeout: 20_000 }).toBe('running');
    await expect.poll(async () => Number(await position.getAttribute('data-rpm')), { timeout: 10_000 }).toBeGreaterThan(7990);
    const firstRun = await position.getAttribute('data-run');

    // while playing: r switches runs at the same speed
    const [before, after] = await page.evaluate(async () => {
      const el = document.querySelector('[data-testid="play-position"]')!;
      const rpm = () => Number(el.getAttribute('data-rpm'));
      const b = rpm();
      window.dispatchEvent(new KeyboardEvent('keydown', { key: 'r' }));
      await new Promise((r) => requestAnimationFrame(() => requestAnimationFrame(r)));
      return [b, rpm()];
    });
    expect(await position.getAttribute('data-run')).not.toBe(firstRun);
    expect(Math.abs(after - before) / before).toBeLessThan(0.01);

    // paused: back to the first run, at the same speed
    await page.getByRole('button', { name: 'Pause' }).click();
    await expect.poll(() => position.getAttribute('data-playing')).toBe('no');
    const paused = Number(await position.getAttribute('data-rpm'));
    await page.keyboard.press('r');
    await expect.poll(() => position.getAttribute('data-run')).toBe(firstRun);
    expect(Math.abs(Number(await position.getAttribute('data-rpm')) - paused) / paused).toBeLessThan(0.01);
    expect(errors).toEqual([]);
    await context.close();
  });
});
