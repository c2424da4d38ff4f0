import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { demoProject } from '../../seeds/demo-scenario';
import { launchBrowser, screenshot, signIn } from './browser';

describe('sign in (browser)', () => {
  const baseUrl = inject('baseUrl');
  let browser: Browser;
  beforeAll(async () => {
    browser = await launchBrowser();
  });
  afterAll(() => browser?.close());

  it('the demo engineer signs in and sees the Projects page with the demo project', async () => {
    const page = await browser.newPage();
    const external: string[] = [];
    page.on('request', (r) => {
      if (!r.url().startsWith(baseUrl) && !r.url().startsWith('data:')) external.push(r.url());
    });
    await signIn(page, baseUrl, 'engineer@fanlight.test');
    await page.waitForURL(`${baseUrl}/projects`);
    await expect.poll(() => page.getByRole('heading', { name: 'Projects' }).isVisible()).toBe(true);
    const row = page.getByRole('row', { name: new RegExp(demoProject.name) });
    await expect.poll(() => row.isVisible()).toBe(true);
    expect(await row.textContent()).toContain('engineer');
    // The fonts are ours: JetBrains Mono is loaded from our own assets.
    await page.evaluate(() => document.fonts.ready);
    expect(await page.evaluate(() => document.fonts.check('12px "JetBrains Mono"'))).toBe(true);
    await screenshot(page, 'projects-engineer');
    expect(external).toEqual([]);
    await page.close();
  });

  it('an anonymous visitor of the sign-in page sees no error in the console', async () => {
    const page = await browser.newPage();
    const errors: string[] = [];
    page.on('console', (m) => {
      if (m.type() === 'error') errors.push(m.text());
    });
    await page.goto(`${baseUrl}/projects`);
    await page.waitForURL((u) => u.pathname === '/signin');
    await expect.poll(() => page.getByRole('button', { name: /sign in/i }).first().isVisible()).toBe(true);
    await page.waitForLoadState('networkidle');
    expect(errors).toEqual([]);
    await page.close();
  });

  it('a wrong password shows the error and stays on Sign in', async () => {
    const page = await browser.newPage();
    await signIn(page, baseUrl, 'engineer@fanlight.test', 'wrong-password');
    await expect.poll(() => page.getByRole('alert').first().textContent()).toMatch(/do not match/);
    expect(new URL(page.url()).pathname).toBe('/signin');
    await page.close();
  });

  it('an address behind sign-in sends a visitor to Sign in first', async () => {
    const page = await browser.newPage();
    await page.goto(`${baseUrl}/projects`);
    await page.waitForURL(/\/signin\?next=/);
    await page.close();
  });
});
