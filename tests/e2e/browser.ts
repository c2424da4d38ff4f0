/** Headless Debian Chromium through playwright-core (no browser download: the test command apt-installs it). */
import { mkdirSync } from 'node:fs';
import path from 'node:path';
import { chromium, type Browser, type Page } from 'playwright-core';
import { PROJECT_ROOT } from '../../server/config';
import { DEMO_PASSWORD } from '../../seeds/demo-scenario';

export const ARTEFACTS_DIR = path.join(PROJECT_ROOT, 'test-results');

export async function launchBrowser(): Promise<Browser> {
  return chromium.launch({
    executablePath: process.env.CHROMIUM_PATH || '/usr/bin/chromium',
    headless: true,
    args: [
      '--no-sandbox',
      '--disable-gpu',
      '--disable-quic',
      '--no-first-run',
      // The machine has no network beyond loopback: keep Chromium from trying.
      '--disable-background-networking',
      '--disable-component-update',
      '--disable-sync',
    ],
  });
}

export async function signIn(page: Page, baseUrl: string, email: string, password = DEMO_PASSWORD) {
  await page.goto(`${baseUrl}/signin`);
  await page.getByLabel('E-mail', { exact: true }).fill(email);
  await page.getByLabel('Password').fill(password);
  await page.getByRole('button', { name: 'Sign in' }).click();
}

export async function screenshot(page: Page, name: string) {
  mkdirSync(ARTEFACTS_DIR, { recursive: true });
  await page.screenshot({ path: path.join(ARTEFACTS_DIR, `${name}.png`), fullPage: true });
}

/** Size, share of opaque pixels and a count of distinct colours of a canvas found by its test id. */
export function canvasPixels(page: Page, testId: string) {
  return page.evaluate((id) => {
    const canvas = document.querySelector<HTMLCanvasElement>(`[data-testid="${id}"]`);
    if (!canvas || canvas.width === 0) return { width: 0, height: 0, opaque: 0, colours: 0 };
    const { width, height } = canvas;
    const d = canvas.getContext('2d')!.getImageData(0, 0, width, height).data;
    let opaque = 0;
    const colours = new Set<number>();
    for (let i = 0; i < d.length; i += 4) {
      if (d[i + 3] === 255) opaque++;
      if (i % 64 === 0) colours.add((d[i] << 16) | (d[i + 1] << 8) | d[i + 2]);
    }
    return { width, height, opaque: opaque / (width * height), colours: colours.size };
  }, testId);
}

/**
 * A new browser context signed in as `email`, on `path` (the Bench unless told), with the page's
 * uncaught errors collected in `errors`.
 */
export async function signedInPage(
  browser: Browser,
  baseUrl: string,
  email: string,
  options: { path?: string; viewport?: { width: number; height: number }; acceptDownloads?: boolean } = {},
) {
  const context = await browser.newContext({ viewport: options.viewport ?? { width: 1440, height: 1000 }, acceptDownloads: options.acceptDownloads });
  const page = await context.newPage();
  const errors: string[] = [];
  page.on('pageerror', (e) => errors.push(e.message));
  await signIn(page, baseUrl, email);
  await page.waitForURL(`${baseUrl}/projects`);
  await page.goto(`${baseUrl}${options.path ?? '/bench'}`);
  return { context, page, errors };
}

/** Opens a section of the Bench's left rail, unless it is open already (others stay as they are). */
export async function showBenchSection(page: Page, name: 'Recordings' | 'Channels and speed' | 'Register and save') {
  const button = page.getByRole('navigation', { name: 'Bench sections' }).getByRole('button', { name, exact: true });
  if ((await button.getAttribute('aria-expanded')) !== 'true') await button.click();
}

/** Shows the map's settings row above the map, unless it is shown already. */
export async function showMapSettings(page: Page) {
  const button = page.getByRole('button', { name: 'Map settings', exact: true });
  if ((await button.getAttribute('aria-expanded')) !== 'true') await button.click();
}
