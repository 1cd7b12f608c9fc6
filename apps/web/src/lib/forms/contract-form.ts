import { zodResolver } from '@hookform/resolvers/zod';
import { type DefaultValues, type FieldValues, useForm } from 'react-hook-form';
import { z } from 'zod';

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
 */
export function useContractForm<Values extends FieldValues, Body>(
  schema: z.ZodType<Body, Values>,
  defaultValues: DefaultValues<Values>,
) {
  return useForm<Values, unknown, Body>({
    resolver: zodResolver(schema),
    defaultValues,
    mode: 'onSubmit',
    reValidateMode: 'onSubmit',
    shouldFocusError: false,
  });
}
