import '../components/sign-in.css';
import { Callout, Card } from '@blueprintjs/core';
import { Link, Navigate, useSearchParams } from 'react-router-dom';
import { LoadingState } from '../../../lib/components/loading-state';
import { safeReturnPath } from '../../../lib/return-path';
import { useMe } from '../api/get-me';
import { SignInForm } from '../components/sign-in-form';

/** /sign-in: once signed in, goes on to the page the user wanted (or Patients). */
export function SignInRoute() {
  const me = useMe();
  const [params] = useSearchParams();
  const returnTo = safeReturnPath(params.get('from'));

  if (me.isPending) return <LoadingState label="Checking your session" />;
  if (me.data) return <Navigate to={returnTo} replace />;

  return (
    <main className="sign-in-page" id="main">
      <title>Sign in · Torquetrail</title>
      <Card className="sign-in-page__card" elevation={2}>
        <h1 className="sign-in-page__product">Torquetrail</h1>
        <p className="sign-in-page__tagline">
          Every implant's parts, torque and recalls in one ledger, for as long as the implant lasts.
        </p>
        {params.get('reason') === 'idle' && (
          <Callout intent="primary" icon="time" role="status" className="sign-in-page__notice">
            You were signed out because Torquetrail was not used for a while. Sign in to go on where you left off; what
            you were typing is kept.
          </Callout>
        )}
        <SignInForm />
        <p className="sign-in-page__links">
          <Link to="/forgot-password">Forgotten your password?</Link>
        </p>
      </Card>
    </main>
  );
}
