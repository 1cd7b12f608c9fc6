import '../components/people.css';
import { Classes } from '@blueprintjs/core';
import { NavLink, Outlet } from 'react-router-dom';

const linkClass = ({ isActive }: { isActive: boolean }) =>
  `${Classes.BUTTON} ${Classes.MINIMAL} ${Classes.ALIGN_LEFT}${isActive ? ` ${Classes.ACTIVE}` : ''}`;

/**
 * /practice: the practice administrator's screen. Its own pages sit under /practice; the
 * practice's other settings (catalogue, recall policy, reminder log) are linked where they live.
 */
export function PracticeRoute() {
  return (
    <div className="practice">
      <nav aria-label="Practice" className="practice__nav">
        <NavLink to="/practice/people" className={linkClass}>
          People
        </NavLink>
        <NavLink to="/practice/sign-in" className={linkClass}>
          Sign-in settings
        </NavLink>
        <NavLink to="/practice/patient-settings" className={linkClass}>
          Chart numbers
        </NavLink>
        <NavLink to="/practice/audit" className={linkClass}>
          Audit trail
        </NavLink>
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
      </nav>
      <div>
        <Outlet />
      </div>
    </div>
  );
}
