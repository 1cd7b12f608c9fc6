/**
 * The catalogue values the plan's rules read, and the Findings for a chosen part whose catalogue entry
 * does not state one. The rules never guess a value from a part's name or from a list in the code:
 * each practice's catalogue states it (from the manufacturer's instructions for use, which rule).
 *
 * What each rule reads:
 * - the divergence check (restoration-plan-divergence.ts, Jang HK et al. 2011 [pub]) reads the angle of
 *   the multi-unit abutment at each site of a splinted restoration screwed to multi-units;
 * - an angled abutment is chosen for its angle: the planner shows it and the lab prescription carries it;
 * - the check of the impression coping against the technique reads whether the coping is engaging;
 * - the impression's level (part-fit.ts) reads the coping level of the coping: implant or multi-unit;
 * - the abutment of a restoration that sits on abutments is checked for engaging (part-fit.ts).
 * Collar height is shown beside the part but no current rule reads it, so a missing one is no Finding.
 *
 * Severity when the value is missing (decisions, also in docs/clinical-rules.md):
 * - Multi-unit angle, splinted on multi-units: the divergence check then treats the abutment as straight
 *   (0°). That can add a divergence warning but never hide one, so it is decided safely: a warning to
 *   acknowledge. When the plan itself credits a correction angle the catalogue does not state, that
 *   correction could hide a divergence beyond 15°: an error, and the plan cannot be saved.
 * - Angled abutment angle: nothing is computed with it, the clinician and the lab check it: a warning.
 * - Coping engaging or not, on a restoration indexed to the implant's hex (a single crown, or an abutment
 *   level restoration): a non-engaging coping loses the hex's position and the crown is made turned;
 *   nothing would catch it before the try-in, so the rule cannot be decided safely: an error. On other
 *   restorations (non-engaging or multi-unit copings are wanted) a wrong coping is found at the
 *   impression visit: a warning.
 */
import { type Finding, PLAN_SOURCES } from './plan-findings.js';
import type { CopingLevel } from './choices.js';
import { engagingFindings, impressionLevelFindings } from './part-fit.js';
import {
  ABUTMENT_LEVEL_RETENTIONS,
  type ImplantInterface,
  type RestorationKind,
  type Retention,
} from './restoration-plan.js';

/** Stable codes of the findings of {@link catalogueValueFindings}. */
export const CATALOGUE_VALUE_FINDING_CODES = Object.freeze({
  MULTI_UNIT_ANGLE_MISSING: 'catalogue-multi-unit-angle-missing',
  ABUTMENT_ANGLE_MISSING: 'catalogue-abutment-angle-missing',
  COPING_ENGAGING_MISSING: 'catalogue-coping-engaging-missing',
} as const);

/** The catalogue values a rule reads. */
export type CatalogueValue = 'angleDeg' | 'engaging' | 'copingLevel';

/**
 * The values the plan's rules read from a part of this catalogue kind (kinds not listed: none). The
 * catalogue page marks a part lacking one of them.
 */
export function catalogueValuesRead(kind: string): readonly CatalogueValue[] {
  if (kind === 'multi-unit-abutment') return ['angleDeg'];
  if (kind === 'abutment-angled') return ['angleDeg', 'engaging'];
  if (kind === 'abutment-stock' || kind === 'abutment-custom') return ['engaging'];
  if (kind === 'impression-coping') return ['engaging', 'copingLevel'];
  if (kind === 'scan-body') return ['copingLevel'];
  return [];
}

/** A catalogue part as far as these rules read it. */
export interface PartValues {
  name: string;
  kind: string;
  angleDeg: number | null;
  engaging: boolean | null;
  /** Impression copings and scan bodies: implant level or on a multi-unit abutment (part-fit.ts). */
  copingLevel: CopingLevel | null;
}

/** The parts chosen at one site of a plan. */
export interface SiteParts {
  fdi: number;
  multiUnit?: PartValues;
  abutment?: PartValues;
  impressionCoping?: PartValues;
  /** The connection the plan states at the site: the abutment's stated engaging must agree (part-fit.ts). */
  interface?: ImplantInterface;
  /** A multi-unit angle entered for the site itself (not read from the catalogue), degrees. */
  enteredMultiUnitAngleDeg?: number | null;
}

/** The plan's kind and retention, as these rules read them. */
export interface PlanShape {
  kind: RestorationKind;
  retention: Retention;
}

/**
 * Findings for each chosen part whose catalogue entry lacks a value a rule of this plan reads (see the
 * module comment for each severity). A part in a slot the retention does not use is not judged.
 */
export function catalogueValueFindings(plan: PlanShape, sites: readonly SiteParts[]): Finding[] {
  const findings: Finding[] = [];
  const C = CATALOGUE_VALUE_FINDING_CODES;
  const splinted = plan.kind !== 'single-crown';
  const source = PLAN_SOURCES.COMMON_PRACTICE;
  for (const site of sites) {
    const { fdi } = site;
    const mua = site.multiUnit;
    if (plan.retention === 'screw-to-multi-unit' && splinted && mua && mua.angleDeg === null) {
      const entered = site.enteredMultiUnitAngleDeg ?? 0;
      findings.push(
        entered > 0
          ? {
              severity: 'error',
              code: C.MULTI_UNIT_ANGLE_MISSING,
              fdi,
              message: `Site ${fdi}: the catalogue does not state the angle of ${mua.name}, so the ${entered}° correction entered for it cannot be checked and could hide a divergence beyond 15°. Enter the angle in the catalogue.`,
              source: `${PLAN_SOURCES.JANG_2011}; ${source}`,
            }
          : {
              severity: 'warning',
              code: C.MULTI_UNIT_ANGLE_MISSING,
              fdi,
              message: `Site ${fdi}: the catalogue does not state the angle of ${mua.name}. The divergence check treats it as straight (0°), which can add a warning but never hide one; enter the angle in the catalogue.`,
              source: `${PLAN_SOURCES.JANG_2011}; ${source}`,
            },
      );
    }
    const abutment = site.abutment;
    if (
      ABUTMENT_LEVEL_RETENTIONS.includes(plan.retention) &&
      abutment?.kind === 'abutment-angled' &&
      abutment.angleDeg === null
    ) {
      findings.push({
        severity: 'warning',
        code: C.ABUTMENT_ANGLE_MISSING,
        fdi,
        message: `Site ${fdi}: the catalogue does not state the angle of ${abutment.name}, so neither you nor the lab can check the correction it gives. Enter the angle in the catalogue.`,
        source,
      });
    }
    const coping = site.impressionCoping;
    if (coping && coping.engaging === null) {
      const indexed =
        ABUTMENT_LEVEL_RETENTIONS.includes(plan.retention) || (plan.retention === 'screw-to-implant' && !splinted);
      findings.push({
        severity: indexed ? 'error' : 'warning',
        code: C.COPING_ENGAGING_MISSING,
        fdi,
        message: indexed
          ? `Site ${fdi}: the catalogue does not state whether ${coping.name} is engaging. This restoration needs the position of the implant's hex, which a non-engaging coping loses; enter it in the catalogue before saving.`
          : `Site ${fdi}: the catalogue does not state whether ${coping.name} is engaging, so it cannot be checked against the impression technique. Enter it in the catalogue.`,
        source,
      });
    }
    if (coping) findings.push(...impressionLevelFindings(plan.retention, fdi, 'coping', coping));
  }
  if (ABUTMENT_LEVEL_RETENTIONS.includes(plan.retention)) findings.push(...engagingFindings(plan, sites));
  return findings;
}
