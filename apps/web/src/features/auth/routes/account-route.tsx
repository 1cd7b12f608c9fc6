import { Button, Callout, InputGroup } from '@blueprintjs/core';
import { type ChangePasswordBody, changePasswordForm } from '@torquetrail/contracts';
import { useMemo } from 'react';
import { FormProvider } from 'react-hook-form';
import { isApiError } from '../../../lib/api-client';
import { LoadingState } from '../../../lib/components/loading-state';
import { applyServerErrors, FormField, formErrorMessage, useContractForm, withInputRef } from '../../../lib/forms';
import { useChangePassword } from '../api/account-api';
import { useMe } from '../api/get-me';
import { PASSWORD_HELP } from '../components/public-page';
import { runMutation } from '../../../lib/run-mutation';

/** /account: one's own password (everyone). */
export function AccountRoute() {
  const me = useMe();
  if (!me.data) return <LoadingState label="Loading your account" />;
  return (
    <div className="account">
      <title>Your account · Torquetrail</title>
      <h1 className="page-title">Your account</h1>
      <p>
        {me.data.displayName} · {me.data.email}
      </p>
      <h2>Change your password</h2>
      <ChangePasswordForm email={me.data.email} />
    </div>
  );
}

function ChangePasswordForm({ email }: { email: string }) {
  const schema = useMemo(() => changePasswordForm(email), [email]);
  const form = useContractForm(schema, { currentPassword: '', newPassword: '' }, { keepDraft: false });
  const change = useChangePassword();
  const submit = (body: ChangePasswordBody) =>
    runMutation(change, body, {
      onSuccess: () => form.reset({ currentPassword: '', newPassword: '' }),
      onError: (error) =>
        applyServerErrors(
          form.setError,
          error,
          isApiError(error, 429) ? { message: 'Too many attempts, wait a minute' } : {},
        ),
    });
  const message = formErrorMessage(form.formState.errors, 'alone');
  return (
    <FormProvider {...form}>
      <form
        className="account__form"
        onSubmit={(event) => void form.handleSubmit(submit, () => change.reset())(event)}
        noValidate
        aria-label="Change your password"
      >
        <FormField name="currentPassword" label="Current password" labelFor="current-password">
          {(a11y) => (
            <InputGroup
              id="current-password"
              type="password"
              autoComplete="current-password"
              {...a11y}
              {...withInputRef(form.register('currentPassword'))}
            />
          )}
        </FormField>
        <FormField name="newPassword" label="New password" labelFor="new-password" help={PASSWORD_HELP}>
          {(a11y) => (
            <InputGroup
              id="new-password"
              type="password"
              autoComplete="new-password"
              {...a11y}
              {...withInputRef(form.register('newPassword'))}
            />
          )}
        </FormField>
        <Button type="submit" intent="primary" loading={change.isPending}>
          Change password
        </Button>
        {change.isSuccess && (
          <Callout intent="success" role="status">
            Password changed. Your other sessions were signed out; this one goes on.
          </Callout>
        )}
        {message && (
          <Callout intent="danger" role="alert">
            {message}
          </Callout>
        )}
      </form>
    </FormProvider>
  );
}
