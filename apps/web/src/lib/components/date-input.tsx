import { Button, InputGroup, type InputGroupProps, PopoverNext, Spinner } from '@blueprintjs/core';
import { lazy, Suspense, useState } from 'react';
import { dateTypingExample, formatDate, parseDate } from '../dates';

// The calendar (Blueprint's DatePicker) is loaded the first time a calendar is opened.
const DateCalendar = lazy(() => import('./date-calendar'));

export type DateInputProps = Omit<InputGroupProps, 'value' | 'onValueChange' | 'onChange' | 'type' | 'defaultValue'> & {
  /** YYYY-MM-DD, '' when empty, or text that is not (yet) a date. */
  value: string;
  /** YYYY-MM-DD when the text is a date, '' when empty, else the text itself (the contract then names it). */
  onChange: (value: string) => void;
};

/**
 * The app's one date field (issue 15 §7): typed and shown in the practice's format (lib/dates.ts:
 * day-month-year, month-day-year or year-month-day), whatever the browser's locale, where a native
 * date input would show the browser's. Numbers are read in the practice's order, a year first and
 * a month in words always; on leaving the field a date is rewritten in the practice's format.
 * Typing stays the primary input; the calendar button beside it picks a day with the mouse or the
 * keyboard and writes it into the field the same way.
 */
export function DateInput({ value, onChange, onBlur, placeholder, disabled, readOnly, ...props }: DateInputProps) {
  const shown = (v: string) => (parseDate(v) === v ? formatDate(v) : v);
  const [text, setText] = useState(() => shown(value));
  const [calendarOpen, setCalendarOpen] = useState(false);
  // Follow a value set from outside (a reset, a default): adjusted while rendering, as React advises.
  const [seen, setSeen] = useState(value);
  if (value !== seen) {
    setSeen(value);
    const typed = parseDate(text) ?? text.trim();
    if (typed !== value) setText(shown(value));
  }
  const take = (next: string) => {
    setText(next);
    const iso = parseDate(next);
    const out = iso ?? next.trim();
    setSeen(out);
    onChange(out);
  };
  const calendar = (
    <PopoverNext
      isOpen={calendarOpen}
      onInteraction={(open) => setCalendarOpen(open)}
      placement="bottom-end"
      shouldReturnFocusOnClose
      disabled={disabled || readOnly}
      content={
        // Escape closes the calendar alone, not the form around it (lib/use-close-on-escape.ts).
        <div
          onKeyDown={(event) => {
            if (event.key !== 'Escape') return;
            event.preventDefault();
            setCalendarOpen(false);
          }}
        >
          <Suspense fallback={<Spinner size={20} aria-label="Loading the calendar" />}>
            <DateCalendar
              value={parseDate(text)}
              onPick={(iso) => {
                take(formatDate(iso));
                setCalendarOpen(false);
              }}
            />
          </Suspense>
        </div>
      }
    >
      <Button
        variant="minimal"
        icon="calendar"
        aria-label="Choose the date on a calendar"
        aria-expanded={calendarOpen}
        disabled={disabled || readOnly}
      />
    </PopoverNext>
  );
  return (
    <InputGroup
      {...props}
      disabled={disabled}
      readOnly={readOnly}
      value={text}
      placeholder={placeholder ?? `e.g. ${dateTypingExample()}`}
      autoComplete="off"
      rightElement={calendar}
      onValueChange={take}
      onBlur={(event) => {
        const iso = parseDate(text);
        if (iso) setText(formatDate(iso));
        onBlur?.(event);
      }}
    />
  );
}
