import { Button, Callout, InputGroup } from '@blueprintjs/core';
import { type CompletePasswordResetBody, completePasswordResetForm } from '@torquetrail/contracts';
import { useMemo } from 'react';
import { FormProvider } from 'react-hook-form';
import { Link } from 'react-router-dom';
import { LoadingState } from '../../../lib/components/loading-state';
import { applyServerErrors, FormField, formErrorMessage, useContractForm, withInputRef } from '../../../lib/forms';
import { useCompleteReset, useResetPreview } from '../api/account-api';
import { useLinkToken } from '../components/link-token';
import { PASSWORD_HELP, PublicPage } from '../components/public-page';
import { runMutation } from '../../../lib/run-mutation';

/** /reset-password#token=…: a new password from a mailed link; every session of the account ends. */
export function ResetPasswordRoute() {
  const token = useLinkToken();
  const preview = useResetPreview(token);
  if (preview.isPending) return <LoadingState label="Opening your reset link" />;
  if (preview.isError)
    return (
      <PublicPage title="This reset link cannot be used">
        <Callout intent="warning" role="alert" className="sign-in-page__notice">
          {preview.error.message}
        </Callout>
        <p className="sign-in-page__links">
          <Link to="/forgot-password">Ask for a new link</Link> · <Link to="/sign-in">Sign in</Link>
        </p>
      </PublicPage>
    );
  return (
    <PublicPage title="Choose a new password">
      <ResetForm token={token} email={preview.data.email} />
    </PublicPage>
  );
}

function ResetForm({ token, email }: { token: string; email: string }) {
  const schema = useMemo(() => completePasswordResetForm(email), [email]);
  const form = useContractForm(schema, { token, password: '' }, { keepDraft: false });
  const complete = useCompleteReset();
  const submit = (body: CompletePasswordResetBody) =>
    runMutation(complete, body, { onError: (error) => applyServerErrors(form.setError, error) });
  const message = formErrorMessage(form.formState.errors, 'alone');
  if (complete.isSuccess)
    return (
      <>
        <Callout intent="success" role="status" className="sign-in-page__notice">
          Your password is changed, and every session of {email} was signed out.
        </Callout>
        <Link to="/sign-in" className="bp6-button bp6-intent-primary bp6-fill bp6-large">
          Sign in
        </Link>
      </>
    );
  return (
    <FormProvider {...form}>
      <p>For {email}.</p>
      {message && (
        <Callout intent="danger" role="alert" className="sign-in-page__notice">
          {message}
        </Callout>
      )}
      <form onSubmit={(event) => void form.handleSubmit(submit)(event)} noValidate aria-label="Choose a new password">
        <FormField name="password" label="New password" labelFor="reset-password" help={PASSWORD_HELP}>
          {(a11y) => (
            <InputGroup
              id="reset-password"
              type="password"
              autoComplete="new-password"
              autoFocus
              {...a11y}
              {...withInputRef(form.register('password'))}
            />
          )}
        </FormField>
        <Button
          type="submit"
          intent="primary"
          text="Save the new password"
          fill
          size="large"
          loading={complete.isPending}
        />
      </form>
    </FormProvider>
  );
}
