import { parseUdi, UdiError } from '@torquetrail/domain';

/**
 * The serial number and expiry date a recorded UDI carries, read with parseUdi (the GTIN is stored
 * in its own column for the lot look-up). Both null for a UDI the parser refuses, or none.
 */
export function udiFacts(udi: string | null): { serial: string | null; expiry: string | null } {
  if (!udi) return { serial: null, expiry: null };
  try {
    const parsed = parseUdi(udi);
    return { serial: parsed.serial ?? null, expiry: parsed.expiry ?? null };
  } catch (error) {
    if (error instanceof UdiError) return { serial: null, expiry: null };
    throw error;
  }
}
