// A digital impression records a scan body at every implant site. The scan body tells the lab
// software where the implant is and which connection it has: one of another platform puts the
// restoration's interface on the wrong connection, so it is an error naming the site.
import { type Finding, PLAN_SOURCES } from './plan-findings.js';

import type { ImpressionMethod } from './choices.js';

export type { ImpressionMethod } from './choices.js';

/** Stable codes of the findings of {@link checkScanBodies}. */
export const SCAN_BODY_FINDING_CODES = Object.freeze({
  MISSING: 'scan-body-missing',
  NOT_A_SCAN_BODY: 'scan-body-not-a-scan-body',
  PLATFORM_MISMATCH: 'scan-body-platform-mismatch',
  LOT_MISSING: 'scan-body-lot-missing',
  ANALOG_WITH_SCAN_BODY: 'scan-body-on-analog-impression',
  NOT_A_SITE: 'scan-body-not-a-site',
  SEATING_RADIOGRAPH_MISSING: 'scan-body-seating-radiograph-missing',
});

/** One site of the restoration, with the platform of its implant. */
export interface ImpressionSite {
  fdi: number;
  platformId: string;
  platformName: string;
}

/** The catalogue part recorded at a site, as far as this rule needs it. */
export interface ScanBodyEntry {
  fdi: number;
  part: { name: string; kind: string; platformId: string; platformName: string; requiresLot: boolean };
  lot: string | null;
}

/**
 * Findings (all errors) of the scan bodies of one impression: a digital impression needs exactly
 * one scan body per site of the restoration, of the kind `scan-body`, of the site's platform, with
 * its lot where the catalogue asks for one; an analog impression records none.
 */
export function checkScanBodies(
  method: ImpressionMethod,
  sites: readonly ImpressionSite[],
  entries: readonly ScanBodyEntry[],
): Finding[] {
  const findings: Finding[] = [];
  const error = (code: string, fdi: number, message: string) =>
    findings.push({ severity: 'error', code, fdi, message, source: PLAN_SOURCES.COMMON_PRACTICE });
  const C = SCAN_BODY_FINDING_CODES;
  if (method === 'analog') {
    for (const e of entries)
      error(C.ANALOG_WITH_SCAN_BODY, e.fdi, `An analog impression takes no scan body (site ${e.fdi})`);
    return findings;
  }
  for (const e of entries) {
    const site = sites.find((s) => s.fdi === e.fdi);
    if (!site) {
      error(C.NOT_A_SITE, e.fdi, `Site ${e.fdi} is not a site of this restoration`);
      continue;
    }
    if (e.part.kind !== 'scan-body') {
      error(C.NOT_A_SCAN_BODY, e.fdi, `${e.part.name} at site ${e.fdi} is not a scan body`);
    } else if (e.part.platformId !== site.platformId) {
      error(
        C.PLATFORM_MISMATCH,
        e.fdi,
        `${e.part.name} is for the ${e.part.platformName} platform; the implant at site ${e.fdi} is ${site.platformName}`,
      );
    }
    if (e.part.requiresLot && !e.lot) error(C.LOT_MISSING, e.fdi, `Record the lot of the scan body at site ${e.fdi}`);
  }
  for (const site of sites) {
    const count = entries.filter((e) => e.fdi === site.fdi).length;
    if (count !== 1)
      error(
        C.MISSING,
        site.fdi,
        count === 0
          ? `A digital impression needs a scan body at site ${site.fdi}`
          : `Record one scan body at site ${site.fdi}, not ${count}`,
      );
  }
  return findings;
}

/**
 * A digital impression whose scan bodies were not shown seated on a radiograph, where the practice
 * asks for one (its setting, off by default): a warning, since a scan body not fully down on the
 * implant moves the restoration's interface in the lab's model [common practice]. Analog
 * impressions and practices that do not ask get nothing.
 */
export function seatingRadiographFindings(
  method: ImpressionMethod,
  radiographLinked: boolean,
  practiceRequiresIt: boolean,
): Finding[] {
  if (method !== 'digital' || !practiceRequiresIt || radiographLinked) return [];
  return [
    {
      severity: 'warning',
      code: SCAN_BODY_FINDING_CODES.SEATING_RADIOGRAPH_MISSING,
      message:
        'The practice asks for a radiograph of the seated scan bodies: link one to this digital impression as its seating check',
      source: PLAN_SOURCES.COMMON_PRACTICE,
    },
  ];
}
