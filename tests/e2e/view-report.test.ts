/**
 * The PDF report of the demo view, made in the browser: poppler's pdftoppm renders every page (so the file
 * is a PDF others can open) and pdftotext finds the title, the findings, the marks and a reply in its text.
 */
import { execFileSync } from 'node:child_process';
import { mkdirSync, readdirSync, rmSync } from 'node:fs';
import path from 'node:path';
import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { DEMO_VIEW_TITLE, demoMarks, demoThread } from '../../seeds/demo-view';
import { demoProject } from '../../seeds/demo-scenario';
import { ARTEFACTS_DIR, launchBrowser, signIn } from './browser';

const squash = (s: string) => s.replace(/\s+/g, ' ');

describe('the report of a view (browser)', () => {
  const baseUrl = inject('baseUrl');
  let browser: Browser;
  beforeAll(async () => {
    browser = await launchBrowser();
  });
  afterAll(() => browser?.close());

  it('a viewer downloads the demo view as a PDF of one to three A4 pages with its title, findings, marks and replies', async () => {
    const page = await browser.newPage({ viewport: { width: 1600, height: 1000 }, acceptDownloads: true });
    await signIn(page, baseUrl, 'viewer@fanlight.test');
    await page.waitForURL(`${baseUrl}/projects`);
    await page.getByRole('link', { name: demoProject.name }).click();
    await page.getByRole('link', { name: DEMO_VIEW_TITLE }).first().click();
    const button = page.getByRole('button', { name: 'Report (PDF)' });
    await expect.poll(() => button.isEnabled(), { timeout: 20_000 }).toBe(true);
    const [download] = await Promise.all([page.waitForEvent('download'), button.click()]);
    const dir = path.join(ARTEFACTS_DIR, 'report');
    rmSync(dir, { recursive: true, force: true });
    mkdirSync(dir, { recursive: true });
    const pdf = path.join(dir, 'demo-view.pdf');
    await download.saveAs(pdf);
    await page.close();

    execFileSync('pdftoppm', ['-r', '60', '-png', pdf, path.join(dir, 'page')]);
    const pages = readdirSync(dir).filter((f) => f.startsWith('page') && f.endsWith('.png'));
    expect(pages.length).toBeGreaterThanOrEqual(1);
    expect(pages.length).toBeLessThanOrEqual(3);
    const info = execFileSync('pdfinfo', [pdf], { encoding: 'utf8' });
    expect(info).toMatch(/Page size:\s+595\.28 x 841\.89 pts \(A4\)/);
    const text = squash(execFileSync('pdftotext', ['-layout', pdf, '-'], { encoding: 'utf8' }));
    expect(text).toContain(squash(DEMO_VIEW_TITLE));
    expect(text).toContain(demoProject.name);
    expect(text).toMatch(/Carrier 8000 Hz -> 12000 Hz at 6000 rpm/);
    for (const m of demoMarks) expect(text).toContain(squash(m.text).slice(0, 40));
    expect(text).toContain(squash(demoThread[1].body).slice(0, 40));
  }, 60_000);
});
