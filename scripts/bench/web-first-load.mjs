// The web's first load of the Arch view (issue 13, goal 3), measured in headless Chromium against a
// running API that serves the built web: the JavaScript the page needs before the Arch shows (its
// gzip bytes, read from the build's precompressed .gz files), whether `/api/auth/me` and the
// patient's request overlap, and the time to the Arch against a blank page of the same build (the
// same URL with JavaScript off: the HTML and its CSS only). Each figure is the median of `runs` cold
// loads (a new browser context each, so nothing cached). Measures only; asserts nothing.
// "Before the Arch shows" is exact: the page notes the moment the Arch's drawing enters the
// document (a MutationObserver) and the scripts counted are those whose request started earlier
// (Resource Timing), so what a page loads just after its first view is not counted.
import fs from 'node:fs';
import path from 'node:path';
import { chromium } from 'playwright-core';
import { ensureChromium } from '../lib/bootstrap.mjs';

const median = (xs) => [...xs].sort((a, b) => a - b)[Math.floor((xs.length - 1) / 2)];

/** Gzip bytes of a built file, from its precompressed copy (the bytes a browser is sent). */
function gzipBytes(webDist, pathname) {
  const file = path.join(webDist, pathname);
  if (fs.existsSync(`${file}.gz`)) return fs.statSync(`${file}.gz`).size;
  return fs.existsSync(file) ? fs.statSync(file).size : 0;
}

/**
 * @param {{ baseUrl: string, cookie: string, patientId: string, webDist: string, runs?: number }} options
 */
export async function measureWebFirstLoad({ baseUrl, cookie, patientId, webDist, runs = 5 }) {
  const browser = await chromium.launch({
    // Installed as `npm test` installs it, so the benchmark also runs on a machine that never ran the tests.
    executablePath: await ensureChromium(),
    args: ['--no-sandbox', '--disable-gpu', '--no-first-run', '--disable-background-networking'],
    headless: true,
  });
  const [name, value] = cookie.split('=');
  const url = `${baseUrl}/patients/${patientId}`;
  const loads = [];
  const blanks = [];
  try {
    for (let i = 0; i < runs + 1; i += 1) {
      // The blank page: the same document and CSS, no script.
      const blankContext = await browser.newContext({ javaScriptEnabled: false });
      const blankPage = await blankContext.newPage();
      const b0 = Date.now();
      await blankPage.goto(url, { waitUntil: 'load' });
      const blankMs = Date.now() - b0;
      await blankContext.close();

      const context = await browser.newContext();
      await context.addCookies([{ name, value: value ?? '', url: baseUrl }]);
      await context.addInitScript(() => {
        new MutationObserver((_, observer) => {
          if (!document.querySelector('.arch-page svg.arch-svg')) return;
          window.ttArchShownAt = performance.now();
          observer.disconnect();
        }).observe(document, { childList: true, subtree: true });
      });
      const page = await context.newPage();
      const requests = [];
      page.on('requestfinished', (request) => {
        const timing = request.timing();
        requests.push({
          url: request.url(),
          type: request.resourceType(),
          start: timing.startTime,
          end: timing.startTime + timing.responseEnd,
        });
      });
      const t0 = Date.now();
      await page.goto(url);
      await page.locator('.arch-page svg.arch-svg').first().waitFor({ state: 'visible', timeout: 30_000 });
      const archMs = Date.now() - t0;
      const timing = await page.evaluate(() => ({
        archShownAt: window.ttArchShownAt ?? performance.now(),
        resources: performance
          .getEntriesByType('resource')
          .map((e) => ({ url: e.name, start: e.startTime, end: e.responseEnd })),
      }));
      await context.close();
      if (i === 0) continue; // the first load warms the server and the disk cache
      const before = (pattern) => [
        ...new Set(
          timing.resources
            .filter((r) => r.start < timing.archShownAt && pattern.test(new URL(r.url).pathname))
            .map((r) => new URL(r.url).pathname),
        ),
      ];
      const scripts = before(/\.m?js$/);
      const stylesheets = before(/\.css$/);
      const fonts = before(/\.woff2?$/);
      const me = requests.find((r) => r.url.endsWith('/api/auth/me'));
      const patient = requests.find((r) => new URL(r.url).pathname === `/api/patients/${patientId}`);
      loads.push({
        archMs,
        scripts: scripts.length,
        jsGzipBytes: scripts.reduce((sum, p) => sum + gzipBytes(webDist, p), 0),
        cssGzipBytes: stylesheets.reduce((sum, p) => sum + gzipBytes(webDist, p), 0),
        // Fonts are sent as they are (woff2 is compressed already).
        fontBytes: fonts.reduce((sum, p) => sum + gzipBytes(webDist, p), 0),
        fonts: fonts.length,
        meStartMs: me ? me.start - requests[0].start : null,
        patientStartMs: patient ? patient.start - requests[0].start : null,
        meEndMs: me ? me.end - requests[0].start : null,
        // The patient's request began before `me` answered: the two ran side by side.
        parallel: Boolean(me && patient && patient.start < me.end),
        scriptFiles: scripts,
        scriptKb: Object.fromEntries(scripts.map((p) => [p, Math.round(gzipBytes(webDist, p) / 102.4) / 10])),
        archShownMs: timing.archShownAt,
        // The waterfall, on the page's clock (from navigation start): the last script counted above
        // and the last of the two first reads received. The Arch shows `archShownMs` later: what
        // remains after both is the main thread running the scripts and rendering.
        scriptsDoneMs: Math.max(
          0,
          ...timing.resources.filter((r) => scripts.includes(new URL(r.url).pathname)).map((r) => r.end),
        ),
        dataDoneMs: Math.max(
          0,
          ...timing.resources
            .filter((r) => ['/api/auth/me', `/api/patients/${patientId}`].includes(new URL(r.url).pathname))
            .map((r) => r.end),
        ),
      });
      blanks.push(blankMs);
    }
  } finally {
    await browser.close();
  }
  const archMs = median(loads.map((l) => l.archMs));
  const blankMs = median(blanks);
  return {
    runs,
    archMs,
    blankMs,
    ratio: archMs / blankMs,
    jsGzipKb: median(loads.map((l) => l.jsGzipBytes)) / 1024,
    cssGzipKb: median(loads.map((l) => l.cssGzipBytes)) / 1024,
    fontKb: median(loads.map((l) => l.fontBytes)) / 1024,
    fonts: median(loads.map((l) => l.fonts)),
    scripts: median(loads.map((l) => l.scripts)),
    meStartMs: median(loads.map((l) => l.meStartMs ?? 0)),
    patientStartMs: median(loads.map((l) => l.patientStartMs ?? 0)),
    meEndMs: median(loads.map((l) => l.meEndMs ?? 0)),
    parallel: loads.filter((l) => l.parallel).length,
    archShownMs: median(loads.map((l) => l.archShownMs)),
    scriptsDoneMs: median(loads.map((l) => l.scriptsDoneMs)),
    dataDoneMs: median(loads.map((l) => l.dataDoneMs)),
    scriptFiles: loads.at(-1)?.scriptFiles ?? [],
    scriptKb: loads.at(-1)?.scriptKb ?? {},
  };
}
