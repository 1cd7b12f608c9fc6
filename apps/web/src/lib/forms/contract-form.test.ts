// A form validated with a contract (draftSchema + zodResolver), on a real react-hook-form control:
// the contract's own messages at the body's paths, the parsed body submitted, and the API's errors
// of one submit gone at the next.
import { zodResolver } from '@hookform/resolvers/zod';
import { DeliveryBody, IsoDate, SignInBody } from '@torquetrail/contracts';
import { createFormControl } from 'react-hook-form';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { z } from 'zod';
import { setDateFormat } from '../dates';
import { ApiError } from '../api-client';
import { draftSchema, explainDateErrors } from './contract-form';
import { errorAt } from './form-field';
import { applyServerErrors, formErrorMessage } from './server-errors';

const errorsOf = (form: { control: { _formState: { errors: object } } }) => form.control._formState.errors;

describe('a form validated with a contract (draftSchema + zodResolver)', () => {
  const signIn = () =>
    createFormControl({
      defaultValues: { email: '', password: '' },
      resolver: zodResolver(
        draftSchema(SignInBody, (d: { email: string; password: string }) => ({
          email: d.email.trim(),
          password: d.password,
        })),
      ),
    });

  it("shows the contract's messages at the contract's paths, and sends nothing", async () => {
    const form = signIn();
    const send = vi.fn();
    form.setValue('email', 'not-an-address');
    await form.handleSubmit(send)();
    expect(send).not.toHaveBeenCalled();
    expect(errorAt(errorsOf(form), 'email')).toBe('Enter a valid e-mail address');
    expect(errorAt(errorsOf(form), 'password')).toBe('Enter your password');
  });

  it('submits the body the contract parsed, and the next submit clears the server errors of the last', async () => {
    const form = signIn();
    const send = vi.fn();
    form.setValue('email', '  dana@example.test ');
    form.setValue('password', 'secret');
    applyServerErrors(form.setError, new ApiError(400, 'Invalid', { password: 'Wrong' }));
    expect(errorAt(errorsOf(form), 'password')).toBe('Wrong');
    await form.handleSubmit(send)();
    expect(send.mock.calls[0]?.[0]).toEqual({ email: 'dana@example.test', password: 'secret' });
    expect(errorAt(errorsOf(form), 'password')).toBeUndefined();
    expect(formErrorMessage(errorsOf(form), 'always')).toBeUndefined();
  });

  it('maps a draft with text inputs to the body before the contract checks it (paths are the body’s)', async () => {
    const rows = [
      { siteId: '00000000-0000-4000-8000-000000000001', componentId: '00000000-0000-4000-8000-000000000002' },
    ];
    const form = createFormControl({
      defaultValues: { deliveredOn: 'yesterday', lots: [' L-1 '] },
      resolver: zodResolver(
        draftSchema(DeliveryBody, (d: { deliveredOn: string; lots: string[] }) => ({
          deliveredOn: d.deliveredOn,
          parts: rows.map((r, i) => ({ ...r, lot: d.lots[i] || null })),
        })),
      ),
    });
    const send = vi.fn();
    await form.handleSubmit(send)();
    expect(errorAt(errorsOf(form), 'deliveredOn')).toMatch(/date/i);
    form.setValue('deliveredOn', '2026-03-12');
    await form.handleSubmit(send)();
    expect(send.mock.calls[0]?.[0]).toEqual({
      deliveredOn: '2026-03-12',
      impressionTakenOn: null,
      parts: [{ ...rows[0], lot: 'L-1' }],
    });
  });
});

// Issue 15 §7: a date the contract cannot read is explained in the practice's order, in plain words.
describe('a date field the contract cannot read', () => {
  const schema = z.object({ visit: z.object({ on: IsoDate }), note: z.string() });
  const check = async (on: string) => {
    const values = { visit: { on }, note: '' };
    const result = await zodResolver(schema)(values, undefined, { fields: {}, shouldUseNativeValidation: false });
    explainDateErrors(result.errors, values);
    return errorAt(result.errors, 'visit.on');
  };
  afterEach(() => setDateFormat('day-month-year'));

  it('says why, in the practice’s order, in place of “Enter a date as YYYY-MM-DD”', async () => {
    expect(await check('31/02/2026')).toBe('There is no such day: February 2026 has 28 days');
    setDateFormat('year-month-day');
    expect(await check('01/02/2026')).toMatch(/either number could be the day/);
    expect(await check('soon')).toBe('Type a date as 2026-03-12');
  });
  it('leaves other messages alone', async () => {
    expect(await check('2026-03-12')).toBeUndefined();
    expect(await check('1850-01-01')).toMatch(/^Enter a date between/);
  });
});
