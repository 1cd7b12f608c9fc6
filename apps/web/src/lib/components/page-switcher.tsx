// The one pager of the paged lists (Recall desk, outcomes): Previous, where you are, Next. A page
// past the end (an old link, or rows gone since) says so, and Previous leads to the last page.
import { Button } from '@blueprintjs/core';
import './page-switcher.css';

export interface PagerState {
  lastPage: number;
  label: string;
  previous: number | null;
  next: number | null;
}

export function pagerState(page: number, pageSize: number, total: number): PagerState {
  const lastPage = Math.max(1, Math.ceil(total / pageSize));
  return {
    lastPage,
    label: page <= lastPage ? `Page ${page} of ${lastPage}` : `Page ${page} is past the last page, ${lastPage}`,
    previous: page > 1 ? Math.min(page - 1, lastPage) : null,
    next: page < lastPage ? page + 1 : null,
  };
}

export function PageSwitcher(props: {
  page: number;
  pageSize: number;
  total: number;
  /** Names the list the pages belong to, for screen readers. */
  label: string;
  onGo: (page: number) => void;
}) {
  const state = pagerState(props.page, props.pageSize, props.total);
  return (
    <nav className="page-switcher" aria-label={props.label}>
      <Button
        icon="chevron-left"
        disabled={state.previous === null}
        onClick={() => state.previous !== null && props.onGo(state.previous)}
      >
        Previous
      </Button>
      <span data-testid="page-switcher-position">{state.label}</span>
      <Button
        endIcon="chevron-right"
        disabled={state.next === null}
        onClick={() => state.next !== null && props.onGo(state.next)}
      >
        Next
      </Button>
    </nav>
  );
}
