import type { FieldErrors, FieldPath, FieldValues, UseFormSetError } from 'react-hook-form';
import { isApiError } from '../api-client';
import { fieldLabel } from './field-labels';

/** Where a failed submit's message is kept (react-hook-form clears `root` errors on the next submit). */
const FORM_ERROR = 'root.server';

/** The API names the body itself, not a field, with this path (apps/api common/zod-validation.pipe.ts). */
const BODY_PATH = '(body)';

/**
 * Puts a failed request's errors on the form: each of the API's 400 `fields` (path → message) on
 * the field at that path, and on FORM_ERROR a summary naming each field in words (or the error's
 * message when no field is named), marked with whether any field was named (see `formErrorMessage`). Any error is accepted; a network failure has only a message.
 */
export function applyServerErrors<Values extends FieldValues>(
  setError: UseFormSetError<Values>,
  error: Error,
  options: { message?: string } = {},
): void {
  const fields = isApiError(error) ? Object.entries(error.fields).filter(([path]) => path !== BODY_PATH) : [];
  for (const [path, message] of fields) setError(path as FieldPath<Values>, { type: 'server', message });
  // The form's own summary names each field in words (the API's message stays generic).
  const named = fields.map(([path, message]) => `${fieldLabel(path)}: ${message.replace(/\.$/, '')}.`).join(' ');
  const whole = isApiError(error) ? error.fields[BODY_PATH] : undefined;
  setError(FORM_ERROR, {
    type: fields.length > 0 ? 'with-fields' : 'alone',
    message: options.message ?? (named || whole || error.message),
  });
}

/**
 * The message of the last failed submit: `'always'`, or only when no field was named (`'alone'`,
 * the fields then speak for themselves).
 */
export function formErrorMessage(errors: FieldErrors, when: 'always' | 'alone'): string | undefined {
  const error = errors.root?.server;
  if (!error || (when === 'alone' && error.type !== 'alone')) return undefined;
  return error.message;
}
