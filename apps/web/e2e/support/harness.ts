// Browser-test harness: the real API (in this process) serving the built web app on a free
// loopback port, the test database freshly seeded, and Debian's chromium driven by playwright-core.
import fs from 'node:fs';
import path from 'node:path';
import type { INestApplication } from '@nestjs/common';
import { chromium, type Browser, type BrowserContext, type Page } from 'playwright-core';
import { createApp } from '../../../api/src/app.js';
import { type Env, parseEnv } from '../../../api/src/config/env.js';
import { createDatabase, createPool } from '../../../api/src/db/database.js';
import { DEMO_PASSWORD } from '../../../api/src/seed/demo-scenario.js';
import { resetDatabase } from '../../../api/test/support/test-app.js';

const webDist = path.resolve(import.meta.dirname, '../../dist');

export interface Harness {
  baseUrl: string;
  browser: Browser;
  /** Console errors and failed requests seen by any page, to assert a clean run. */
  problems: string[];
  newPage: () => Promise<Page>;
  /** Back to the freshly seeded scenario (a test that writes calls it first, so a retry starts clean). */
  reset: () => Promise<void>;
  close: () => Promise<void>;
}

/** `overrides` change API settings for one file (e.g. a short idle sign-out period). */
export async function startHarness(overrides: Partial<Env> = {}): Promise<Harness> {
  if (!fs.existsSync(path.join(webDist, 'index.html')))
    throw new Error(`the web app is not built (${webDist}); run npm test`);
  const env = { ...parseEnv({ ...process.env, NODE_ENV: 'test', WEB_DIST: webDist }), ...overrides };
  const pool = createPool(env.DATABASE_URL);
  const reset = () => resetDatabase(createDatabase(pool));
  await reset();
  const app: INestApplication = await createApp(env, { logger: false });
  await app.listen(0, '127.0.0.1');
  const address = app.getHttpServer().address() as { port: number };
  const baseUrl = `http://127.0.0.1:${address.port}`;

  // playwright-core gives each launch a fresh, empty profile folder of its own.
  const browser = await chromium.launch({
    executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
    args: [
      '--no-sandbox',
      '--disable-gpu',
      '--disable-quic',
      '--no-first-run',
      '--disable-background-networking',
      '--disable-component-update',
      '--disable-sync',
    ],
    headless: true,
  });
  const problems: string[] = [];
  const contexts: BrowserContext[] = [];

  return {
    baseUrl,
    browser,
    problems,
    reset,
    newPage: async () => {
      const context = await browser.newContext({ baseURL: baseUrl, viewport: { width: 1280, height: 900 } });
      contexts.push(context);
      const page = await context.newPage();
      page.on('console', (msg) => {
        if (msg.type() === 'error') problems.push(`console: ${msg.text()}`);
      });
      page.on('pageerror', (error) => problems.push(`page error: ${error.stack ?? error.message}`));
      return page;
    },
    close: async () => {
      for (const c of contexts) await c.close().catch(() => undefined);
      await browser.close();
      await app.close();
      await pool.end();
      // A Content-Security-Policy violation is a bug in every test, whatever the test checks.
      const csp = problems.filter((p) => /Content Security Policy/i.test(p));
      if (csp.length > 0) throw new Error(`Content-Security-Policy violations:\n${csp.join('\n')}`);
    },
  };
}

/** Signs in through the sign-in page, as a person would. */
export async function signInAs(page: Page, email: string): Promise<void> {
  await page.goto('/sign-in');
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password').fill(DEMO_PASSWORD);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.waitForURL('**/patients**');
}

/** Saves a screenshot under .local/test-results/screens for a person to look at. */
export async function screenshot(page: Page, name: string): Promise<void> {
  const dir = path.resolve(import.meta.dirname, '../../../../.local/test-results/screens');
  fs.mkdirSync(dir, { recursive: true });
  await page.screenshot({ path: path.join(dir, `${name}.png`), fullPage: true });
}
