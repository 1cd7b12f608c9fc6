import '@blueprintjs/datetime/lib/css/blueprint-datetime.css';
import { DatePicker } from '@blueprintjs/datetime';
import { DATE_RANGE } from '@torquetrail/contracts';
import { calendarDateToLocal, firstDayOfWeek, localToCalendarDate, localToday } from '../dates';

interface DateCalendarProps {
  /** YYYY-MM-DD of the field, or null when it holds no date (the calendar opens on today). */
  value: string | null;
  onPick: (iso: string) => void;
}

// The picker's month and weekday names come from react-day-picker's built-in English; loading a
// date-fns locale by name would be a runtime import the build cannot see. Torquetrail is written in
// English only (no practice language setting; the patient's preferred language is for letters),
// so the names stay English; what the practice's format changes is the week's first day here and
// the order dates are typed and shown in (lib/dates.ts) (issue 15 §7).
const noLocaleLoad = () => Promise.resolve(undefined);

/**
 * The calendar of the date field (lib/components/date-input.tsx), loaded when first opened:
 * Blueprint's DatePicker, its week starting on the practice's first day. Arrow keys move between
 * days, Enter picks one, Escape closes it; the typed field stays the primary input.
 */
export default function DateCalendar({ value, onPick }: DateCalendarProps) {
  const selected = value ? calendarDateToLocal(value) : null;
  return (
    <DatePicker
      value={selected}
      initialMonth={selected ?? calendarDateToLocal(localToday())}
      minDate={calendarDateToLocal(DATE_RANGE.min)}
      maxDate={calendarDateToLocal(DATE_RANGE.max)}
      highlightCurrentDay
      canClearSelection={false}
      dateFnsLocaleLoader={noLocaleLoad}
      dayPickerProps={{ weekStartsOn: firstDayOfWeek(), initialFocus: true }}
      onChange={(date, isUserChange) => {
        if (date && isUserChange) onPick(localToCalendarDate(date));
      }}
    />
  );
}
