const DEFAULT_PATH = '/patients';

/** The sign-in page's URL, remembering where the user wanted to go. */
export function signInPath(wanted: string): string {
  if (wanted === '/' || wanted === DEFAULT_PATH) return '/sign-in';
  return `/sign-in?from=${encodeURIComponent(wanted)}`;
}

/** The sign-in page after an idle sign-out: it says why, and goes back to the page after. */
export function idleSignInPath(wanted: string): string {
  const path = signInPath(wanted);
  return `${path}${path.includes('?') ? '&' : '?'}reason=idle`;
}

/** Only same-app paths are followed after sign-in (no `//host` or absolute URLs). */
export function safeReturnPath(raw: string | null): string {
  if (!raw || !raw.startsWith('/') || raw.startsWith('//') || raw.startsWith('/\\') || raw.startsWith('/sign-in')) {
    return DEFAULT_PATH;
  }
  return raw;
}
