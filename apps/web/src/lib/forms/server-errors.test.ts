// The forms' server-error wiring, on a real react-hook-form control (no React needed): the API's
// 400 `fields` land on the fields at their paths; the message is kept for the form.
import { createFormControl } from 'react-hook-form';
import { describe, expect, it } from 'vitest';
import { ApiError } from '../api-client';
import { errorAt } from './form-field';
import { applyServerErrors, formErrorMessage } from './server-errors';

const formOf = (defaultValues: Record<string, unknown>) => createFormControl({ defaultValues });
const errorsOf = (form: { control: { _formState: { errors: object } } }) => form.control._formState.errors;

describe('applyServerErrors', () => {
  it("puts each of the API's fields on the field at its path, nested paths included", () => {
    const form = formOf({ deliveredOn: '', lots: ['', ''] });
    applyServerErrors(
      form.setError,
      new ApiError(400, '2 entries need correcting', {
        'parts.1.lot': 'A lot number is required',
        deliveredOn: 'Invalid date',
      }),
    );
    const errors = errorsOf(form);
    expect(errorAt(errors, 'parts.1.lot')).toBe('A lot number is required');
    expect(errorAt(errors, 'deliveredOn')).toBe('Invalid date');
    expect(errorAt(errors, 'parts.0.lot')).toBeUndefined();
    // The message is kept for forms that show it beside the fields, hidden from those that do not.
    // named in words through the one field-label mapping, never by the machine path.
    expect(formErrorMessage(errors, 'always')).toBe(
      'Lot, part 2: A lot number is required. Delivery date: Invalid date.',
    );
    expect(formErrorMessage(errors, 'alone')).toBeUndefined();
  });

  it('keeps the message of an error that names no field (a 409, a network failure) for the form', () => {
    const form = formOf({ email: '' });
    applyServerErrors(form.setError, new ApiError(0, 'Cannot reach the Torquetrail server.'));
    expect(formErrorMessage(errorsOf(form), 'alone')).toBe('Cannot reach the Torquetrail server.');
    expect(errorAt(errorsOf(form), 'email')).toBeUndefined();
  });

  it("treats the API's '(body)' path as the form's message, and lets the form reword it", () => {
    const form = formOf({ email: '' });
    applyServerErrors(form.setError, new ApiError(400, 'Invalid', { '(body)': 'Invalid' }), { message: 'Reworded' });
    expect(errorAt(errorsOf(form), '(body)')).toBeUndefined();
    expect(formErrorMessage(errorsOf(form), 'alone')).toBe('Reworded');
  });
});
