import { Button, Callout, InputGroup } from '@blueprintjs/core';
import { PasswordResetRequestBody } from '@torquetrail/contracts';
import { FormProvider } from 'react-hook-form';
import { Link } from 'react-router-dom';
import { isApiError } from '../../../lib/api-client';
import {
  applyServerErrors,
  draftSchema,
  FormField,
  formErrorMessage,
  useContractForm,
  withInputRef,
} from '../../../lib/forms';
import { useRequestReset } from '../api/account-api';
import { PublicPage } from '../components/public-page';
import { runMutation } from '../../../lib/run-mutation';

const schema = draftSchema(PasswordResetRequestBody, (draft: { email: string }) => ({ email: draft.email.trim() }));

/** /forgot-password: a reset link by e-mail (the reply does not tell whether the address has an account). */
export function ForgotPasswordRoute() {
  const form = useContractForm(schema, { email: '' }, { keepDraft: false });
  const request = useRequestReset();
  const submit = (body: PasswordResetRequestBody) =>
    runMutation(request, body, {
      onError: (error) =>
        applyServerErrors(
          form.setError,
          error,
          isApiError(error, 429) ? { message: 'Too many attempts, wait a minute' } : {},
        ),
    });
  const message = formErrorMessage(form.formState.errors, 'alone');
  return (
    <PublicPage title="Forgotten password">
      {request.isSuccess ? (
        <Callout intent="success" role="status" className="sign-in-page__notice">
          {request.data.message}
        </Callout>
      ) : (
        <FormProvider {...form}>
          <p>Enter the e-mail address you sign in with; we send a link to choose a new password.</p>
          {message && (
            <Callout intent="danger" role="alert" className="sign-in-page__notice">
              {message}
            </Callout>
          )}
          <form
            onSubmit={(event) => void form.handleSubmit(submit)(event)}
            noValidate
            aria-label="Ask for a reset link"
          >
            <FormField name="email" label="E-mail" labelFor="forgot-email">
              {(a11y) => (
                <InputGroup
                  id="forgot-email"
                  type="email"
                  autoComplete="username"
                  autoFocus
                  {...a11y}
                  {...withInputRef(form.register('email'))}
                />
              )}
            </FormField>
            <Button type="submit" intent="primary" text="Send the link" fill size="large" loading={request.isPending} />
          </form>
        </FormProvider>
      )}
      <p className="sign-in-page__links">
        <Link to="/sign-in">Back to sign-in</Link>
      </p>
    </PublicPage>
  );
}
