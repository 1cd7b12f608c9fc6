import { FormGroup, type FormGroupProps, type Intent } from '@blueprintjs/core';
import { type ReactNode, useEffect, useId } from 'react';
import { type FieldErrors, get, useFormContext, useFormState } from 'react-hook-form';
import { showErrorsAt } from './hidden-errors';

/** The props a field's input takes so that its error is announced with it. */
interface FieldA11y {
  intent: Intent;
  'aria-invalid': true | undefined;
  'aria-describedby': string | undefined;
}

/** The message at an error path: client validation and the API's `fields` both land there. */
export function errorAt(errors: FieldErrors, path: string): string | undefined {
  const error: { message?: string; root?: { message?: string } } | undefined = get(errors, path);
  // An error on a list whose items are fields is kept under `root` by the resolver.
  return error?.message ?? error?.root?.message;
}

/**
 * The error message for the first of `names` that has one, in the surrounding FormProvider.
 * `live` is a message computed from the current values (a domain check run while typing):
 * by default it shows only when validation has none; `prefer: 'live'` puts it first.
 */
export function useFieldError(
  names: string | readonly string[],
  live?: string,
  prefer: 'validation' | 'live' = 'validation',
): string | undefined {
  const { control } = useFormContext();
  const { errors } = useFormState({ control });
  const list = typeof names === 'string' ? [names] : names;
  // The paths this field shows: a failed submit names the others in the form's summary.
  const key = list.join('\n');
  useEffect(() => showErrorsAt(control, key === '' ? [] : key.split('\n')), [control, key]);
  const validation = list.map((name) => errorAt(errors, name)).find(Boolean);
  return prefer === 'live' ? (live ?? validation) : (validation ?? live);
}

interface FormFieldProps extends Omit<FormGroupProps, 'intent' | 'helperText' | 'children'> {
  /** Error path(s) of the field, as in the contract; the first one also names the message (`error-<name>`). */
  name: string | readonly string[];
  /** See `useFieldError`. */
  live?: string;
  prefer?: 'validation' | 'live';
  /** Shown below the field while it has no error. */
  help?: ReactNode;
  /** The input, or a function that gives it the props tying it to its error. */
  children: ReactNode | ((a11y: FieldA11y) => ReactNode);
}

/** A Blueprint FormGroup showing its field's error (client or server) in place of the help text. */
export function FormField({ name, live, prefer, help, children, ...group }: FormFieldProps) {
  const message = useFieldError(name, live, prefer);
  const errorId = `${useId()}-error`;
  const first = typeof name === 'string' ? name : name[0];
  const a11y: FieldA11y = {
    intent: message ? 'danger' : 'none',
    'aria-invalid': message ? true : undefined,
    'aria-describedby': message ? errorId : undefined,
  };
  return (
    <FormGroup
      {...group}
      intent={a11y.intent}
      helperText={
        message ? (
          <span id={errorId} data-testid={`error-${first}`}>
            {message}
          </span>
        ) : (
          help
        )
      }
    >
      {typeof children === 'function' ? children(a11y) : children}
    </FormGroup>
  );
}

/** A field's error where there is no FormGroup to hold it (a table cell, a grid). */
export function FieldError({
  name,
  live,
  prefer,
  as: Tag = 'span',
  className,
  role,
}: {
  name: string | readonly string[];
  live?: string;
  prefer?: 'validation' | 'live';
  as?: 'span' | 'div' | 'p';
  className?: string;
  role?: 'alert';
}) {
  const message = useFieldError(name, live, prefer);
  if (!message) return null;
  const first = typeof name === 'string' ? name : name[0];
  return (
    <Tag className={className} role={role} data-testid={`error-${first}`}>
      {message}
    </Tag>
  );
}
