import { Button, Callout, InputGroup, TextArea } from '@blueprintjs/core';
import { type PracticeContact, PracticeContactBody } from '@torquetrail/contracts';
import { FormProvider } from 'react-hook-form';
import { ErrorState } from '../../../lib/components/error-state';
import { LoadingState } from '../../../lib/components/loading-state';
import {
  applyServerErrors,
  draftSchema,
  FormField,
  formErrorMessage,
  useContractForm,
  withInputRef,
} from '../../../lib/forms';
import { usePracticeContact, useSavePracticeContact } from '../api/people-api';
import { runMutation } from '../../../lib/run-mutation';

interface ContactDraft {
  address: string;
  phone: string;
  email: string;
}

const orNull = (text: string) => (text.trim() === '' ? null : text.trim());
const draftOf = (c: PracticeContact): ContactDraft => ({
  address: c.address ?? '',
  phone: c.phone ?? '',
  email: c.email ?? '',
});
const schema = draftSchema(PracticeContactBody, (d: ContactDraft): PracticeContactBody => ({
  address: orNull(d.address),
  phone: orNull(d.phone),
  email: orNull(d.email),
}));

/** /practice/contact: how patients and colleagues reach the practice, as its documents print it. */
export function PracticeContactRoute() {
  const contact = usePracticeContact();
  return (
    <div>
      <title>Practice contact · Practice · Torquetrail</title>
      <h1 className="page-title">Practice contact</h1>
      <p>
        Printed on the implant passport, the retrieval card, the referral summary and the lab prescription, so whoever
        holds one of them can reach the practice.
      </p>
      {contact.isPending ? (
        <LoadingState label="Loading the practice contact" />
      ) : contact.isError ? (
        <ErrorState title="Could not load the contact" error={contact.error} onRetry={() => void contact.refetch()} />
      ) : (
        <ContactForm current={contact.data} />
      )}
    </div>
  );
}

function ContactForm({ current }: { current: PracticeContact }) {
  const save = useSavePracticeContact();
  const form = useContractForm<ContactDraft, PracticeContactBody>(schema, draftOf(current));
  const submit = (body: PracticeContactBody) =>
    runMutation(save, body, {
      onSuccess: (saved) => form.reset(draftOf(saved)),
      onError: (error) => applyServerErrors(form.setError, error),
    });
  const message = formErrorMessage(form.formState.errors, 'alone');
  return (
    <FormProvider {...form}>
      <form
        noValidate
        className="practice-contact"
        onSubmit={(event) => void form.handleSubmit(submit, () => save.reset())(event)}
      >
        <p>
          <strong>{current.name}</strong>
        </p>
        <FormField name="address" label="Address" labelFor="practice-address" help="As it goes on an envelope.">
          {(a11y) => (
            <TextArea id="practice-address" rows={4} fill {...a11y} {...withInputRef(form.register('address'))} />
          )}
        </FormField>
        <FormField name="phone" label="Phone" labelFor="practice-phone">
          {(a11y) => (
            <InputGroup
              id="practice-phone"
              type="tel"
              inputMode="tel"
              placeholder="+44 20 7946 0000"
              {...a11y}
              {...withInputRef(form.register('phone'))}
            />
          )}
        </FormField>
        <FormField name="email" label="E-mail" labelFor="practice-email">
          {(a11y) => (
            <InputGroup
              id="practice-email"
              type="email"
              inputMode="email"
              placeholder="reception@example.com"
              {...a11y}
              {...withInputRef(form.register('email'))}
            />
          )}
        </FormField>
        <Button type="submit" intent="primary" loading={save.isPending}>
          Save
        </Button>
        {save.isSuccess && (
          <Callout intent="success" role="status">
            Saved. Documents printed from now on carry it.
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
