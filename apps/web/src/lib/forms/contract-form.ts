import { zodResolver } from '@hookform/resolvers/zod';
import { useEffect } from 'react';
import { ISO_DATE_MESSAGE } from '@torquetrail/contracts';
import { type DefaultValues, type FieldErrors, type FieldValues, get, type Resolver, useForm } from 'react-hook-form';
import { useLocation } from 'react-router-dom';
import { z } from 'zod';
import { dateProblem } from '../dates';
import { offerDraft, takeDraft } from './drafts';
import { summariseHiddenErrors } from './hidden-errors';

/**
 * The schema of a form whose values are a draft (text as typed, '' for "not chosen", numbers that
 * may be missing): the draft is turned into the contract's body and validated by the contract
 * itself, so the form shows the API's own messages at the paths of the API's 400 `fields`, and
 * submits the body the contract parsed.
 */
export function draftSchema<Draft extends FieldValues, Body, Parsed>(
  contract: z.ZodType<Parsed, Body>,
  toBody: (draft: Draft) => Body,
) {
  // The cast restates what the transform is (draft in, body out): zod types a generic transform's output as Awaited<Body>.
  const mapped = z.custom<Draft>().transform(toBody) as unknown as z.ZodType<Body, Draft>;
  return mapped.pipe(contract);
}

/**
 * A date field's text the contract could not read gets the reason in the practice's format, in
 * plain words ("There is no such day: February 2026 has 28 days"), in place of the contract's
 * "Enter a date as YYYY-MM-DD", which is written for API clients (issue 15 §7).
 */
export function explainDateErrors(errors: FieldErrors, values: FieldValues, path: string[] = []): void {
  for (const [key, error] of Object.entries(errors)) {
    if (!error || typeof error !== 'object') continue;
    const at = [...path, key];
    const node = error as { message?: unknown; type?: unknown };
    if (node.message === ISO_DATE_MESSAGE) {
      const typed: unknown = get(values, at.join('.'));
      node.message = typeof typed === 'string' ? (dateProblem(typed) ?? ISO_DATE_MESSAGE) : ISO_DATE_MESSAGE;
    } else if (key !== 'ref') explainDateErrors(error as FieldErrors, values, at);
  }
}

/**
 * react-hook-form validated with a contract schema (from `draftSchema`, or the contract itself
 * when the form's values are already the body). Messages change when the form is submitted, not
 * while typing, and focus stays where the user is: the forms behaved so before this adapter.
 * An error on a field the form does not show is named in the form's summary (hidden-errors.ts).
 * What is typed survives a sign-out forced by the session (lib/forms/drafts.ts) unless
 * `keepDraft` is false (password forms).
 */
export function useContractForm<Values extends FieldValues, Body>(
  schema: z.ZodType<Body, Values>,
  defaultValues: DefaultValues<Values>,
  { keepDraft = true }: { keepDraft?: boolean } = {},
) {
  const contract = zodResolver<Values, unknown, Body>(schema);
  const resolver: Resolver<Values, unknown, Body> = async (values, context, options) => {
    const result = await contract(values, context, options);
    explainDateErrors(result.errors, values);
    return result;
  };
  const form = useForm<Values, unknown, Body>({
    resolver,
    defaultValues,
    mode: 'onSubmit',
    reValidateMode: 'onSubmit',
    shouldFocusError: false,
  });
  // A failed submit names, in the form's summary, the errors no field on screen shows.
  summariseHiddenErrors(form);
  // The page and the form's fields name the draft: both are the same after signing in again
  // (React's useId is not: in a client-rendered app it counts mounts).
  const key = `${useLocation().pathname}#${Object.keys(defaultValues).sort().join(',')}`;
  const { getValues, reset } = form;
  useEffect(() => {
    if (!keepDraft) return undefined;
    const kept = takeDraft(key);
    if (kept && typeof kept === 'object') reset(kept as Values, { keepDefaultValues: true });
    return offerDraft(key, () => getValues());
  }, [key, keepDraft, getValues, reset]);
  return form;
}
