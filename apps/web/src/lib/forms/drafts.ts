// What a form holds when the session ends under it (idle sign-out, a session ended elsewhere) is
// kept in this tab's sessionStorage, keyed by the page and the form, and put back into the same
// form after signing in again. Only for the user who typed it; never for password forms.
const PREFIX = 'tt-draft:';
const sources = new Map<string, () => unknown>();
let owner: string | null = null;

/** Who is signed in (set by the app's auth gate): drafts are kept for and restored to them only. */
export function setDraftOwner(userId: string | null): void {
  owner = userId;
}

/** A mounted form offers its values; the returned function withdraws them (on unmount). */
export function offerDraft(key: string, values: () => unknown): () => void {
  sources.set(key, values);
  return () => {
    if (sources.get(key) === values) sources.delete(key);
  };
}

/** Keeps every mounted form's values (called just before the session ends). */
export function keepDrafts(): void {
  if (!owner) return;
  for (const [key, values] of sources) {
    try {
      sessionStorage.setItem(PREFIX + key, JSON.stringify({ owner, values: values() }));
    } catch {
      // Storage full or unavailable: the draft is lost, as it would have been before.
    }
  }
}

/** The values kept for this form and this user, removed as they are taken. */
export function takeDraft(key: string): unknown {
  const raw = sessionStorage.getItem(PREFIX + key);
  if (raw === null) return undefined;
  sessionStorage.removeItem(PREFIX + key);
  try {
    const kept = JSON.parse(raw) as { owner?: unknown; values?: unknown };
    return kept.owner === owner ? kept.values : undefined;
  } catch {
    return undefined;
  }
}
