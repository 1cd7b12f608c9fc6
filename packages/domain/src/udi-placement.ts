/**
 * A parsed UDI checked against the placement it is recorded with.
 *
 * Sources: a device past its use-by date (GS1 AI 17, the "use-by date" of the label, ISO 15223-1
 * symbol 5.1.4 [memory for the clause number]) is not to be used — [common practice] for implantable
 * devices; the lot is the traceability key of the placement, so a typed lot that differs from the
 * scanned one is a transcription error [common practice].
 *
 * Decisions: the expiry date itself is still usable (a device expires at the end of that day);
 * lots are compared exactly (GS1 lots are case-sensitive, set 82); nothing is said when either
 * side is missing.
 */
import type { ParsedUdi } from './udi.js';

export type UdiPlacementCode = 'lot-mismatch' | 'expired-before-placement';

export interface UdiPlacementFinding {
  code: UdiPlacementCode;
  /** The placement field the finding belongs beside: the typed lot, or the UDI. */
  field: 'lot' | 'udi';
  message: string;
}

/**
 * @param udi the result of `parseUdi`
 * @param placement the placement date (YYYY-MM-DD) and the typed lot, if any
 * @param writeDate how the message writes a date for its reader (the practice's order; the web and
 *   the API pass theirs). The domain has no date format of its own: YYYY-MM-DD when none is given.
 * @returns findings, empty when the UDI agrees with the placement
 */
export function checkUdiForPlacement(
  udi: ParsedUdi,
  placement: { placedOn: string; lot?: string | null },
  writeDate: (iso: string) => string = (iso) => iso,
): UdiPlacementFinding[] {
  const findings: UdiPlacementFinding[] = [];
  const typed = placement.lot ?? null;
  if (udi.lot !== undefined && typed !== null && typed !== '' && typed !== udi.lot) {
    findings.push({
      code: 'lot-mismatch',
      field: 'lot',
      message: `The typed lot ${typed} differs from the lot in the UDI (${udi.lot})`,
    });
  }
  if (udi.expiry !== undefined && udi.expiry < placement.placedOn) {
    findings.push({
      code: 'expired-before-placement',
      field: 'udi',
      message: `The implant's expiry date ${writeDate(udi.expiry)} (UDI element 17) is before the placement date ${writeDate(placement.placedOn)}`,
    });
  }
  return findings;
}
