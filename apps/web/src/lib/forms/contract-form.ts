import { zodResolver } from '@hookform/resolvers/zod';
import { useEffect } from 'react';
import { type DefaultValues, type FieldValues, useForm } from 'react-hook-form';
import { useLocation } from 'react-router-dom';
import { z } from 'zod';
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
  const form = useForm<Values, unknown, Body>({
    resolver: zodResolver(schema),
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
