import { Button, Callout, FormGroup, InputGroup } from '@blueprintjs/core';
import { SignInBody } from '@torquetrail/contracts';
import { type FormEvent, useState } from 'react';
import { isApiError } from '../../../lib/api-client';
import { fieldsFromIssues } from '../../../lib/form-errors';
import { useSignIn } from '../api/sign-in';

/** E-mail and password, validated with the same contract the API uses; Enter submits. */
export function SignInForm() {
  const [email, setEmail] = useState('');
  const [password, setPassword] = useState('');
  const [clientFields, setClientFields] = useState<Record<string, string>>({});
  const signIn = useSignIn();

  const onSubmit = (event: FormEvent<HTMLFormElement>) => {
    event.preventDefault();
    const parsed = SignInBody.safeParse({ email: email.trim(), password });
    if (!parsed.success) {
      signIn.reset();
      setClientFields(fieldsFromIssues(parsed.error.issues));
      return;
    }
    setClientFields({});
    signIn.mutate(parsed.data);
  };

  const error = signIn.error;
  const fields = { ...(isApiError(error, 400) ? error.fields : {}), ...clientFields };
  const message = !error
    ? null
    : isApiError(error, 429)
      ? 'Too many attempts, wait a minute'
      : error.message;

  return (
    <form onSubmit={onSubmit} noValidate aria-label="Sign in">
      {message && (
        <Callout intent="danger" icon="error" role="alert" className="sign-in-form__error">
          {message}
        </Callout>
      )}
      <TextField
        id="sign-in-email"
        label="E-mail"
        type="email"
        autoComplete="username"
        value={email}
        onChange={setEmail}
        error={fields.email}
        autoFocus
      />
      <TextField
        id="sign-in-password"
        label="Password"
        type="password"
        autoComplete="current-password"
        value={password}
        onChange={setPassword}
        error={fields.password}
      />
      <Button type="submit" intent="primary" text="Sign in" fill size="large" loading={signIn.isPending} />
    </form>
  );
}

interface TextFieldProps {
  id: string;
  label: string;
  type: 'email' | 'password';
  autoComplete: string;
  value: string;
  onChange: (value: string) => void;
  error: string | undefined;
  autoFocus?: boolean;
}

function TextField({ id, label, type, autoComplete, value, onChange, error, autoFocus }: TextFieldProps) {
  const errorId = `${id}-error`;
  return (
    <FormGroup
      label={label}
      labelFor={id}
      intent={error ? 'danger' : 'none'}
      helperText={error ? <span id={errorId}>{error}</span> : undefined}
    >
      <InputGroup
        id={id}
        name={id}
        type={type}
        autoComplete={autoComplete}
        value={value}
        onValueChange={onChange}
        intent={error ? 'danger' : 'none'}
        aria-invalid={error ? true : undefined}
        aria-describedby={error ? errorId : undefined}
        autoFocus={autoFocus}
        size="large"
      />
    </FormGroup>
  );
}
