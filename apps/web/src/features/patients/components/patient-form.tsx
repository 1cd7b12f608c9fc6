// The patient's record as one form, for "New patient" and "Edit". Values are a draft of text
// inputs mapped to the contract's body (draftSchema), so the messages beside the fields are the
// API's own; a refused save keeps every value and puts the server's messages beside the fields.
import { Button, Callout, Checkbox, HTMLSelect, InputGroup } from '@blueprintjs/core';
import {
  PATIENT_SEXES,
  PREFERRED_LANGUAGES,
  type PatientDetail,
  type PatientSex,
  type PreferredLanguage,
} from '@torquetrail/contracts';
import type { ReactNode } from 'react';
import { FormProvider, type UseFormReturn } from 'react-hook-form';
import { DateField, FormField, formErrorMessage, withInputRef } from '../../../lib/forms';
import { PATIENT_FIELD_LABEL, PATIENT_SEX_LABEL, PREFERRED_LANGUAGE_LABEL } from '../../../lib/labels';

/** The form's values: text as typed ('' for "not given"). */
export interface PatientDraft {
  chartNumber: string;
  givenName: string;
  familyName: string;
  birthDate: string;
  sex: PatientSex;
  email: string;
  phone: string;
  preferredLanguage: PreferredLanguage;
  emailReminderConsent: boolean;
  emailReminderConsentOn: string;
  smoker: boolean;
  diabetesPoorlyControlled: boolean;
  periodontitisHistory: boolean;
  riskFactorsRecordedOn: string;
}

const orNull = (text: string) => (text.trim() === '' ? null : text.trim());

/** Every field of the draft as the body's value. */
export const draftToRecord = (d: PatientDraft) => ({
  givenName: d.givenName,
  familyName: d.familyName,
  birthDate: d.birthDate.trim(),
  sex: d.sex,
  email: orNull(d.email),
  phone: orNull(d.phone),
  preferredLanguage: d.preferredLanguage,
  emailReminderConsent: d.emailReminderConsent,
  emailReminderConsentOn: orNull(d.emailReminderConsentOn),
  smoker: d.smoker,
  diabetesPoorlyControlled: d.diabetesPoorlyControlled,
  periodontitisHistory: d.periodontitisHistory,
  riskFactorsRecordedOn: orNull(d.riskFactorsRecordedOn),
});

export const emptyDraft = (today: string): PatientDraft => ({
  chartNumber: '',
  givenName: '',
  familyName: '',
  birthDate: '',
  sex: 'not-recorded',
  email: '',
  phone: '',
  preferredLanguage: 'en',
  emailReminderConsent: false,
  emailReminderConsentOn: '',
  smoker: false,
  diabetesPoorlyControlled: false,
  periodontitisHistory: false,
  riskFactorsRecordedOn: today,
});

export const draftOf = (p: PatientDetail): PatientDraft => ({
  chartNumber: p.chartNumber,
  givenName: p.givenName,
  familyName: p.familyName,
  birthDate: p.birthDate,
  sex: p.sex ?? 'not-recorded',
  email: p.contact?.email ?? '',
  phone: p.contact?.phone ?? '',
  preferredLanguage: p.contact?.preferredLanguage ?? 'en',
  emailReminderConsent: p.contact?.emailReminderConsent ?? false,
  emailReminderConsentOn: p.contact?.emailReminderConsentOn ?? '',
  smoker: p.riskFactors?.smoker ?? false,
  diabetesPoorlyControlled: p.riskFactors?.diabetesPoorlyControlled ?? false,
  periodontitisHistory: p.riskFactors?.periodontitisHistory ?? false,
  riskFactorsRecordedOn: p.riskFactorsRecordedOn ?? '',
});

interface PatientFormProps<Body> {
  form: UseFormReturn<PatientDraft, unknown, Body>;
  onSubmit: (body: Body) => void;
  saving: boolean;
  submitLabel: string;
  /** Fields the user may change; the others are shown read-only (the hygienist: contact details). */
  editable: (field: keyof PatientDraft) => boolean;
  /** Shows the chart-number field (editing, while it may still change once). */
  chartNumber?: 'editable' | 'fixed';
  /** Shown above the buttons: the duplicate warning. */
  beforeSubmit?: ReactNode;
}

