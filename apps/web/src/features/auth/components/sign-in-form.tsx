import { Button, Callout, InputGroup } from '@blueprintjs/core';
import { SignInBody } from '@torquetrail/contracts';
import { FormProvider } from 'react-hook-form';
import { isApiError } from '../../../lib/api-client';
import {
  applyServerErrors,
  draftSchema,
  FormField,
  formErrorMessage,
  useContractForm,
  withInputRef,
} from '../../../lib/forms';
import { useSignIn } from '../api/sign-in';
import { runMutation } from '../../../lib/run-mutation';

interface SignInDraft {
  email: string;
  password: string;
}

const schema = draftSchema(SignInBody, (draft: SignInDraft) => ({
  email: draft.email.trim(),
  password: draft.password,
}));

/** E-mail and password, validated with the same contract the API uses; Enter submits. */
export function SignInForm() {
  const form = useContractForm(schema, { email: '', password: '' });
  const signIn = useSignIn();

  const submit = (body: SignInBody) =>
    runMutation(signIn, body, {
      onError: (error) =>
        applyServerErrors(
          form.setError,
          error,
          isApiError(error, 429) ? { message: 'Too many attempts, wait a minute' } : {},
        ),
    });
  const message = formErrorMessage(form.formState.errors, 'always');

  return (
    <FormProvider {...form}>
      <form onSubmit={(event) => void form.handleSubmit(submit)(event)} noValidate aria-label="Sign in">
        {message && (
          <Callout intent="danger" icon="error" role="alert" className="sign-in-form__error">
            {message}
          </Callout>
        )}
        <FormField name="email" label="E-mail" labelFor="sign-in-email">
          {(a11y) => (
            <InputGroup
              id="sign-in-email"
              type="email"
              autoComplete="username"
              autoFocus
              size="large"
              {...a11y}
              {...withInputRef(form.register('email'))}
            />
          )}
        </FormField>
        <FormField name="password" label="Password" labelFor="sign-in-password">
          {(a11y) => (
            <InputGroup
              id="sign-in-password"
              type="password"
              autoComplete="current-password"
              size="large"
              {...a11y}
              {...withInputRef(form.register('password'))}
            />
          )}
        </FormField>
        <Button type="submit" intent="primary" text="Sign in" fill size="large" loading={signIn.isPending} />
      </form>
    </FormProvider>
  );
}
