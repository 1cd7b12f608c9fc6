/**
 * Does a chosen part fit what the restoration needs? Two facts the practice's catalogue states per
 * part (from the manufacturer's instructions for use, which rule):
 *
 * - **Coping level** of an impression coping or scan body: it records the implant itself
 *   (`implant`) or a multi-unit abutment screwed on it (`multi-unit`). A restoration screwed to
 *   multi-unit abutments is made on the abutments' platform, so its impression must record them;
 *   any other restoration has no multi-unit abutment to record [common practice]. A mismatch is an
 *   error: the lab would make the restoration on the wrong level. A part whose entry states no
 *   level is a warning (`catalogue-coping-level-missing`): a coping of the wrong level does not seat
 *   at the impression visit, and a scan body's level is chosen again in the lab's software, so the
 *   mistake is found before anything is made [decision].
 * - **Engaging** of an abutment chosen for a restoration that sits on abutments (cemented or with a
 *   lingual set screw). A single unit turns on its implant unless its abutment is indexed to the
 *   connection, so a single crown needs an engaging (anti-rotational) abutment; units splinted
 *   together are kept from turning by the splint, so engaging or not is left to the clinician
 *   [common practice; the same reasoning as `non-engaging-single-crown` and the coping rules in
 *   restoration-plan.ts]. The abutment's stated engaging must also agree with the connection the
 *   plan states at the site. A single crown's abutment stating neither is an error (nothing catches
 *   a non-engaging one before the crown turns); on splinted units a warning [decision, as for copings].
 *
 * The implant's connection is not judged beyond this: every part must already be of the site's
 * platform (plan-check.ts, scan-bodies.ts), and the platform carries the connection.
 */
import { type Finding, PLAN_SOURCES } from './plan-findings.js';
import type { ImplantInterface, RestorationKind, Retention } from './restoration-plan.js';
import type { CopingLevel } from './choices.js';

/** Stable codes of the findings of this module. */
export const PART_FIT_FINDING_CODES = Object.freeze({
  COPING_LEVEL_MISMATCH: 'coping-level-mismatch',
  COPING_LEVEL_MISSING: 'catalogue-coping-level-missing',
  ABUTMENT_NON_ENGAGING_SINGLE: 'abutment-non-engaging-single-unit',
  ABUTMENT_INTERFACE_DISAGREES: 'abutment-interface-disagrees',
  ABUTMENT_ENGAGING_MISSING: 'catalogue-abutment-engaging-missing',
} as const);

/** The level an impression must record for a restoration of this retention. */
export function impressionLevelFor(retention: Retention): CopingLevel {
  return retention === 'screw-to-multi-unit' ? 'multi-unit' : 'implant';
}

/** An impression coping or scan body as far as the level rule reads it. */
export interface LevelledPart {
  name: string;
  copingLevel: CopingLevel | null;
}

const ROLE_WORDS = { coping: 'impression coping', 'scan body': 'scan body' } as const;

/**
 * Findings of one impression part at a site against the restoration's retention: an error when its
 * stated level is not the one the restoration needs, a warning when the catalogue states none.
 */
export function impressionLevelFindings(
  retention: Retention,
  fdi: number,
  role: keyof typeof ROLE_WORDS,
  part: LevelledPart,
): Finding[] {
  const needed = impressionLevelFor(retention);
  const C = PART_FIT_FINDING_CODES;
  const what = ROLE_WORDS[role];
  if (part.copingLevel === null)
    return [
      {
        severity: 'warning',
        code: C.COPING_LEVEL_MISSING,
        fdi,
        message: `Site ${fdi}: the catalogue does not state whether ${part.name} works at implant level or on a multi-unit abutment, so it cannot be checked against this restoration (it needs a ${needed === 'multi-unit' ? 'multi-unit level' : 'implant-level'} ${what}). Enter it in the catalogue.`,
        source: PLAN_SOURCES.COMMON_PRACTICE,
      },
    ];
  if (part.copingLevel === needed) return [];
  return [
    {
      severity: 'error',
      code: C.COPING_LEVEL_MISMATCH,
      fdi,
      message:
        needed === 'multi-unit'
          ? `Site ${fdi}: ${part.name} works at implant level, but this restoration is screwed to multi-unit abutments: the impression must record the abutment with a multi-unit level ${what}.`
          : `Site ${fdi}: ${part.name} works on a multi-unit abutment, but this restoration has none: use an implant-level ${what}.`,
      source: PLAN_SOURCES.COMMON_PRACTICE,
    },
  ];
}

/** An abutment as far as the engaging rule reads it. */
export interface EngagingPart {
  name: string;
  engaging: boolean | null;
}

/** One site as the abutment and connection rules read it. */
export interface FitSite {
  fdi: number;
  /** The connection the plan states at the site (the abutment's, on an abutment-level restoration). */
  interface?: ImplantInterface;
  /** The abutment chosen, on a restoration that sits on abutments. */
  abutment?: EngagingPart;
}

/**
 * Findings of the abutments chosen on a restoration that sits on abutments (the caller passes them
 * only for `cement-on-abutment` and `lingual-set-screw`). See the module comment for each rule.
 */
export function engagingFindings(plan: { kind: RestorationKind }, sites: readonly FitSite[]): Finding[] {
  const findings: Finding[] = [];
  const C = PART_FIT_FINDING_CODES;
  const single = plan.kind === 'single-crown';
  const source = PLAN_SOURCES.COMMON_PRACTICE;
  for (const { fdi, abutment, interface: stated } of sites) {
    if (!abutment) continue;
    if (abutment.engaging === null) {
      findings.push({
        severity: single ? 'error' : 'warning',
        code: C.ABUTMENT_ENGAGING_MISSING,
        fdi,
        message: single
          ? `Site ${fdi}: the catalogue does not state whether ${abutment.name} is engaging. A single crown needs an engaging (anti-rotational) abutment; enter it in the catalogue before saving.`
          : `Site ${fdi}: the catalogue does not state whether ${abutment.name} is engaging, so it cannot be checked against the connection planned. Enter it in the catalogue.`,
        source,
      });
      continue;
    }
    if (single && !abutment.engaging) {
      findings.push({
        severity: 'error',
        code: C.ABUTMENT_NON_ENGAGING_SINGLE,
        fdi,
        message: `Site ${fdi}: ${abutment.name} is non-engaging. A single crown needs an engaging (anti-rotational) abutment: on a non-engaging one the crown and abutment can turn and the screw loosen.`,
        source,
      });
    } else if (stated && (stated === 'engaging') !== abutment.engaging) {
      findings.push({
        severity: 'error',
        code: C.ABUTMENT_INTERFACE_DISAGREES,
        fdi,
        message: `Site ${fdi}: ${abutment.name} is ${abutment.engaging ? 'engaging' : 'non-engaging'}, but the plan says the connection there is ${stated}. Choose the abutment or the connection that matches.`,
        source,
      });
    }
  }
  return findings;
}
