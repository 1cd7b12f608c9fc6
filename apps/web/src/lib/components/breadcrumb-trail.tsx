import { Classes } from '@blueprintjs/core';
import { Link } from 'react-router-dom';

export interface Crumb {
  text: string;
  /** Router path; the last crumb (the current page) has none. */
  to?: string;
}

/**
 * Breadcrumbs in Blueprint's look with router links. Blueprint's own <Breadcrumbs> collapses
 * overflow into a popover, which would pull the popover machinery into every page for trails
 * that never exceed three items.
 */
export function BreadcrumbTrail({ items }: { items: readonly Crumb[] }) {
  return (
    <nav aria-label="Breadcrumb" className="breadcrumb-trail">
      <ol className={Classes.BREADCRUMBS}>
        {items.map((item, index) => {
          const current = index === items.length - 1;
          return (
            <li key={item.text}>
              {current ? (
                <span className={`${Classes.BREADCRUMB} ${Classes.BREADCRUMB_CURRENT}`} aria-current="page">
                  {item.text}
                </span>
              ) : item.to ? (
                <Link to={item.to} className={Classes.BREADCRUMB}>
                  {item.text}
                </Link>
              ) : (
                <span className={Classes.BREADCRUMB}>{item.text}</span>
              )}
            </li>
          );
        })}
      </ol>
    </nav>
  );
}
