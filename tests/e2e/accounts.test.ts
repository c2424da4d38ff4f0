import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { DEMO_PASSWORD } from '../../seeds/demo-scenario';
import { makeUser, ACTOR_PASSWORD, uniqueEmail } from '../support/actors';
import { openTestDb } from '../support/test-db';
import { launchBrowser, screenshot, signIn } from './browser';

describe('accounts (browser)', () => {
  const baseUrl = inject('baseUrl');
  const db = openTestDb();
  let browser: Browser;
  beforeAll(async () => {
    browser = await launchBrowser();
  });
  afterAll(async () => {
    await browser?.close();
    await db.destroy();
  });

  it('a forgotten password is reset through the link in the Outbox', async () => {
    const user = await makeUser(db, 'forgot-ui', 'staff');
    const context = await browser.newContext();
    const page = await context.newPage();
    await page.goto(`${baseUrl}/signin`);
    await page.getByRole('link', { name: /Forgot password/ }).click();
    await page.getByLabel('E-mail', { exact: true }).fill(user.email);
    await page.getByRole('button', { name: 'Send the link' }).click();
    await expect.poll(() => page.getByText(/If an account exists for that e-mail/).isVisible()).toBe(true);

    await page.goto(`${baseUrl}/outbox`);
    const message = page.locator('li, article').filter({ hasText: user.email }).first();
    await expect.poll(() => message.isVisible(), { timeout: 10_000 }).toBe(true);
    await message.getByRole('link', { name: /reset-password/ }).click();
    await page.getByLabel('New password', { exact: true }).fill('my-new-password-9');
    await page.getByLabel('Repeat the new password').fill('my-new-password-9');
    await page.getByRole('button', { name: 'Set the new password' }).click();
    await page.getByRole('link', { name: /Sign in/ }).first().click();
    await signIn(page, baseUrl, user.email, ACTOR_PASSWORD);
    await expect.poll(() => page.getByRole('alert').first().textContent()).toMatch(/do not match/);
    await signIn(page, baseUrl, user.email, 'my-new-password-9');
    await page.waitForURL(`${baseUrl}/projects`);
    await context.close();
  });

  it('the site admin creates a user and changes their site role on the Admin users page', async () => {
    const context = await browser.newContext();
    const page = await context.newPage();
    await signIn(page, baseUrl, 'admin@fanlight.test', DEMO_PASSWORD);
    await page.waitForURL(`${baseUrl}/projects`);
    await page.getByRole('link', { name: 'Users' }).click();
    const email = uniqueEmail('by-admin');
    await page.getByLabel('E-mail', { exact: true }).fill(email);
    await page.getByLabel('Name', { exact: true }).fill('Mira Quell');
    await page.getByLabel('Password', { exact: true }).fill('long-enough-pass');
    await page.getByLabel('Site role', { exact: true }).selectOption('staff');
    await page.getByRole('button', { name: 'Create user' }).click();
    const select = page.getByLabel('Site role of Mira Quell').first();
    await expect.poll(() => select.isVisible()).toBe(true);
    await select.selectOption('guest');
    await expect.poll(async () => (await db('users').where({ email }).first('site_role'))?.site_role).toBe('guest');
    await screenshot(page, 'admin-users');
    await context.close();
  });
});
