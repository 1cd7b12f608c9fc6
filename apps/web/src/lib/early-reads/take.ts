// The app's side of the early reads (start.ts): `apiRequest` takes the reply of a read the page
// already started instead of sending the same request again.
import { EARLY_READS_KEY, type EarlyReads } from './start';

/**
 * How long an early read stays usable. The app takes its reads while it starts (the router's first
 * loaders); a read not taken by then belongs to a page that did not need it, and a session or
 * patient read much later must be read anew, not from the moment the page loaded.
 */
const USABLE_FOR_MS = 30_000;

/** The reply of the page's early read of `path`, once: the next request of the path goes out. */
export function takeEarlyRead(path: string): Promise<Response> | undefined {
  if (typeof window === 'undefined') return undefined;
  const reads = (window as unknown as Record<string, EarlyReads | undefined>)[EARLY_READS_KEY];
  const read = reads?.[path];
  if (!reads || !read) return undefined;
  delete reads[path];
  return performance.now() - read.startedAt <= USABLE_FOR_MS ? read.reply : undefined;
}