export function PatientForm<Body>({
  form,
  onSubmit,
  saving,
  submitLabel,
  editable,
  chartNumber,
  beforeSubmit,
}: PatientFormProps<Body>) {
  const { register, watch } = form;
  const formError = formErrorMessage(form.formState.errors, 'alone');
  const text = (
    name: keyof PatientDraft,
    props: { placeholder?: string; type?: string; inputMode?: 'tel' | 'email'; help?: ReactNode } = {},
  ) => (
    <FormField name={name} label={PATIENT_FIELD_LABEL[name]} labelFor={`patient-${name}`} help={props.help}>
      {(a11y) => (
        <InputGroup
          id={`patient-${name}`}
          {...a11y}
          type={props.type ?? 'text'}
          inputMode={props.inputMode}
          placeholder={props.placeholder}
          readOnly={!editable(name)}
          {...withInputRef(register(name))}
        />
      )}
    </FormField>
  );
  // Dates through the app's one date field: typed in the practice's order, with its calendar
  // (issue 15 §7); a date that cannot be read keeps its text and is named beside the field.
  const date = (name: 'birthDate' | 'emailReminderConsentOn' | 'riskFactorsRecordedOn') => (
    <FormField name={name} label={PATIENT_FIELD_LABEL[name]} labelFor={`patient-${name}`}>
      {(a11y) => <DateField id={`patient-${name}`} {...a11y} name={name} readOnly={!editable(name)} />}
    </FormField>
  );
  const check = (name: keyof PatientDraft) => (
    <Checkbox
      id={`patient-${name}`}
      label={PATIENT_FIELD_LABEL[name]}
      disabled={!editable(name)}
      {...withInputRef(register(name))}
    />
  );
  return (
    <FormProvider {...form}>
      <form
        className="patient-form"
        noValidate
        onSubmit={(event) => void form.handleSubmit(onSubmit)(event)}
        aria-label="Patient record"
      >
        <fieldset>
          <legend>Identity</legend>
          {chartNumber &&
            text('chartNumber', {
              help:
                chartNumber === 'editable'
                  ? 'Generated by Torquetrail. You may change it once, e.g. to keep a paper number.'
                  : 'Changed once already: it is now fixed.',
            })}
          <div className="form-row">
            {text('givenName')}
            {text('familyName')}
          </div>
          <div className="form-row">
            {date('birthDate')}
            <FormField name="sex" label={PATIENT_FIELD_LABEL.sex} labelFor="patient-sex">
              <HTMLSelect id="patient-sex" disabled={!editable('sex')} {...register('sex')}>
                {PATIENT_SEXES.map((s) => (
                  <option key={s} value={s}>
                    {PATIENT_SEX_LABEL[s]}
                  </option>
                ))}
              </HTMLSelect>
            </FormField>
          </div>
        </fieldset>
        <fieldset>
          <legend>Contact and reminders</legend>
          <div className="form-row">
            {text('email', { type: 'email', inputMode: 'email', placeholder: 'name@example.com' })}
            {text('phone', { type: 'tel', inputMode: 'tel', placeholder: '+44 20 7946 0000' })}
          </div>
          <FormField
            name="preferredLanguage"
            label={PATIENT_FIELD_LABEL.preferredLanguage}
            labelFor="patient-preferredLanguage"
          >
            <HTMLSelect
              id="patient-preferredLanguage"
              disabled={!editable('preferredLanguage')}
              {...register('preferredLanguage')}
            >
              {PREFERRED_LANGUAGES.map((l) => (
                <option key={l} value={l}>
                  {PREFERRED_LANGUAGE_LABEL[l]}
                </option>
              ))}
            </HTMLSelect>
          </FormField>
          <FormField name="emailReminderConsent" help="Recall reminders are e-mailed only with the patient's consent.">
            {check('emailReminderConsent')}
          </FormField>
          {watch('emailReminderConsent') && date('emailReminderConsentOn')}
        </fieldset>
        <fieldset>
          <legend>Risk factors (the recall interval uses them)</legend>
          {check('smoker')}
          {check('diabetesPoorlyControlled')}
          {check('periodontitisHistory')}
          {date('riskFactorsRecordedOn')}
        </fieldset>
        {beforeSubmit}
        {formError && (
          <Callout intent="danger" role="alert" data-testid="patient-form-error">
            {formError}
          </Callout>
        )}
        <Button type="submit" intent="primary" loading={saving} data-testid="save-patient">
          {submitLabel}
        </Button>
      </form>
    </FormProvider>
  );
}
