// A client-side error on a field the form does not render still reaches the user, in the form's
// summary (issue 15): react-hook-form on a real control, validated with a contract.
import { zodResolver } from '@hookform/resolvers/zod';
import { SignInBody } from '@torquetrail/contracts';
import { createFormControl } from 'react-hook-form';
import { describe, expect, it, vi } from 'vitest';
import { draftSchema } from './contract-form';
import { errorLeaves, showErrorsAt, summariseHiddenErrors } from './hidden-errors';
import { formErrorMessage } from './server-errors';

const signIn = () => {
  const form = createFormControl({
    defaultValues: { email: 'not-an-address', password: '' },
    resolver: zodResolver(
      draftSchema(SignInBody, (d: { email: string; password: string }) => ({ email: d.email, password: d.password })),
    ),
  });
  summariseHiddenErrors(form);
  return form;
};
const errorsOf = (form: { control: { _formState: { errors: object } } }) => form.control._formState.errors;

describe('errors of fields the form does not show', () => {
  it('are named in the summary when their field is not rendered', async () => {
    const form = signIn();
    const stop = showErrorsAt(form.control, ['email']); // only the e-mail field is on screen
    const send = vi.fn();
    await form.handleSubmit(send)();
    expect(send).not.toHaveBeenCalled();
    const summary = formErrorMessage(errorsOf(form), 'alone');
    expect(summary).toMatch(/^Also to correct: Password: /);
    expect(summary).not.toMatch(/E-mail/);
    stop();
  });
  it('leave the summary empty when every error is shown beside its field', async () => {
    const form = signIn();
    const stop = showErrorsAt(form.control, ['email', 'password']);
    await form.handleSubmit(vi.fn())();
    expect(formErrorMessage(errorsOf(form), 'always')).toBeUndefined();
    stop();
    // Once the fields are gone (unmounted), their errors go to the summary.
    await form.handleSubmit(vi.fn())();
    expect(formErrorMessage(errorsOf(form), 'alone')).toMatch(/E-mail.*Password/);
  });
  it('reads list items and a list’s own message by path', () => {
    const leaves = errorLeaves({
      root: { type: 'server', message: 'form' },
      sites: Object.assign([{ axis: { type: 'custom', message: 'Zero' } }], {
        root: { type: 'too_small', message: 'One' },
      }),
    } as never);
    expect(leaves).toEqual([
      ['sites.0.axis', 'Zero'],
      ['sites', 'One'],
    ]);
  });
});
