import { NonIdealState } from '@blueprintjs/core';
import type { Me } from '@torquetrail/contracts';
import { Link, Outlet, useMatches } from 'react-router-dom';
import { useAppAbility } from '../lib/ability';
import { ROLE_LABEL } from '../lib/labels';
import type { PageHandle } from '../lib/page-access';

const isPageHandle = (handle: unknown): handle is PageHandle =>
  typeof handle === 'object' && handle !== null && 'access' in handle;

/**
 * The page, or a plain "not available to your role" when the signed-in user's ability does not
 * allow what the page (or a page around it) needs: a URL typed by hand never opens a dead form or
 * a red error from a refused read.
 */
export function PageGate({ me }: { me: Me }) {
  const ability = useAppAbility();
  const denied = useMatches()
    .map((m) => m.handle)
    .filter(isPageHandle)
    .some(({ access }) => access !== null && !ability.can(access.action, access.subject));
  if (!denied) return <Outlet />;
  return (
    <>
      <title>Not available · Torquetrail</title>
      <NonIdealState
        className="page-not-available"
        icon="lock"
        title="Not available to your role"
        description={`This page is not part of what a ${ROLE_LABEL[me.role].toLowerCase()} does in Torquetrail. Ask your practice administrator if you need it.`}
        action={<Link to="/patients">Go to Patients</Link>}
      />
    </>
  );
}
