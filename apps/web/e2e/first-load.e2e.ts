// The page's early reads (apps/web/src/lib/early-reads/): index.html starts the session's and the
// Arch patient's reads before the app's code has loaded, and the app takes those replies instead of
// asking again. The script runs only if the Content-Security-Policy names its hash (the harness
// fails the file on any violation); here, that it runs and that its reads are the ones the app uses.
import type { Page, Request } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { signInAs, startHarness, type Harness } from './support/harness.js';

let h: Harness;
beforeAll(async () => {
  h = await startHarness();
});
afterAll(() => h.close());

/** Loads `url` afresh and returns the API paths the page requested, in order. */
async function apiRequestsOfLoad(page: Page, url: string, ready: () => Promise<unknown>): Promise<string[]> {
  const seen: string[] = [];
  const record = (request: Request) => {
    const { pathname } = new URL(request.url());
    if (pathname.startsWith('/api/')) seen.push(pathname);
  };
  page.on('request', record);
  await page.goto(url);
  await ready();
  page.off('request', record);
  return seen;
}

describe('the first load', () => {
  it("reads the session and the Arch's patient once, early, and preloads the Arch's chunks", async () => {
    const page = await h.newPage();
    await signInAs(page, 'ines.calloway@larkspur.example');
    await page
      .getByRole('table')
      .getByRole('link', { name: /Whitcombe/ })
      .click();
    await page.waitForURL(/\/patients\/[^/]+$/);
    const archPath = new URL(page.url()).pathname;
    const patientId = archPath.split('/').at(-1) ?? '';

    const requests = await apiRequestsOfLoad(page, archPath, () =>
      page.locator('.arch-page svg.arch-svg').first().waitFor(),
    );
    expect(requests.filter((p) => p === '/api/auth/me')).toHaveLength(1);
    expect(requests.filter((p) => p === `/api/patients/${patientId}`)).toHaveLength(1);
    // Started by the page itself, before the app: the first two API requests of the load.
    expect(requests.slice(0, 2).sort()).toEqual(['/api/auth/me', `/api/patients/${patientId}`].sort());
    // Both taken by the app; the Arch's route chunk was asked for by the page.
    expect(
      await page.evaluate(() => Object.keys((window as unknown as { ttEarlyReads: object }).ttEarlyReads)),
    ).toEqual([]);
    const preloaded = await page.$$eval('link[rel="modulepreload"]', (links) =>
      links.map((l) => new URL((l as HTMLLinkElement).href).pathname),
    );
    expect(preloaded.some((p) => /\/assets\/arch-route-[\w-]+\.js$/.test(p))).toBe(true);
    // Its stylesheet too, fetched once: the preload's response is the one the route's stylesheet uses.
    const styles = await page.$$eval('link[rel="preload"][as="style"]', (links) =>
      links.map((l) => new URL((l as HTMLLinkElement).href).pathname),
    );
    expect(styles.filter((p) => /\/assets\/arch-route-[\w-]+\.css$/.test(p))).toHaveLength(1);
    const archStyles = await page.$$eval('link[rel="stylesheet"]', (links) =>
      links.map((l) => new URL((l as HTMLLinkElement).href).pathname).filter((p) => /arch-route/.test(p)),
    );
    expect(archStyles).toEqual(styles.filter((p) => /arch-route/.test(p)));
    const fetched = await page.evaluate(() =>
      performance.getEntriesByType('resource').filter((e) => /\/assets\/arch-route-[\w-]+\.css$/.test(e.name)),
    );
    expect(fetched).toHaveLength(1);
  });

  it('reads only the session on another page, and preloads nothing of the Arch', async () => {
    const page = await h.newPage();
    await signInAs(page, 'ines.calloway@larkspur.example');
    const requests = await apiRequestsOfLoad(page, '/recalls', () =>
      page.getByRole('heading', { level: 1 }).first().waitFor(),
    );
    expect(requests.filter((p) => p === '/api/auth/me')).toHaveLength(1);
    expect(requests[0]).toBe('/api/auth/me');
    const preloaded = await page.$$eval('link[rel="modulepreload"]', (links) =>
      links.map((l) => new URL((l as HTMLLinkElement).href).pathname),
    );
    expect(preloaded.filter((p) => /arch-route/.test(p))).toEqual([]);
  });
});
