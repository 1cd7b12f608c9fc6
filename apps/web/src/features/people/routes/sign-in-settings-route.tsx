import { Button, Callout, Radio, RadioGroup } from '@blueprintjs/core';
import { DATE_FORMATS, DATE_TYPING_EXAMPLE, IDLE_SIGN_OUT_MINUTES, SessionSettings } from '@torquetrail/contracts';
import { FormProvider, useController } from 'react-hook-form';
import { ErrorState } from '../../../lib/components/error-state';
import { LoadingState } from '../../../lib/components/loading-state';
import { applyServerErrors, FormField, formErrorMessage, NumberInput, useContractForm } from '../../../lib/forms';
import { formatDateAs } from '../../../lib/dates';
import { DATE_FORMAT_LABEL } from '../../../lib/labels';
import { useSaveSessionSettings, useSessionSettings } from '../api/people-api';
import { runMutation } from '../../../lib/run-mutation';

/** /practice/sign-in: how long an unattended session stays open, and how the practice writes dates. */
export function SignInSettingsRoute() {
  const settings = useSessionSettings();
  return (
    <div>
      <title>Sign-in and date settings · Practice · Torquetrail</title>
      <h1 className="page-title">Sign-in and date settings</h1>
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
        <FormField
          name="dateFormat"
          help="For everyone in the practice, on screen and on the documents it prints. Numbers typed in a date field are read in this order; a month in words is always understood."
        >
          <DateFormatChoice />
        </FormField>
        <Button type="submit" intent="primary" loading={save.isPending}>
          Save
        </Button>
        {save.isSuccess && (
          <Callout intent="success" role="status">
            Saved. It applies from each person&apos;s next page load (the date format from your next page load too).
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

/** The example date beside each order: the same day, as it would be shown and typed. */
const EXAMPLE_DAY = '2026-03-12';

function DateFormatChoice() {
  const { field } = useController({ name: 'dateFormat' });
  return (
    <RadioGroup
      label="Write and type dates as"
      name={field.name}
      selectedValue={field.value as string}
      onChange={(event) => field.onChange(event.currentTarget.value)}
    >
      {DATE_FORMATS.map((format) => (
        <Radio
          key={format}
          value={format}
          inputRef={format === DATE_FORMATS[0] ? field.ref : undefined}
          label={`${DATE_FORMAT_LABEL[format]}: shown ${formatDateAs(EXAMPLE_DAY, format)}, typed ${DATE_TYPING_EXAMPLE[format]}`}
        />
      ))}
    </RadioGroup>
  );
}
