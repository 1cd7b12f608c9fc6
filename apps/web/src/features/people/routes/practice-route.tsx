import '../components/people.css';
import { Classes } from '@blueprintjs/core';
import { Navigate, NavLink, Outlet } from 'react-router-dom';
import { Can, useAppAbility } from '../../../lib/ability';

const linkClass = ({ isActive }: { isActive: boolean }) =>
  `${Classes.BUTTON} ${Classes.MINIMAL} ${Classes.ALIGN_LEFT}${isActive ? ` ${Classes.ACTIVE}` : ''}`;

/** /practice itself: the first page the user may open (People for the administrator, Shares for the dentist). */
export function PracticeHome() {
  const ability = useAppAbility();
  return <Navigate to={ability.can('read', 'User') ? '/practice/people' : '/practice/shares'} replace />;
}

/**
 * /practice: the practice administrator's screen (the dentist's Shares too). Its own pages sit under /practice; the
 * practice's other settings (catalogue, recall policy, reminder log) are linked where they live.
 */
export function PracticeRoute() {
  return (
    <div className="practice">
      <nav aria-label="Practice" className="practice__nav">
        <Can I="read" a="User">
          <NavLink to="/practice/people" className={linkClass}>
            People
          </NavLink>
          <NavLink to="/practice/sign-in" className={linkClass}>
            Sign-in and dates
          </NavLink>
          <NavLink to="/practice/contact" className={linkClass}>
            Practice contact
          </NavLink>
          <NavLink to="/practice/patient-settings" className={linkClass}>
            Chart numbers
          </NavLink>
        </Can>
        <Can I="read" a="Share">
          <NavLink to="/practice/shares" className={linkClass}>
            Shares
          </NavLink>
        </Can>
        <Can I="read" a="AuditEntry">
          <NavLink to="/practice/audit" className={linkClass}>
            Audit trail
          </NavLink>
        </Can>
        <Can I="update" a="Catalogue">
          <p className="practice__nav-heading">Elsewhere</p>
          <NavLink to="/catalogue" className={linkClass}>
            Component catalogue
          </NavLink>
          <NavLink to="/recalls/policy" className={linkClass}>
            Recall policy
          </NavLink>
          <NavLink to="/recalls/reminders" className={linkClass}>
            Reminder log
          </NavLink>
        </Can>
      </nav>
      <div>
        <Outlet />
      </div>
    </div>
  );
}
