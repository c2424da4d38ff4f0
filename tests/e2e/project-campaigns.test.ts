/**
 * A test campaign end to end: an engineer makes a personal API token in Settings (its secret shown once),
 * a script (this test, with fetch) creates a campaign with it and posts each file's result (one failed,
 * one posted twice), the project's Campaigns section shows the progress, the results table sorts and
 * filters through the API, Trends plots one point per analysed run and flags the run whose families
 * were made 20 dB louder (Hampel identifier within its build: median ± 3·1.4826·MAD), a click on that point shows its
 * row, and once the token is revoked a post with it answers 401.
 *
 * The inverter objects are `analyze inverter` output of a demo run-up (tests/fixtures/campaigns/
 * run-up-inverter.json) with the strongest families' RMS scaled per run: ×10 in amplitude is
 * +20·log10(10) = +20 dB (definition of a level of a root-power quantity, ISO 80000-3).
 */
import { readFileSync } from 'node:fs';
import path from 'node:path';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { demoProject } from '../../seeds/demo-scenario';
import { launchBrowser, screenshot, signedInPage } from './browser';

const runUp = JSON.parse(readFileSync(path.join(__dirname, '../fixtures/campaigns/run-up-inverter.json'), 'utf8')) as Record<string, unknown> & {
  strongestFamilies: { m: number; n: number; peakRms: number; peakRpm: number }[];
};

/** Runs of three builds; run-06's families are ten times (20 dB) stronger than its build mates' (run-05, run-08). */
const runs = [
  { file: 'B1/run-01.wav', build: 'B1', ambientC: '25', scale: 1.0 },
  { file: 'B1/run-02.wav', build: 'B1', ambientC: '40', scale: 1.05 },
  { file: 'B2/run-03.wav', build: 'B2', ambientC: '25', scale: 0.95 },
  { file: 'B2/run-04.wav', build: 'B2', ambientC: '40', scale: 1.1 },
  { file: 'B10/run-05.wav', build: 'B10', ambientC: '25', scale: 0.9 },
  { file: 'B10/run-06.wav', build: 'B10', ambientC: '40', scale: 10 },
  { file: 'B10/run-08.wav', build: 'B10', ambientC: '40', scale: 1.02 },
];
const broken = { file: 'B10/run-07.wav', build: 'B10', ambientC: '60' };
const LOUD = 'B10/run-06.wav';

const scaledInverter = (scale: number) => ({ ...runUp, strongestFamilies: runUp.strongestFamilies.map((f) => ({ ...f, peakRms: f.peakRms * scale })) });

