import { InputGroup } from '@blueprintjs/core';
import { describeUdiError } from '@torquetrail/contracts';
import { checkUdiForPlacement, type ParsedUdi, parseUdi, UdiError } from '@torquetrail/domain';
import { useFormContext, useWatch } from 'react-hook-form';
import { formatDate } from '../../../lib/dates';
import { FormField, withInputRef } from '../../../lib/forms';

export type UdiReading = { ok: true; udi: ParsedUdi } | { ok: false; message: string } | null;

/** The same `parseUdi` the server runs, on what was scanned or typed; null when the field is empty. */
export function readUdi(text: string): UdiReading {
  if (!text.trim()) return null;
  try {
    return { ok: true, udi: parseUdi(text) };
  } catch (error) {
    if (error instanceof UdiError) return { ok: false, message: describeUdiError(error.code, error.message) };
    throw error;
  }
}

/** The placement form's values this field reads and fills. */
interface UdiFieldValues {
  udi: string;
  placedOn: string;
  lot: string;
}

/**
 * UDI as scanned (raw, with GS separators) or typed (human-readable "(01)…(17)…(10)…"). It is read
 * live: GTIN, lot and expiry — or the reason it cannot be read — beside the field; a lot in the
 * UDI fills the form's lot.
 */
export function UdiField() {
  const { control, register, setValue } = useFormContext<UdiFieldValues>();
  const [value, placedOn] = useWatch({ control, name: ['udi', 'placedOn'] });
  const reading = readUdi(value);
  // Only the UDI's own findings here; a lot mismatch shows beside the lot field.
  const expired =
    reading?.ok && placedOn
      ? checkUdiForPlacement(reading.udi, { placedOn }, formatDate).find((f) => f.field === 'udi')
      : undefined;
  const live = reading && !reading.ok ? reading.message : expired?.message;
  const field = register('udi', {
    onChange: (event: { target: { value: string } }) => {
      const scanned = readUdi(event.target.value);
      if (scanned?.ok && scanned.udi.lot) setValue('lot', scanned.udi.lot);
    },
  });
  return (
    <FormField
      name="udi"
      live={live}
      prefer="live"
      label="UDI (scan or type)"
      labelFor="placement-udi"
      subLabel="Optional. GS1 element string, e.g. (01)…(17)…(10)…"
    >
      <InputGroup
        id="placement-udi"
        className="mono"
        autoComplete="off"
        spellCheck={false}
        aria-describedby="placement-udi-reading"
        {...withInputRef(field)}
      />
      <div id="placement-udi-reading" aria-live="polite" data-testid="udi-reading">
        {reading?.ok && (
          <dl className="placement-udi__reading">
            <dt>GTIN</dt>
            <dd className="mono" data-testid="udi-gtin">
              {reading.udi.gtin}
            </dd>
            <dt>Lot</dt>
            <dd className="mono" data-testid="udi-lot">
              {reading.udi.lot ?? 'not in the UDI'}
            </dd>
            <dt>Expiry</dt>
            <dd data-testid="udi-expiry">
              {reading.udi.expiry ? (
                <time dateTime={reading.udi.expiry}>{formatDate(reading.udi.expiry)}</time>
              ) : (
                'not in the UDI'
              )}
            </dd>
            {reading.udi.serial && (
              <>
                <dt>Serial</dt>
                <dd className="mono">{reading.udi.serial}</dd>
              </>
            )}
          </dl>
        )}
      </div>
    </FormField>
  );
}
