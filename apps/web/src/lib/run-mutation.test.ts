// A form's follow-up after a save (open the next form, navigate, show the server's field errors)
// must not depend on the form still being mounted when the reply lands: the save's own refetch
// often unmounts it. Seen: after a delivery, the seating form sometimes never opened.
import { MutationObserver, QueryClient } from '@tanstack/react-query';
import { describe, expect, it } from 'vitest';
import { runMutation } from './run-mutation';

/** A mutation whose reply the test releases, observed the way useMutation observes it. */
function heldMutation() {
  let release: (value: string) => void = () => {};
  const reply = new Promise<string>((resolve) => (release = resolve));
  const observer = new MutationObserver<string, Error, string>(new QueryClient(), { mutationFn: () => reply });
  const unmount = observer.subscribe(() => {}); // useMutation subscribes while mounted
  return { observer, unmount, release };
}

const settle = () => new Promise((resolve) => setTimeout(resolve, 10));

describe('runMutation', () => {
  it('runs the follow-up after the caller unmounted (per-call mutate callbacks are dropped)', async () => {
    const dropped = heldMutation();
    const seen: string[] = [];
    const saved = dropped.observer.mutate('a', { onSuccess: (data) => seen.push(`mutate: ${data}`) });
    dropped.unmount();
    dropped.release('saved');
    await settle();
    expect(await saved).toBe('saved'); // it did succeed…
    expect(seen).toEqual([]); // …but the callback was dropped: why this module exists

    const kept = heldMutation();
    runMutation({ mutateAsync: (v: string) => kept.observer.mutate(v) }, 'a', {
      onSuccess: (data) => seen.push(`runMutation: ${data}`),
      onSettled: () => seen.push('settled'),
    });
    kept.unmount();
    kept.release('saved');
    await settle();
    expect(seen).toEqual(['runMutation: saved', 'settled']);
  });

  it('hands a failure to onError, then onSettled', async () => {
    const seen: string[] = [];
    runMutation({ mutateAsync: () => Promise.reject(new Error('refused')) }, null, {
      onSuccess: () => seen.push('success'),
      onError: (error) => seen.push(error.message),
      onSettled: () => seen.push('settled'),
    });
    await settle();
    expect(seen).toEqual(['refused', 'settled']);
  });
});

// Vite reads the sources as text (the web's type-check has no Node types).
const sources: Record<string, string> = import.meta.glob(['../**/*.{ts,tsx}', '!../**/*.test.{ts,tsx}'], {
  query: '?raw',
  import: 'default',
  eager: true,
});

/** Each `x.mutate(` call given a second argument (per-call callbacks), as "file: first line". */
function mutateCallsWithCallbacks(file: string, text: string): string[] {
  const found: string[] = [];
  for (const match of text.matchAll(/\.mutate\(/g)) {
    let depth = 0;
    let quote: string | null = null;
    let secondArgument = false;
    for (let i = match.index + match[0].length - 1; i < text.length; i++) {
      const c = text[i];
      if (quote) {
        if (c === '\\') i++;
        else if (c === quote) quote = null;
      } else if (c === "'" || c === '"' || c === '`') quote = c;
      else if ('([{'.includes(c)) depth++;
      else if (')]}'.includes(c) && --depth === 0) break;
      else if (c === ',' && depth === 1 && !/^\s*\)/.test(text.slice(i + 1))) secondArgument = true;
    }
    if (secondArgument) found.push(`${file}: ${text.slice(match.index, text.indexOf('\n', match.index))}`);
  }
  return found;
}

describe('no per-call callbacks on mutate in the web sources', () => {
  it('the scan catches one, and passes a call without', () => {
    expect(Object.keys(sources).length).toBeGreaterThan(100);
    expect(
      mutateCallsWithCallbacks('a', "save.mutate(\n  { id, body: f('x, y') },\n  { onSuccess: done },\n)"),
    ).toHaveLength(1);
    expect(mutateCallsWithCallbacks('a', 'save.mutate({ id, body: [a, b] },)')).toEqual([]);
    expect(mutateCallsWithCallbacks('a', 'revoke.mutate(id)')).toEqual([]);
  });

  it('every follow-up goes through runMutation', () => {
    const offenders = Object.entries(sources).flatMap(([file, text]) => mutateCallsWithCallbacks(file, text));
    expect(offenders).toEqual([]);
  });
});
