import { type HTMLInputProps, NumericInput, type NumericInputProps } from '@blueprintjs/core';
import { type RefCallBack, useController } from 'react-hook-form';
import { DateInput, type DateInputProps } from '../components/date-input';

/** `register(name)` for Blueprint inputs (InputGroup, TextArea, Checkbox), which take the DOM ref as `inputRef`. */
export function withInputRef<R extends { ref: RefCallBack }>({
  ref,
  ...rest
}: R): Omit<R, 'ref'> & { inputRef: RefCallBack } {
  return { ...rest, inputRef: ref };
}

type NumberInputProps = Omit<
  HTMLInputProps & NumericInputProps,
  'value' | 'defaultValue' | 'onValueChange' | 'name' | 'inputRef' | 'onBlur'
> & {
  name: string;
  /** What an empty or unreadable input stands for in the form's values. */
  emptyValue?: number | null;
};

/** Blueprint's NumericInput bound to a number (or `emptyValue`) in the surrounding FormProvider. */
export function NumberInput({ name, emptyValue = null, ...props }: NumberInputProps) {
  const { field } = useController({ name });
  const value = field.value as number | null;
  return (
    <NumericInput
      {...props}
      name={field.name}
      inputRef={field.ref}
      value={value ?? ''}
      onValueChange={(v) => field.onChange(Number.isFinite(v) ? v : emptyValue)}
      onBlur={field.onBlur}
    />
  );
}

/** The app's date field (lib/components/date-input.tsx) bound to a YYYY-MM-DD string in the surrounding FormProvider. */
export function DateField({
  name,
  ...props
}: Omit<DateInputProps, 'value' | 'onChange' | 'name' | 'inputRef'> & { name: string }) {
  const { field } = useController({ name });
  return (
    <DateInput
      {...props}
      name={field.name}
      inputRef={field.ref}
      value={(field.value as string | null | undefined) ?? ''}
      onChange={field.onChange}
      onBlur={field.onBlur}
    />
  );
}
