import { describe, expect, it } from 'vitest';
import { pagerState } from './page-switcher';

describe('pagerState', () => {
  it('counts whole pages, and an empty list still has its one page', () => {
    expect(pagerState(1, 50, 0)).toEqual({ lastPage: 1, label: 'Page 1 of 1', previous: null, next: null });
    expect(pagerState(1, 50, 50)).toMatchObject({ lastPage: 1, next: null });
    expect(pagerState(1, 50, 51)).toMatchObject({ lastPage: 2, label: 'Page 1 of 2', next: 2 });
    expect(pagerState(2, 50, 51)).toMatchObject({ label: 'Page 2 of 2', previous: 1, next: null });
  });

  it('a page past the end says so, and Previous leads to the last page rather than one back', () => {
    expect(pagerState(2, 50, 20)).toEqual({
      lastPage: 1,
      label: 'Page 2 is past the last page, 1',
      previous: 1,
      next: null,
    });
    expect(pagerState(9, 50, 120)).toMatchObject({ lastPage: 3, previous: 3, next: null });
  });
});
