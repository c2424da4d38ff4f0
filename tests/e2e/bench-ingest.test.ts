import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { testChannels, wav } from '../unit/io/wav-fixtures';
import { launchBrowser, screenshot, showBenchSection, showMapSettings, signedInPage, signIn } from './browser';

describe('the Bench takes a recording in (browser)', () => {
  const baseUrl = inject('baseUrl');
  let browser: Browser;
  beforeAll(async () => {
    browser = await launchBrowser();
  });
  afterAll(() => browser?.close());

  it('a dropped 4-channel WAV shows 4 channels and its duration, and is still in the library after a reload', async () => {
    const context = await browser.newContext();
    const page = await context.newPage();
    const errors: string[] = [];
    page.on('pageerror', (e) => errors.push(e.message));
    await signIn(page, baseUrl, 'engineer@fanlight.test');
    await page.waitForURL(`${baseUrl}/projects`);
    await page.getByRole('link', { name: 'Bench' }).click();
    await page.waitForURL(/\/bench/);

    // 12.5 s of 4 channels, 24-bit at 51.2 kHz (7.7 MB), made here like an acquisition export
    const bytes = wav(testChannels(4, 640_000, 51200), { bits: 24, sampleRateHz: 51200 });
    await page.getByTestId('drop-zone-input').setInputFiles({ name: 'bench-run-up.wav', mimeType: 'audio/wav', buffer: Buffer.from(bytes) });
    await showBenchSection(page, 'Channels and speed');
    await showBenchSection(page, 'Recordings');

    const rows = page.getByTestId('channel-list').locator('tbody tr');
    await expect.poll(() => rows.count(), { timeout: 20_000 }).toBe(4);
    expect(await page.getByTestId('recording-duration').textContent()).toContain('12.50 s');
    await page.getByLabel('Name of channel 1').fill('acc inverter housing');
    await page.getByLabel('Quantity of channel 1').selectOption('acceleration');
    await expect.poll(() => page.getByTestId('setup-save-state').textContent()).toMatch(/Setup saved/);
    await screenshot(page, 'bench-ingest');

    await page.reload();
    const entry = page.getByTestId('library-entry').filter({ hasText: 'bench-run-up.wav' });
    await expect.poll(() => entry.count(), { timeout: 20_000 }).toBe(1);
    await expect.poll(() => rows.count(), { timeout: 20_000 }).toBe(4);
    expect(await page.getByLabel('Name of channel 1').inputValue()).toBe('acc inverter housing');
    // the library's copy is a file of the Origin Private File System, whole, with no partial copy beside it
    const fingerprint = await entry.getAttribute('data-fingerprint');
    const kept = await page.evaluate(async (fp) => {
      const dir = await (await navigator.storage.getDirectory()).getDirectoryHandle('recordings');
      const names: string[] = [];
      for await (const name of (dir as unknown as { keys(): AsyncIterable<string> }).keys()) names.push(name);
      return { names, size: (await (await dir.getFileHandle(fp!)).getFile()).size };
    }, fingerprint);
    expect(kept.size).toBe(bytes.byteLength);
    expect(kept.names.filter((n) => n.endsWith('.partial'))).toEqual([]);
    expect(errors).toEqual([]);
    await context.close();
  });

  it('a wide recording decodes only the channels in use, and another when it is chosen', async () => {
    const { context, page, errors } = await signedInPage(browser, baseUrl, 'engineer@fanlight.test');
    // 12 channels, 4 s at 25.6 kHz: the map's channel (the first) is read, the eleven others are not
    const bytes = wav(testChannels(12, 102_400, 25600), { bits: 24, sampleRateHz: 25600 });
    await page.getByTestId('drop-zone-input').setInputFiles({ name: 'wide-run.wav', mimeType: 'audio/wav', buffer: Buffer.from(bytes) });
    const done = page.getByTestId('map-done');
    await expect.poll(() => done.getAttribute('data-channels-read').catch(() => null), { timeout: 20_000 }).toBe('0');
    await showMapSettings(page);
    await page.getByLabel('Map channel').selectOption({ index: 6 });
    await expect.poll(() => done.getAttribute('data-channels-read').catch(() => null), { timeout: 20_000 }).toBe('0,6');
    expect(errors).toEqual([]);
    await context.close();
  });

  it('a broken file gets one clear sentence and leaves the open recording alone', async () => {
    const context = await browser.newContext();
    const page = await context.newPage();
    await signIn(page, baseUrl, 'engineer@fanlight.test');
    await page.waitForURL(`${baseUrl}/projects`);
    await page.goto(`${baseUrl}/bench`);
    await page.getByTestId('drop-zone-input').setInputFiles({
      name: 'good.wav',
      mimeType: 'audio/wav',
      buffer: Buffer.from(wav(testChannels(2, 8000))),
    });
    await showBenchSection(page, 'Channels and speed');
    await showBenchSection(page, 'Recordings');
    await expect.poll(() => page.getByTestId('channel-list').locator('tbody tr').count(), { timeout: 20_000 }).toBe(2);
    await page.getByTestId('drop-zone-input').setInputFiles({
      name: 'cut.wav',
      mimeType: 'audio/wav',
      buffer: Buffer.from('RIFF\x24\x00\x00\x00WAVEdata\x10\x00\x00\x00'),
    });
    await expect.poll(() => page.getByText(/cut\.wav.*no fmt chunk/).first().isVisible(), { timeout: 20_000 }).toBe(true);
    expect(await page.getByTestId('recording-name').textContent()).toContain('good.wav');
    expect(await page.getByTestId('channel-list').locator('tbody tr').count()).toBe(2);
    await context.close();
  });

  it('a WAV cut short opens what it holds and says so in a visible notice', async () => {
    const context = await browser.newContext();
    const page = await context.newPage();
    await signIn(page, baseUrl, 'engineer@fanlight.test');
    await page.waitForURL(`${baseUrl}/projects`);
    await page.goto(`${baseUrl}/bench`);
    const whole = wav(testChannels(2, 48_000), { bits: 16, sampleRateHz: 48_000 });
    await page.getByTestId('drop-zone-input').setInputFiles({
      name: 'cut-short.wav',
      mimeType: 'audio/wav',
      // the header promises 48 000 frames; the file holds 20 000 of them
      buffer: Buffer.from(whole.subarray(0, 44 + 20_000 * 4)),
    });
    await showBenchSection(page, 'Channels and speed');
    await expect.poll(() => page.getByTestId('channel-list').locator('tbody tr').count(), { timeout: 20_000 }).toBe(2);
    const notice = page.getByTestId('recording-warnings');
    await expect.poll(() => notice.isVisible()).toBe(true);
    expect(await notice.textContent()).toMatch(/cut short.*20000 whole frames/);
    expect(await page.getByTestId('recording-frames').textContent()).toBe('20000');
    await context.close();
  });
});