describe('project campaigns (browser)', () => {
  const baseUrl = inject('baseUrl');
  let browser: Browser;
  beforeAll(async () => {
    browser = await launchBrowser();
  });
  afterAll(() => browser?.close());

  const bearer = (secret: string, method: string, url: string, body?: unknown) =>
    fetch(`${baseUrl}/api${url}`, {
      method,
      headers: { Authorization: `Bearer ${secret}`, 'Content-Type': 'application/json', Accept: 'application/json' },
      body: body === undefined ? undefined : JSON.stringify(body),
    });

  async function makeToken(page: Page, name: string): Promise<string> {
    await page.goto(`${baseUrl}/settings`);
    const section = page.getByRole('region', { name: 'API tokens' });
    await section.getByLabel('Token name').fill(name);
    await section.getByLabel('Project', { exact: true }).selectOption({ label: demoProject.name });
    await section.getByLabel('Role', { exact: true }).selectOption('engineer');
    await section.getByLabel('Expires after (days)').fill('7');
    await section.getByRole('button', { name: 'Make token' }).click();
    const shown = page.getByTestId('token-secret');
    await expect.poll(() => shown.isVisible(), { timeout: 10_000 }).toBe(true);
    expect(await shown.textContent()).toContain('it will not be shown again');
    const secret = (await page.getByTestId('token-secret-value').textContent()) ?? '';
    expect(secret).toMatch(/^flt_[A-Za-z0-9_-]{43}$/);
    return secret;
  }

  it('an engineer makes a token, a script fills a campaign with it, and the project shows progress, table and trends; a revoked token is refused', async () => {
    const { context, page, errors } = await signedInPage(browser, baseUrl, 'engineer@fanlight.test', { path: '/projects', viewport: { width: 1500, height: 1100 } });
    await page.getByRole('link', { name: demoProject.name }).first().click();
    await page.waitForURL(/\/projects\/\d+$/);
    const projectId = Number(new URL(page.url()).pathname.split('/').pop());

    const tokenName = `rig PC ${Date.now()}`;
    const secret = await makeToken(page, tokenName);
    // shown once: after a reload the list has the token, and the secret is nowhere on the page
    await page.reload();
    const row = page.getByTestId('api-token').filter({ hasText: tokenName });
    await expect.poll(() => row.count(), { timeout: 10_000 }).toBe(1);
    expect(await row.textContent()).toContain(demoProject.name);
    expect(await row.textContent()).toContain('active');
    expect(await page.content()).not.toContain(secret);

    const campaignName = `Firmware sweep ${Date.now()}`;
    const tags = Object.fromEntries([...runs, broken].map((r) => [r.file, { build: r.build, ambientC: r.ambientC }]));
    const created = await bearer(secret, 'POST', `/projects/${projectId}/campaigns`, { name: campaignName, preset: { channel: 0, tacho: 1, ppr: 60, polePairs: 4 }, total: 8, tags });
    expect(created.status).toBe(201);
    const campaignId = ((await created.json()) as { campaign: { id: number } }).campaign.id;
    const resultsUrl = `/projects/${projectId}/campaigns/${campaignId}/results`;
    for (const r of runs) expect((await bearer(secret, 'POST', resultsUrl, { file: r.file, ok: true, inverter: scaledInverter(r.scale) })).status).toBe(201);
    expect((await bearer(secret, 'POST', resultsUrl, { file: broken.file, ok: false, error: 'run-07.wav: the tacho channel 1 has no pulses.' })).status).toBe(201);
    // a repeated post stores nothing new
    expect((await bearer(secret, 'POST', resultsUrl, { file: runs[0].file, ok: true, inverter: scaledInverter(3) })).status).toBe(200);

    // the project's Campaigns section: 8 of 8 done, 1 failed
    await page.goto(`${baseUrl}/projects/${projectId}`);
    const listed = page.getByTestId('project-campaign').filter({ hasText: campaignName });
    await expect.poll(() => listed.count(), { timeout: 15_000 }).toBe(1);
    const progress = (await listed.getByTestId('campaign-progress').textContent()) ?? '';
    expect(progress).toContain('8 / 8 done');
    expect(progress).toContain('1 failed');
    expect(await listed.textContent()).toContain('Tomas Irvine');
    await listed.getByRole('link', { name: campaignName }).click();
    await page.waitForURL(`${baseUrl}/projects/${projectId}/campaigns/${campaignId}`);

    // the table: every file, one column per tag, sorted and filtered by the API
    const rows = page.getByTestId('campaign-result');
    await expect.poll(() => rows.count(), { timeout: 15_000 }).toBe(8);
    const head = (await page.getByTestId('campaign-results').locator('thead').textContent()) ?? '';
    expect(head).toContain('build');
    expect(head).toContain('ambientC');
    expect(await page.getByTestId('campaign-preset').textContent()).toContain('"polePairs": 4');
    const firstFile = () => rows.first().locator('td').first().textContent();
    expect(await firstFile()).toBe('B1/run-01.wav');
    await page.getByRole('button', { name: 'File', exact: true }).click(); // descending now
    await expect.poll(firstFile, { timeout: 10_000 }).toBe('B2/run-04.wav');
    await page.getByRole('button', { name: 'Strongest families' }).click(); // loudest first
    await expect.poll(firstFile, { timeout: 10_000 }).toBe(LOUD);
    expect(await rows.first().textContent()).toContain('8000 → 12000 Hz');
    await page.getByRole('button', { name: 'Result', exact: true }).click(); // failed first
    await expect.poll(firstFile, { timeout: 10_000 }).toBe(broken.file);
    expect(await rows.first().textContent()).toContain('no pulses');
    await page.getByLabel('Filter the results by file name, error or tag').fill('run-03');
    await expect.poll(() => rows.count(), { timeout: 10_000 }).toBe(1);
    expect(await firstFile()).toBe('B2/run-03.wav');
    expect(await page.getByTestId('campaign-results-range').textContent()).toContain('1–1 of 1');
    await page.getByLabel('Filter the results by file name, error or tag').fill('');
    await expect.poll(() => rows.count(), { timeout: 10_000 }).toBe(8);

    // Trends: the seven analysed runs against build (B1, B2, B10 in natural order); run-06 flagged against its build mates
    const trendsSummary = page.getByTestId('trends-summary');
    await expect.poll(() => trendsSummary.isVisible(), { timeout: 15_000 }).toBe(true);
    await page.getByLabel('Tag on the x axis').selectOption('build');
    expect(await trendsSummary.textContent()).toContain('7 recordings plotted, 1 flagged');
    expect(await page.getByRole('list', { name: 'Flagged recordings' }).textContent()).toContain('run-06.wav');
    await page.getByLabel('Baseline run').selectOption({ label: 'run-01.wav' });

    // click the flagged point on the canvas: the one spot painted in the theme's danger colour
    await page.getByTestId('campaign-trends-plot').scrollIntoViewIfNeeded();
    const spot = await page.evaluate(() => {
      const canvas = document.querySelector<HTMLCanvasElement>('[data-testid="campaign-trends-plot"] canvas');
      if (!canvas) return null;
      const danger = getComputedStyle(document.documentElement).getPropertyValue('--c-danger').trim();
      const target = parseInt(danger.slice(1), 16);
      const d = canvas.getContext('2d')!.getImageData(0, 0, canvas.width, canvas.height).data;
      let sx = 0;
      let sy = 0;
      let n = 0;
      for (let i = 0; i < d.length; i += 4) {
        if (((d[i] << 16) | (d[i + 1] << 8) | d[i + 2]) !== target) continue;
        const p = i / 4;
        sx += p % canvas.width;
        sy += Math.floor(p / canvas.width);
        n++;
      }
      if (!n) return null;
      const rect = canvas.getBoundingClientRect();
      return { x: rect.left + (sx / n) * (rect.width / canvas.width), y: rect.top + (sy / n) * (rect.height / canvas.height) };
    });
    expect(spot).not.toBeNull();
    await page.mouse.click(spot!.x, spot!.y);
    const card = page.getByTestId('trend-point');
    await expect.poll(() => card.isVisible(), { timeout: 5_000 }).toBe(true);
    expect(await card.textContent()).toContain(LOUD);
    expect(await card.textContent()).toContain('build B10');
    // neither file is in this fresh browser's library: the page says what to add instead of a dead link
    expect(await page.getByTestId('trend-point-compare').textContent()).toContain('add run-06.wav and run-01.wav to this browser’s library');
    await screenshot(page, 'project-campaign');

    // a campaign with no result yet says how to run one from the command line
    const empty = await bearer(secret, 'POST', `/projects/${projectId}/campaigns`, { name: `${campaignName} (empty)`, preset: { channel: 0 } });
    expect(empty.status).toBe(201);
    await page.goto(`${baseUrl}/projects/${projectId}/campaigns/${((await empty.json()) as { campaign: { id: number } }).campaign.id}`);
    const hint = page.getByTestId('campaign-cli-hint');
    await expect.poll(() => hint.isVisible(), { timeout: 10_000 }).toBe(true);
    expect(await hint.textContent()).toContain(`npm run -s analyze -- campaign DIR --preset PRESET.json --name "NAME" --project ${projectId}`);

    // revoke in Settings (after a confirmation); the same secret is refused from then on
    await page.goto(`${baseUrl}/settings`);
    await page.getByRole('button', { name: `Revoke the token ${tokenName}` }).click();
    await page.getByRole('dialog').getByRole('button', { name: 'Revoke token' }).click();
    await expect.poll(async () => (await row.textContent()) ?? '', { timeout: 10_000 }).toContain('revoked');
    const refused = await bearer(secret, 'POST', resultsUrl, { file: 'B1/run-09.wav', ok: true, inverter: scaledInverter(1) });
    expect(refused.status).toBe(401);
    expect(((await refused.json()) as { error: { code: string } }).error.code).toBe('TOKEN_INVALID');

    expect(errors).toEqual([]);
    await context.close();
  });

  it('a viewer may give a token no role above viewer', async () => {
    const { context, page, errors } = await signedInPage(browser, baseUrl, 'viewer@fanlight.test', { path: '/settings' });
    const section = page.getByRole('region', { name: 'API tokens' });
    await section.getByLabel('Project', { exact: true }).selectOption({ label: demoProject.name });
    await expect.poll(() => section.getByLabel('Role', { exact: true }).locator('option').allTextContents(), { timeout: 10_000 }).toEqual(['viewer']);
    expect(errors).toEqual([]);
    await context.close();
  });
});
