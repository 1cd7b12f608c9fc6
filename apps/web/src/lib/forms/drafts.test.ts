import { beforeEach, describe, expect, it } from 'vitest';
import { keepDrafts, offerDraft, setDraftOwner, takeDraft } from './drafts';

// sessionStorage as the browser has it, for the unit tier (node).
const store = new Map<string, string>();
Object.assign(globalThis, {
  sessionStorage: {
    getItem: (k: string) => store.get(k) ?? null,
    setItem: (k: string, v: string) => void store.set(k, v),
    removeItem: (k: string) => void store.delete(k),
  },
});

describe('drafts kept across a forced sign-out', () => {
  beforeEach(() => store.clear());

  it('keeps the mounted forms and gives each back once, to the same user only', () => {
    setDraftOwner('user-a');
    const withdraw = offerDraft('/patients/1#f1', () => ({ notes: 'half a sentence' }));
    keepDrafts();
    withdraw();
    expect(takeDraft('/patients/1#f1')).toEqual({ notes: 'half a sentence' });
    expect(takeDraft('/patients/1#f1')).toBeUndefined();

    offerDraft('/recalls#f2', () => ({ search: 'Farrow' }))();
    const again = offerDraft('/recalls#f2', () => ({ search: 'Farrow' }));
    keepDrafts();
    again();
    setDraftOwner('user-b');
    expect(takeDraft('/recalls#f2')).toBeUndefined();
  });

  it('keeps nothing when nobody is signed in', () => {
    setDraftOwner(null);
    const withdraw = offerDraft('/x#f', () => ({ a: 1 }));
    keepDrafts();
    withdraw();
    expect(store.size).toBe(0);
  });
});
