// The reads index.html starts before the app has loaded, and the app taking them instead of
// sending the same requests again.
import { afterEach, describe, expect, it, vi } from 'vitest';
import { apiRequest } from '../api-client';
import { EARLY_READS_KEY, earlyReadPaths, startEarlyReads } from './start';
import { takeEarlyRead } from './take';

/** A page as startEarlyReads sees it: its location, fetch, clock and <head>. */
function fakePage(pathname: string) {
  const appended: { rel: string; href: string; as: string; crossOrigin: string | null }[] = [];
  const page = {
    location: { pathname },
    fetch: vi.fn(async (path: string, _init?: RequestInit) => new Response(JSON.stringify({ path }), { status: 200 })),
    performance: { now: () => 0 },
    document: {
      createElement: () => ({ rel: '', href: '', as: '', crossOrigin: null as string | null }),
      head: { append: (link: (typeof appended)[number]) => appended.push(link) },
    },
  };
  return { page, appended };
}

afterEach(() => vi.unstubAllGlobals());

describe('earlyReadPaths', () => {
  it('reads the session on signed-in pages, and the patient too on the Arch', () => {
    expect(earlyReadPaths('/patients/3f2a')).toEqual(['/api/auth/me', '/api/patients/3f2a']);
    expect(earlyReadPaths('/patients/3f2a/')).toEqual(['/api/auth/me', '/api/patients/3f2a']);
    expect(earlyReadPaths('/patients')).toEqual(['/api/auth/me']);
    expect(earlyReadPaths('/patients/3f2a/sites/9')).toEqual(['/api/auth/me']);
    expect(earlyReadPaths('/patients/new')).toEqual(['/api/auth/me']);
  });

  it('writes the patient id as the app does (decoded by the router, encoded by the fetcher)', () => {
    expect(earlyReadPaths('/patients/a%20b')).toEqual(['/api/auth/me', `/api/patients/${encodeURIComponent('a b')}`]);
    expect(earlyReadPaths('/patients/%E0%A4%A')).toEqual(['/api/auth/me']);
  });

  it('reads nothing on the pages without a session', () => {
    for (const path of ['/sign-in', '/welcome', '/forgot-password', '/reset-password']) {
      expect(earlyReadPaths(path), path).toEqual([]);
    }
  });
});

describe('startEarlyReads', () => {
  it("starts the Arch's reads as apiRequest would send them and preloads its chunks", () => {
    const { page, appended } = fakePage('/patients/p1');
    startEarlyReads(page as unknown as Window, ['/assets/arch-route-x.js']);
    expect(page.fetch.mock.calls.map(([path]) => path)).toEqual(['/api/auth/me', '/api/patients/p1']);
    expect(page.fetch.mock.calls[0]?.[1]).toEqual({
      headers: { Accept: 'application/json' },
      credentials: 'same-origin',
    });
    expect(Object.keys((page as unknown as Record<string, object>)[EARLY_READS_KEY] ?? {})).toEqual([
      '/api/auth/me',
      '/api/patients/p1',
    ]);
    expect(appended.map((l) => [l.rel, l.href])).toEqual([['modulepreload', '/assets/arch-route-x.js']]);
  });

  it("fetches the Arch's stylesheet as the route's loader will ask for it, without applying it", () => {
    const { page, appended } = fakePage('/patients/p1');
    startEarlyReads(page as unknown as Window, ['/assets/arch-route-x.js', '/assets/arch-route-x.css']);
    // Vite's preload helper adds <link rel="stylesheet" crossorigin>: the same CORS mode reuses this fetch.
    expect(appended.map((l) => [l.rel, l.as, l.crossOrigin, l.href])).toEqual([
      ['modulepreload', '', '', '/assets/arch-route-x.js'],
      ['preload', 'style', '', '/assets/arch-route-x.css'],
    ]);
  });

  it('preloads no Arch chunk on another page', () => {
    const { page, appended } = fakePage('/recalls');
    startEarlyReads(page as unknown as Window, ['/assets/arch-route-x.js']);
    expect(appended).toEqual([]);
  });
});

describe('apiRequest and the early reads', () => {
  it('takes an early read once instead of fetching, then fetches again', async () => {
    const { page } = fakePage('/patients/p1');
    startEarlyReads(page as unknown as Window, []);
    vi.stubGlobal('window', page);
    vi.stubGlobal('performance', { now: () => 1000 });
    const fetch = vi.fn(async () => new Response(JSON.stringify({ path: 'network' }), { status: 200 }));
    vi.stubGlobal('fetch', fetch);

    await expect(apiRequest('/api/patients/p1')).resolves.toEqual({ path: '/api/patients/p1' });
    expect(fetch).not.toHaveBeenCalled();
    await expect(apiRequest('/api/patients/p1')).resolves.toEqual({ path: 'network' });
    expect(fetch).toHaveBeenCalledTimes(1);
    // A write never takes a read.
    await apiRequest('/api/auth/me', { method: 'POST', body: {} });
    expect(fetch).toHaveBeenCalledTimes(2);
  });

  it('leaves a read untaken for too long to the network', () => {
    const { page } = fakePage('/patients/p1');
    startEarlyReads(page as unknown as Window, []);
    vi.stubGlobal('window', page);
    vi.stubGlobal('performance', { now: () => 60_000 });
    expect(takeEarlyRead('/api/auth/me')).toBeUndefined();
    expect(takeEarlyRead('/api/nothing')).toBeUndefined();
  });
});
