/**
 * A project's targets on its page: the seeded one is listed; a CSV with a bad row is refused with its
 * line and field and changes nothing; a good one adds its targets; an engineer types one in the table;
 * a viewer reads them but has nothing to change them with.
 */
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { demoProject } from '../../seeds/demo-scenario';
import { launchBrowser, screenshot, signIn } from './browser';

const dir = mkdtempSync(path.join(tmpdir(), 'fanlight-targets-'));

async function openDemoProject(browser: Browser, baseUrl: string, email: string) {
  const page = await browser.newPage({ viewport: { width: 1400, height: 1000 } });
  await signIn(page, baseUrl, email);
  await page.waitForURL(`${baseUrl}/projects`);
  await page.getByRole('link', { name: demoProject.name }).first().click();
  await expect.poll(() => page.getByTestId('project-targets').isVisible(), { timeout: 20_000 }).toBe(true);
  return page;
}

describe('project targets (browser)', () => {
  const baseUrl = inject('baseUrl');
  let browser: Browser;
  beforeAll(async () => {
    browser = await launchBrowser();
  });
  afterAll(() => browser?.close());

  it('an engineer imports targets from CSV (a bad row named by line and field first) and types one', async () => {
    const page = await openDemoProject(browser, baseUrl, 'engineer@fanlight.test');
    const rows = page.getByTestId('project-target');
    const before = await rows.count();
    expect(await page.getByTestId('project-targets').textContent()).toContain('family:1:-1');

    await page.getByRole('button', { name: 'Import CSV' }).click();
    const bad = path.join(dir, 'bad.csv');
    writeFileSync(bad, 'track,rpm,db\norder:48,1000,-40\norder:48,fast,-35\n');
    await page.getByLabel('Targets CSV file').setInputFiles(bad);
    await page.getByRole('button', { name: 'Import', exact: true }).click();
    const problems = page.getByTestId('target-import-problems');
    await expect.poll(() => problems.isVisible()).toBe(true);
    expect(await problems.textContent()).toContain('line 3: rpm');
    expect(await rows.count()).toBe(before);

    const good = path.join(dir, 'good.csv');
    writeFileSync(good, 'track,rpm,db\norder:48,1000,-40\norder:48,12000,-30\noverall,1000,-5\noverall,12000,5\n');
    await page.getByLabel('Targets CSV file').setInputFiles(good);
    await page.getByRole('button', { name: 'Import', exact: true }).click();
    await expect.poll(() => rows.count(), { timeout: 10_000 }).toBe(before + 2);

    await page.getByRole('button', { name: 'Type a target' }).click();
    await page.getByLabel('Target track').fill('order:8');
    await page.getByLabel('Speed of point 1').fill('1000');
    await page.getByLabel('Level of point 1').fill('-30');
    await page.getByLabel('Speed of point 2').fill('9000');
    await page.getByLabel('Level of point 2').fill('-20');
    await page.getByRole('button', { name: 'Save target' }).click();
    await expect.poll(() => rows.count(), { timeout: 10_000 }).toBe(before + 3);
    expect(await page.getByTestId('project-targets').textContent()).toContain('order:8');
    await screenshot(page, 'project-targets');
    await page.close();
  });

  it('a viewer reads the targets but cannot change them', async () => {
    const page = await openDemoProject(browser, baseUrl, 'viewer@fanlight.test');
    expect(await page.getByTestId('project-target').count()).toBeGreaterThan(0);
    expect(await page.getByRole('button', { name: 'Import CSV' }).count()).toBe(0);
    expect(await page.getByRole('button', { name: /^Remove the target/ }).count()).toBe(0);
    await page.close();
  });
});
