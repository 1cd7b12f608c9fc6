// A validation error on a field the form does not show (a value of the body no input edits, a
// field hidden by another choice) would stop the submit without a word. Every FormField and
// FieldError notes the error paths it shows; a failed submit puts the errors no rendered field
// shows in the form's summary (root.server, the one `formErrorMessage` reads), named in words.
import type { FieldErrors, FieldValues, UseFormReturn } from 'react-hook-form';
import { fieldLabel } from './field-labels';

/** Error paths shown by the mounted fields of each form, by its control (a path may be shown twice). */
const shown = new WeakMap<object, Map<string, number>>();

/** Notes that a form's `control` shows the errors at `names` until the returned cleanup runs. */
export function showErrorsAt(control: object, names: readonly string[]): () => void {
  const counts = shown.get(control) ?? new Map<string, number>();
  shown.set(control, counts);
  for (const name of names) counts.set(name, (counts.get(name) ?? 0) + 1);
  return () => {
    for (const name of names) {
      const left = (counts.get(name) ?? 1) - 1;
      if (left > 0) counts.set(name, left);
      else counts.delete(name);
    }
  };
}

/** The messages of an errors tree by path ('sites.0.axis'); a list's own message at the list's path. */
export function errorLeaves(errors: FieldErrors, prefix = ''): [string, string][] {
  return Object.entries(errors).flatMap(([key, node]): [string, string][] => {
    if (key === 'ref' || node === null || typeof node !== 'object') return [];
    // The form's own messages (root.server) are the summary itself, not a field.
    if (prefix === '' && key === 'root') return [];
    const path = key === 'root' ? prefix : prefix ? `${prefix}.${key}` : key;
    const own = node as { message?: unknown; type?: unknown };
    if (typeof own.message === 'string' && own.type !== undefined) return [[path, own.message]];
    return errorLeaves(node as FieldErrors, path);
  });
}

/** The sentence naming the errors no mounted field of the form shows, or undefined when all are shown. */
function hiddenErrorsSummary(errors: FieldErrors, control: object): string | undefined {
  const mounted = shown.get(control) ?? new Map<string, number>();
  const hidden = errorLeaves(errors).filter(([path]) => !mounted.has(path));
  if (hidden.length === 0) return undefined;
  return `Also to correct: ${hidden.map(([path, message]) => `${fieldLabel(path)}: ${message.replace(/\.$/, '')}.`).join(' ')}`;
}

const wrapped = new WeakSet();

/**
 * Makes the form's failed submits name, in its summary, the errors no mounted field shows. The
 * form object is react-hook-form's own (kept, not copied: a copy would freeze its formState).
 */
export function summariseHiddenErrors<Values extends FieldValues, Body>(
  form: Pick<UseFormReturn<Values, unknown, Body>, 'handleSubmit' | 'setError' | 'control'>,
): void {
  if (wrapped.has(form)) return;
  wrapped.add(form);
  const original = form.handleSubmit;
  form.handleSubmit = (onValid, onInvalid) =>
    original(onValid, async (errors, event) => {
      const summary = hiddenErrorsSummary(errors, form.control);
      if (summary) form.setError('root.server', { type: 'alone', message: summary });
      await onInvalid?.(errors, event);
    });
}
