import { Alignment, Button, Classes, Navbar, NavbarDivider, NavbarGroup, NavbarHeading, Tag } from '@blueprintjs/core';
import type { Me } from '@torquetrail/contracts';
import type { MouseEvent } from 'react';
import { Link, NavLink, useMatch } from 'react-router-dom';
import { Can, useAppAbility } from '../lib/ability';
import { ROLE_LABEL } from '../lib/labels';
import { PageGate } from './page-gate';
// Not deferred like the idle sign-out: a page printed as soon as it shows must carry its frame.
import { PrintFrame } from './print-frame';

interface AppShellProps {
  me: Me;
  onSignOut: () => void;
  signingOut: boolean;
  signOutError: Error | null;
}

/** Moves focus to the page without putting a fragment into the router's URL. */
function skipToContent(event: MouseEvent<HTMLAnchorElement>) {
  event.preventDefault();
  document.getElementById('main')?.focus();
}

/** The top bar (product, Patients, who is signed in, Sign out) and the page below it. */
export function AppShell({ me, onSignOut, signingOut, signOutError }: AppShellProps) {
  const onPatientList = useMatch('/patients') !== null;
  const ability = useAppAbility();
  // The practice administrator's screen, which also holds the dentist's list of shares.
  const seesPractice = ability.can('read', 'User') || ability.can('read', 'Share');
  return (
    <>
      <a className="skip-link" href="#main" onClick={skipToContent}>
        Skip to content
      </a>
      <header>
        <Navbar className="app-navbar">
          <NavbarGroup align={Alignment.START}>
            <NavbarHeading>
              <Link to="/patients" className="app-navbar__product">
                Torquetrail
              </Link>
            </NavbarHeading>
            <NavbarDivider />
            <nav aria-label="Main">
              <NavLink
                to="/patients"
                // Highlighted on every patient page; aria-current="page" only on the list itself.
                aria-current={onPatientList ? 'page' : 'true'}
                className={({ isActive }) =>
                  `${Classes.BUTTON} ${Classes.MINIMAL}${isActive ? ` ${Classes.ACTIVE}` : ''}`
                }
              >
                Patients
              </NavLink>
              <NavLink
                to="/recalls"
                className={({ isActive }) =>
                  `${Classes.BUTTON} ${Classes.MINIMAL}${isActive ? ` ${Classes.ACTIVE}` : ''}`
                }
              >
                Recall desk
              </NavLink>
              <NavLink
                to="/catalogue"
                className={({ isActive }) =>
                  `${Classes.BUTTON} ${Classes.MINIMAL}${isActive ? ` ${Classes.ACTIVE}` : ''}`
                }
              >
                Catalogue
              </NavLink>
              <Can I="read" a="Outcomes">
                <NavLink
                  to="/outcomes"
                  className={({ isActive }) =>
                    `${Classes.BUTTON} ${Classes.MINIMAL}${isActive ? ` ${Classes.ACTIVE}` : ''}`
                  }
                >
                  Outcomes
                </NavLink>
              </Can>
              <Can I="read" a="LotTrace">
                <NavLink
                  to="/lot-lookup"
                  className={({ isActive }) =>
                    `${Classes.BUTTON} ${Classes.MINIMAL}${isActive ? ` ${Classes.ACTIVE}` : ''}`
                  }
                >
                  Lot look-up
                </NavLink>
              </Can>
              <Can I="create" a="LegacyImport">
                <NavLink
                  to="/import-records"
                  className={({ isActive }) =>
                    `${Classes.BUTTON} ${Classes.MINIMAL}${isActive ? ` ${Classes.ACTIVE}` : ''}`
                  }
                >
                  Import
                </NavLink>
              </Can>
              {seesPractice && (
                <NavLink
                  to="/practice"
                  className={({ isActive }) =>
                    `${Classes.BUTTON} ${Classes.MINIMAL}${isActive ? ` ${Classes.ACTIVE}` : ''}`
                  }
                >
                  Practice
                </NavLink>
              )}
            </nav>
          </NavbarGroup>
          <NavbarGroup align={Alignment.END}>
            <Link to="/account" className="app-navbar__user" title="Your account and password">
              <span className="app-navbar__name">{me.displayName}</span>
              <span className="app-navbar__meta">
                {ROLE_LABEL[me.role]} · {me.practiceName}
              </span>
            </Link>
            <NavbarDivider />
            {signOutError && (
              <Tag intent="danger" minimal role="alert" className="app-navbar__error">
                Sign-out failed: {signOutError.message}
              </Tag>
            )}
            <Button variant="minimal" icon="log-out" text="Sign out" onClick={onSignOut} loading={signingOut} />
          </NavbarGroup>
        </Navbar>
      </header>
      <PrintFrame me={me} />
      <main className="page" id="main" tabIndex={-1}>
        <PageGate me={me} />
      </main>
    </>
  );
}
