import { InputGroup, type InputGroupProps } from '@blueprintjs/core';
import { useState } from 'react';
import { formatDate, parseDate } from '../dates';

export type DateInputProps = Omit<InputGroupProps, 'value' | 'onValueChange' | 'onChange' | 'type' | 'defaultValue'> & {
  /** YYYY-MM-DD, '' when empty, or text that is not (yet) a date. */
  value: string;
  /** YYYY-MM-DD when the text is a date, '' when empty, else the text itself (the contract then names it). */
  onChange: (value: string) => void;
};

/**
 * The app's one date field (issue 15 §7): typed and shown in the practice's format ("12 Mar 2026",
 * lib/dates.ts), whatever the browser's locale, where a native date input would show the browser's.
 * Day-first numbers and YYYY-MM-DD are read too; on leaving the field a date is rewritten in the
 * practice's format.
 */
export function DateInput({ value, onChange, onBlur, placeholder, ...props }: DateInputProps) {
  const shown = (v: string) => (parseDate(v) === v ? formatDate(v) : v);
  const [text, setText] = useState(() => shown(value));
  // Follow a value set from outside (a reset, a default): adjusted while rendering, as React advises.
  const [seen, setSeen] = useState(value);
  if (value !== seen) {
    setSeen(value);
    const typed = parseDate(text) ?? text.trim();
    if (typed !== value) setText(shown(value));
  }
  return (
    <InputGroup
      {...props}
      value={text}
      placeholder={placeholder ?? 'e.g. 12 Mar 2026'}
      autoComplete="off"
      onValueChange={(next) => {
        setText(next);
        const iso = parseDate(next);
        const out = iso ?? next.trim();
        setSeen(out);
        onChange(out);
      }}
      onBlur={(event) => {
        const iso = parseDate(text);
        if (iso) setText(formatDate(iso));
        onBlur?.(event);
      }}
    />
  );
}
