import { NonIdealState } from '@blueprintjs/core';
import { Link } from 'react-router-dom';

export function NotFoundRoute() {
  return (
    <>
      <title>Not found · Torquetrail</title>
      <NonIdealState
        icon="search"
        title="No such page"
        description="The address does not match any page of Torquetrail."
        action={<Link to="/patients">Go to Patients</Link>}
      />
    </>
  );
}
