import { Button, Callout, InputGroup } from '@blueprintjs/core';
import { acceptInvitationForm, type AcceptInvitationBody, type InvitationPreview } from '@torquetrail/contracts';
import { useMemo } from 'react';
import { FormProvider } from 'react-hook-form';
import { Link } from 'react-router-dom';
import { LoadingState } from '../../../lib/components/loading-state';
import { applyServerErrors, FormField, formErrorMessage, useContractForm, withInputRef } from '../../../lib/forms';
import { ROLE_LABEL } from '../../../lib/labels';
import { useAcceptInvitation, useInvitationPreview } from '../api/account-api';
import { useLinkToken } from '../components/link-token';
import { PASSWORD_HELP, PublicPage } from '../components/public-page';
import { runMutation } from '../../../lib/run-mutation';

/** /welcome#token=…: the invitee chooses the name colleagues see and a password. */
export function WelcomeRoute() {
  const token = useLinkToken();
  const preview = useInvitationPreview(token);
  if (preview.isPending) return <LoadingState label="Opening your invitation" />;
  if (preview.isError)
    return (
      <PublicPage title="This invitation cannot be used">
        <Callout intent="warning" role="alert" className="sign-in-page__notice">
          {preview.error.message}
        </Callout>
        <p className="sign-in-page__links">
          <Link to="/sign-in">Go to sign-in</Link>
        </p>
      </PublicPage>
    );
  return (
    <PublicPage
      title={
        preview.data.ownPractice
          ? `${preview.data.practiceName} shared a patient with you`
          : `Join ${preview.data.practiceName}`
      }
    >
      <AcceptForm token={token} invitation={preview.data} />
    </PublicPage>
  );
}

function AcceptForm({ token, invitation }: { token: string; invitation: InvitationPreview }) {
  const schema = useMemo(
    () => acceptInvitationForm(invitation.email, invitation.ownPractice),
    [invitation.email, invitation.ownPractice],
  );
  const form = useContractForm(
    schema,
    { token, displayName: '', password: '', ...(invitation.ownPractice ? { practiceName: '' } : {}) },
    { keepDraft: false },
  );
  const accept = useAcceptInvitation();
  const submit = (body: AcceptInvitationBody) =>
    runMutation(accept, body, { onError: (error) => applyServerErrors(form.setError, error) });
  const message = formErrorMessage(form.formState.errors, 'alone');

  if (accept.isSuccess)
    return (
      <>
        <Callout intent="success" role="status" className="sign-in-page__notice">
          Your account is ready. Sign in with {invitation.email} and the password you chose.
        </Callout>
        <Link to="/sign-in" className="bp6-button bp6-intent-primary bp6-fill bp6-large">
          Sign in
        </Link>
      </>
    );
  return (
    <FormProvider {...form}>
      {invitation.ownPractice ? (
        <p>
          You are invited as a <strong>{ROLE_LABEL[invitation.role]}</strong> of your own practice with{' '}
          {invitation.email}. Once your account is made, the shared patient is under Patients.
        </p>
      ) : (
        <p>
          You are invited as <strong>{ROLE_LABEL[invitation.role]}</strong> with {invitation.email}.
        </p>
      )}
      {message && (
        <Callout intent="danger" role="alert" className="sign-in-page__notice">
          {message}
        </Callout>
      )}
      <form onSubmit={(event) => void form.handleSubmit(submit)(event)} noValidate aria-label="Accept the invitation">
        <FormField name="displayName" label="Your name, as colleagues see it" labelFor="welcome-name">
          {(a11y) => (
            <InputGroup
              id="welcome-name"
              autoComplete="name"
              autoFocus
              {...a11y}
              {...withInputRef(form.register('displayName'))}
            />
          )}
        </FormField>
        {invitation.ownPractice && (
          <FormField name="practiceName" label="Your practice's name" labelFor="welcome-practice">
            {(a11y) => (
              <InputGroup
                id="welcome-practice"
                autoComplete="organization"
                {...a11y}
                {...withInputRef(form.register('practiceName'))}
              />
            )}
          </FormField>
        )}
        <FormField name="password" label="Password" labelFor="welcome-password" help={PASSWORD_HELP}>
          {(a11y) => (
            <InputGroup
              id="welcome-password"
              type="password"
              autoComplete="new-password"
              {...a11y}
              {...withInputRef(form.register('password'))}
            />
          )}
        </FormField>
        <Button type="submit" intent="primary" text="Create my account" fill size="large" loading={accept.isPending} />
      </form>
    </FormProvider>
  );
}
