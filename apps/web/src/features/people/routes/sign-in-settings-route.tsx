import { Button, Callout } from '@blueprintjs/core';
import { IDLE_SIGN_OUT_MINUTES, SessionSettings } from '@torquetrail/contracts';
import { FormProvider } from 'react-hook-form';
import { ErrorState } from '../../../lib/components/error-state';
import { LoadingState } from '../../../lib/components/loading-state';
import { applyServerErrors, FormField, formErrorMessage, NumberInput, useContractForm } from '../../../lib/forms';
import { useSaveSessionSettings, useSessionSettings } from '../api/people-api';
import { runMutation } from '../../../lib/run-mutation';

/** /practice/sign-in: how long an unattended session stays open. */
export function SignInSettingsRoute() {
  const settings = useSessionSettings();
  return (
    <div>
      <title>Sign-in settings · Practice · Torquetrail</title>
      <h1 className="page-title">Sign-in settings</h1>
      <p>
        A workstation left unattended signs out by itself (automatic logoff, HIPAA 45 CFR 164.312(a)(2)(iii)). A minute
        before, a warning offers to stay signed in; what was being typed is kept for after signing in again. Whatever
        the activity, everyone signs in again 12 hours after signing in.
      </p>
      {settings.isPending ? (
        <LoadingState label="Loading the sign-in settings" />
      ) : settings.isError ? (
        <ErrorState
          title="Could not load the settings"
          error={settings.error}
          onRetry={() => void settings.refetch()}
        />
      ) : (
        <IdleForm current={settings.data} />
      )}
    </div>
  );
}

function IdleForm({ current }: { current: SessionSettings }) {
  const save = useSaveSessionSettings();
  const form = useContractForm(SessionSettings, current);
  const submit = (body: SessionSettings) =>
    runMutation(save, body, { onError: (error) => applyServerErrors(form.setError, error) });
  const message = formErrorMessage(form.formState.errors, 'alone');
  return (
    <FormProvider {...form}>
      <form noValidate onSubmit={(event) => void form.handleSubmit(submit, () => save.reset())(event)}>
        <FormField
          name="idleSignOutMinutes"
          label="Sign out after this many minutes without use"
          labelFor="idle-minutes"
          help={`${IDLE_SIGN_OUT_MINUTES.min} to ${IDLE_SIGN_OUT_MINUTES.max} minutes; ${IDLE_SIGN_OUT_MINUTES.default} unless the practice changes it.`}
        >
          <NumberInput
            name="idleSignOutMinutes"
            id="idle-minutes"
            buttonPosition="none"
            min={IDLE_SIGN_OUT_MINUTES.min}
            max={IDLE_SIGN_OUT_MINUTES.max}
          />
        </FormField>
        <Button type="submit" intent="primary" loading={save.isPending}>
          Save
        </Button>
        {save.isSuccess && (
          <Callout intent="success" role="status">
            Saved. It applies from each person&apos;s next page load.
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
