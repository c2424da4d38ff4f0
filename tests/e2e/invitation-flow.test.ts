import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { demoProject } from '../../seeds/demo-scenario';
import { uniqueEmail } from '../support/actors';
import { launchBrowser, screenshot, signIn } from './browser';

describe('invitations (browser)', () => {
  const baseUrl = inject('baseUrl');
  let browser: Browser;
  beforeAll(async () => {
    browser = await launchBrowser();
  });
  afterAll(() => browser?.close());

  it('the lead invites a colleague, who accepts from the Outbox link and sees the project', async () => {
    const colleague = uniqueEmail('colleague');
    const leadContext = await browser.newContext();
    const lead = await leadContext.newPage();
    await signIn(lead, baseUrl, 'lead@fanlight.test');
    await lead.waitForURL(`${baseUrl}/projects`);
    await lead.getByRole('link', { name: demoProject.name }).click();
    await lead.getByLabel('E-mail', { exact: true }).fill(colleague);
    await lead.getByLabel('Role', { exact: true }).selectOption('engineer');
    await lead.getByRole('button', { name: 'Send invitation' }).click();
    await expect.poll(() => lead.getByText(`We e-mailed an invitation to ${colleague}`).isVisible()).toBe(true);
    await screenshot(lead, 'project-lead');
    await leadContext.close();

    // The colleague, in a browser of their own, reads the mail in the Outbox and follows the link.
    const context = await browser.newContext();
    const page = await context.newPage();
    await page.goto(`${baseUrl}/outbox`);
    const message = page.locator('li, article').filter({ hasText: colleague }).first();
    await expect.poll(() => message.isVisible()).toBe(true);
    await screenshot(page, 'outbox');
    await message.getByRole('link', { name: /\/invitations\// }).click();
    await page.waitForURL(/\/invitations\//);
    await expect.poll(() => page.getByText(demoProject.name).first().isVisible()).toBe(true);
    await page.getByLabel('Name', { exact: true }).fill('Rafe Colleague');
    await page.getByLabel('Password', { exact: true }).fill('colleague-password-1');
    await page.getByLabel('Repeat the password').fill('colleague-password-1');
    await screenshot(page, 'accept-invitation');
    await page.getByRole('button', { name: 'Create the account and accept' }).click();
    await page.waitForURL(/\/projects\/\d+$/);
    await expect.poll(() => page.getByRole('heading', { name: demoProject.name }).isVisible()).toBe(true);
    await page.goto(`${baseUrl}/projects`);
    const row = page.getByRole('row', { name: new RegExp(demoProject.name) });
    await expect.poll(() => row.isVisible()).toBe(true);
    expect(await row.textContent()).toContain('engineer');
    await context.close();
  });

  it('shows names with markup and SQL as plain text, and runs none of it', async () => {
    const context = await browser.newContext();
    const page = await context.newPage();
    const dialogs: string[] = [];
    page.on('dialog', (d) => {
      dialogs.push(d.message());
      void d.dismiss();
    });
    await signIn(page, baseUrl, 'engineer@fanlight.test');
    await page.waitForURL(`${baseUrl}/projects`);
    const name = `<script>window.__pwned=1</script><img src=x onerror="window.__pwned=2"> '; DROP TABLE projects; --`;
    await page.getByLabel('Name', { exact: true }).fill(name);
    await page.getByRole('button', { name: 'Create project' }).click();
    await page.waitForURL(/\/projects\/\d+$/);
    await expect.poll(() => page.getByRole('heading', { name }).isVisible()).toBe(true);
    await page.goto(`${baseUrl}/projects`);
    await expect.poll(() => page.getByRole('link', { name }).isVisible()).toBe(true);
    expect(await page.evaluate(() => (window as unknown as { __pwned?: number }).__pwned)).toBeUndefined();
    expect(await page.locator('img[src="x"]').count()).toBe(0);
    expect(dialogs).toEqual([]);
    await context.close();
  });
});
