/**
 * The Bench in headless Chromium: time from dropping a 60 s, 4-channel, 51.2 kHz WAV to a fully painted
 * map (performance marks 'fanlight:drop' → 'fanlight:map-painted'), and the redraw time of pan/zoom
 * and guide changes on a 1500×800 map (measures named 'fanlight:redraw'). Runs the app on a private
 * MariaDB of its own (port 33308) so it disturbs neither `npm start` nor `npm test`.
 */
import { createServer } from 'node:http';
import path from 'node:path';
import { chromium, type Browser, type Page } from 'playwright-core';
import { createApp } from '../../server/app';
import { DATA_DIR, loadConfig } from '../../server/config';
import { createDb } from '../../server/db/knex';
import { buildClientIfStale } from '../../server/ops/client-build';
import { prepareDatabase } from '../../server/ops/database';
import { DEMO_PASSWORD } from '../../seeds/demo-scenario';
import { synthesiseDrive } from '../../seeds/synthetic-drive';
import { writeWav } from '../../workers/io/wav-writer';

export interface BrowserBenchResult {
  dropToPaintedMs: number[];
  redrawMs: { median: number; p95: number; count: number };
}

export interface BenchApp {
  baseUrl: string;
  browser: Browser;
  stop(): Promise<void>;
}

/** The app on a private MariaDB of its own (port 33308) and a headless Chromium, for the browser benchmarks. */
export async function openBenchApp(): Promise<BenchApp> {
  const base = loadConfig({ ...process.env, NODE_ENV: 'test', DB_PORT: '33308', DB_NAME: 'fanlight_bench' });
  const config = { ...base, clientDir: path.join(DATA_DIR, 'test-client') };
  const { mariadb } = await prepareDatabase('bench', config.db, { recreate: true });
  await buildClientIfStale(config.clientDir);
  const db = createDb(config.db);
  const server = createServer();
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', () => resolve()));
  const port = (server.address() as { port: number }).port;
  const baseUrl = `http://127.0.0.1:${port}`;
  const fanlight = createApp({ config: { ...config, publicOrigin: baseUrl }, db });
  server.on('request', fanlight.app);
  const browser = await chromium.launch({
    executablePath: '/usr/bin/chromium',
    args: ['--no-sandbox', '--disable-gpu', '--disable-background-networking', '--disable-component-update', '--disable-sync', '--no-first-run'],
  });
  return {
    baseUrl,
    browser,
    async stop() {
      await browser.close();
      await new Promise<void>((resolve) => server.close(() => resolve()));
      fanlight.close();
      await db.destroy();
      await mariadb.stop();
    },
  };
}

/** Signs the demo engineer in on a new page of the given size. */
export async function signedInPage(app: BenchApp, viewport = { width: 2560, height: 1440 }): Promise<Page> {
  const page = await app.browser.newPage({ viewport });
  await page.goto(`${app.baseUrl}/signin`);
  await page.getByLabel('E-mail', { exact: true }).fill('engineer@fanlight.test');
  await page.getByLabel('Password').fill(DEMO_PASSWORD);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.waitForURL(`${app.baseUrl}/projects`);
  return page;
}

export async function runBrowserBench(log: (line: string) => void): Promise<BrowserBenchResult | null> {
  const app = await openBenchApp();
  const { baseUrl } = app;
  try {
    const FS = 51200;
    const rpm = (t: number) => 1000 + 150 * t;
    const channels = [0, 1, 2, 3].map((c) =>
      synthesiseDrive({
        fsHz: FS,
        durationS: 60,
        rpm,
        polePairs: 4,
        carrierHz: () => 10000,
        orders: [{ order: 8, amplitude: 0.05 }],
        families: [{ m: 1, n: 1, amplitude: 0.02 }, { m: 1, n: -1, amplitude: 0.02 }],
        noiseRms: 0.002,
        seed: 40 + c,
      }),
    );
    const wav = Buffer.from(writeWav(channels, { sampleRateHz: FS, bits: 24 }));
    // wide enough that the map canvas is at least the 1500×800 of the goal
    const page = await signedInPage(app);
    const dropToPaintedMs: number[] = [];
    for (let run = 0; run < 3; run++) {
      await page.goto(`${baseUrl}/bench`);
      await page.evaluate(() => performance.clearMarks());
      await page.getByTestId('drop-zone-input').setInputFiles({ name: `bench-${run}.wav`, mimeType: 'audio/wav', buffer: wav });
      await page.waitForFunction(() => performance.getEntriesByName('fanlight:map-painted').length > 0, null, { timeout: 60_000 });
      dropToPaintedMs.push(
        await page.evaluate(() => {
          const drop = performance.getEntriesByName('fanlight:drop').at(-1)!.startTime;
          return performance.getEntriesByName('fanlight:map-painted').at(-1)!.startTime - drop;
        }),
      );
    }
    // pan and zoom with the keyboard and the wheel, then read the redraw measures
    await page.evaluate(() => performance.clearMeasures('fanlight:redraw'));
    const canvas = page.getByTestId('map-canvas');
    const box = await canvas.boundingBox();
    if (box) await page.mouse.move(box.x + box.width / 2, box.y + box.height / 2);
    for (let i = 0; i < 20; i++) {
      await page.mouse.wheel(0, i % 2 ? 120 : -120);
      await page.keyboard.press(i % 2 ? 'ArrowLeft' : 'ArrowRight');
    }
    await page.keyboard.press('g');
    await page.keyboard.press('g');
    const redraws = await page.evaluate(() => performance.getEntriesByName('fanlight:redraw').map((e) => e.duration));
    redraws.sort((a, b) => a - b);
    const result = {
      dropToPaintedMs,
      redrawMs: { median: redraws[redraws.length >> 1] ?? NaN, p95: redraws[Math.floor(redraws.length * 0.95)] ?? NaN, count: redraws.length },
    };
    const size = await canvas.evaluate((c: HTMLCanvasElement) => `${c.width}×${c.height}`);
    log(`Bench in headless Chromium: drop of a 60 s, 4-channel, 51.2 kHz WAV to a painted map: ${dropToPaintedMs.map((v) => v.toFixed(0)).join(' / ')} ms`);
    log(`  redraw (pan, zoom, guides) on the ${size} map canvas: median ${result.redrawMs.median.toFixed(1)} ms, 95th percentile ${result.redrawMs.p95.toFixed(1)} ms over ${result.redrawMs.count} redraws`);
    return result;
  } finally {
    await app.stop();
  }
}
