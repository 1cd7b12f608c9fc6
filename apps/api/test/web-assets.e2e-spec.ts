// The built web app as the API serves it: precompressed at build time (vite-plugin-compression2),
// chosen by Accept-Encoding (express-static-gzip), hashed files cached as immutable, the page
// itself revalidated and compressed, its inline script allowed by hash, and nothing under /api answered from the disk.
import { createHash } from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import { brotliDecompressSync, gunzipSync, gzipSync } from 'node:zlib';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startTestApp, type TestContext } from './support/test-app.js';
import { replyBytes } from './support/reply-bytes.js';

const webDist = path.resolve(import.meta.dirname, '../../web/dist');
const assets = fs.readdirSync(path.join(webDist, 'assets'));
const scripts = assets.filter((f) => /\.(js|css)$/.test(f));
const largest = scripts
  .map((f) => ({ f, size: fs.statSync(path.join(webDist, 'assets', f)).size }))
  .sort((a, b) => b.size - a.size)[0].f;

let ctx: TestContext;
beforeAll(async () => {
  ctx = await startTestApp({ WEB_DIST: webDist });
});
afterAll(() => ctx.close());

/** The body as bytes (decoded by the client from any Content-Encoding). */
const raw = (res: { body: unknown }) => res.body as Buffer;
const bytes = (req: ReturnType<TestContext['http']['get']>) => req.buffer(true).parse(replyBytes);

describe('the built web app', () => {
  it('has a brotli and a gzip copy of every script and stylesheet of 1 KB or more', () => {
    const missing = scripts
      .filter((f) => fs.statSync(path.join(webDist, 'assets', f)).size >= 1024)
      .filter((f) => !assets.includes(`${f}.br`) || !assets.includes(`${f}.gz`));
    expect(missing).toEqual([]);
  });

  it('has a gzip copy of every script and stylesheet, however small, that gzip makes smaller', () => {
    // A page's first load is many small chunks: each is sent compressed too (issue 13, goal 3).
    const missing = scripts
      .filter((f) => !assets.includes(`${f}.gz`))
      .filter((f) => {
        const original = fs.readFileSync(path.join(webDist, 'assets', f));
        return gzipSync(original, { level: 9 }).length < original.length;
      });
    expect(missing).toEqual([]);
  });

  it('serves the brotli file when accepted, the gzip file otherwise, each the same content', async () => {
    const file = (name: string) => fs.readFileSync(path.join(webDist, 'assets', name));
    const original = file(largest);
    // The test client decodes what it receives: the length sent and the file's own bytes tell
    // which copy went over the wire; the decoded body must be the original.
    const br = await bytes(ctx.http.get(`/assets/${largest}`).set('Accept-Encoding', 'gzip, br'));
    expect(br.status).toBe(200);
    expect(br.headers['content-encoding']).toBe('br');
    expect(Number(br.headers['content-length'])).toBe(file(`${largest}.br`).length);
    expect(brotliDecompressSync(file(`${largest}.br`)).equals(original)).toBe(true);
    expect(raw(br).equals(original)).toBe(true);
    expect(file(`${largest}.br`).length).toBeLessThan(original.length / 2);

    const gz = await bytes(ctx.http.get(`/assets/${largest}`).set('Accept-Encoding', 'gzip'));
    expect(gz.headers['content-encoding']).toBe('gzip');
    expect(Number(gz.headers['content-length'])).toBe(file(`${largest}.gz`).length);
    expect(gunzipSync(file(`${largest}.gz`)).equals(original)).toBe(true);
    expect(raw(gz).equals(original)).toBe(true);

    const plain = await bytes(ctx.http.get(`/assets/${largest}`).set('Accept-Encoding', 'identity'));
    expect(plain.headers['content-encoding']).toBeUndefined();
    expect(Number(plain.headers['content-length'])).toBe(original.length);
  });

  it('caches hashed files for a year as immutable and revalidates the page', async () => {
    const asset = await ctx.http.get(`/assets/${largest}`);
    expect(asset.headers['cache-control']).toBe('public, max-age=31536000, immutable');
    const page = await ctx.http.get('/patients/some-client-route');
    expect(page.status).toBe(200);
    expect(page.headers['content-type']).toMatch(/text\/html/);
    expect(page.headers['cache-control']).toBe('no-cache');
  });

  it("allows the page's early-read script by its hash, and no other inline script", async () => {
    // The page starts its first reads inline (apps/web/src/lib/early-reads/); the CSP must name that
    // exact script, or the browser blocks it. Hashed here from the bytes received, independently of the API.
    const page = await ctx.http.get('/patients/some-client-route');
    const inline = [...page.text.matchAll(/<script>([\s\S]*?)<\/script>/g)].map((m) => m[1] ?? '');
    expect(inline).toHaveLength(1);
    const script = inline[0] ?? '';
    expect(script).toContain('/api/auth/me');
    expect(script).toContain('modulepreload');
    const hash = `'sha256-${createHash('sha256').update(script, 'utf8').digest('base64')}'`;
    const scriptSrc = /(?:^|;)\s*script-src ([^;]*)/.exec(page.headers['content-security-policy'])?.[1];
    expect(scriptSrc?.split(' ')).toEqual(["'self'", hash]);
    // The Arch's chunks and stylesheet it preloads are files of this build.
    const preloaded = [...script.matchAll(/\/assets\/[\w.-]+\.(?:js|css)/g)].map((m) => m[0]);
    expect(preloaded.filter((p) => p.endsWith('.js')).length).toBeGreaterThan(0);
    expect(preloaded.filter((p) => p.endsWith('.css')).length).toBeGreaterThan(0);
    expect(preloaded.filter((p) => !fs.existsSync(path.join(webDist, p)))).toEqual([]);
    // And the page is the built file.
    expect(page.text).toBe(fs.readFileSync(path.join(webDist, 'index.html'), 'utf8'));
  });

  it('serves the page compressed when accepted', async () => {
    const html = fs.readFileSync(path.join(webDist, 'index.html'));
    const br = await bytes(ctx.http.get('/patients/x').set('Accept-Encoding', 'gzip, br'));
    expect(br.headers['content-encoding']).toBe('br');
    expect(br.headers.vary).toMatch(/Accept-Encoding/);
    expect(Number(br.headers['content-length'])).toBeLessThan(html.length);
    expect(raw(br).equals(html)).toBe(true);
    const gz = await bytes(ctx.http.get('/patients/x').set('Accept-Encoding', 'gzip'));
    expect(gz.headers['content-encoding']).toBe('gzip');
    expect(raw(gz).equals(html)).toBe(true);
    const plain = await bytes(ctx.http.get('/patients/x').set('Accept-Encoding', 'identity'));
    expect(plain.headers['content-encoding']).toBeUndefined();
    expect(raw(plain).equals(html)).toBe(true);
  });

  it('never answers /api from the disk: an unknown API path is the JSON 404, with no-store', async () => {
    for (const p of ['/api/index.html', `/api/assets/${largest}`, '/api/nothing-here']) {
      const res = await ctx.http.get(p);
      expect(res.status, p).toBe(404);
      expect(res.headers['content-type'], p).toMatch(/application\/json/);
      expect(res.headers['cache-control'], p).toBe('no-store');
    }
  });
});
