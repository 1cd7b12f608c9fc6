/**
 * Validation of an implant restoration plan: connection (engaging / non-engaging), impression copings,
 * divergence between splinted implants, restorative space and site list.
 *
 * Sources: Jang HK et al. 2011, Int J Oral Maxillofac Implants 26:1011–1015 [pub] (impressions accurate
 * below about 15° of divergence); Carpentieri J, Greenstein G, Cavallaro J 2019, JADA 150(8):695–706 [pub]
 * (restorative space); ISO 3950 [memory] (tooth positions); prosthetic connection rules [common practice].
 *
 * Decisions where the sources are silent (also in docs/clinical-rules.md):
 * - Angled multi-unit abutments: with screw-to-multi-unit retention the divergence of a pair is reduced by
 *   the sum of both sites' multiUnitAngleDeg (best case: abutments oriented towards each other), floored at 0°;
 *   the warning fires when the residual is more than 15°. Other retentions get no correction.
 * - Full arch: fewer than 2 sites is an error (`site-count`); 2–3 sites is a warning
 *   (`few-implants-full-arch`, common practice is 4 or more; some 3-implant mandibular systems exist).
 * - The restorative-space check uses the smallest restorativeSpaceMm given; equal to the minimum passes.
 * - Primary-dentition positions are valid FDI numbers but implants are numbered at permanent positions:
 *   a warning (`primary-tooth-position`).
 * - For screw-to-multi-unit retention the `interface` field is not judged (only single crowns need it engaging).
 * - Overdentures (overdenture-plan.ts): a bar is splinted and judged like a bridge, with the bar-overdenture
 *   space minimum; stud attachments are judged per site against their catalogue tolerance, neither the
 *   interface nor the restorative space of a stud overdenture is judged (no published minimum here).
 */
import {
  IMPLANT_INTERFACES,
  type ImplantInterface,
  IMPRESSION_COPINGS,
  type ImpressionCoping,
  type MultiUnitAngleDeg,
  PART_ANGLE_RANGE_DEG,
  RESTORATION_KINDS,
  type RestorationKind,
  RETENTIONS,
  type Retention,
} from './choices.js';
import { divergenceDeg, type Vec3 } from './geometry.js';
import { divergenceFindings } from './restoration-plan-divergence.js';
import {
  type AttachmentFacts,
  isOverdentureKind,
  overdentureShapeFindings,
  studAttachmentFindings,
} from './overdenture-plan.js';
import { type Finding, PLAN_FINDING_CODES, PLAN_SOURCES } from './plan-findings.js';
import { ValidationError } from './errors.js';
import { RESTORATIVE_DESIGN_LABELS, minRestorativeSpaceMm, type RestorativeDesign } from './restorative-space.js';
import { isPrimaryTooth, isValidFdi, toothArch, type ToothArch } from './tooth-numbering.js';
import {
  EPS,
  fmt,
  optionalBoolean,
  requireArray,
  requireFinite,
  requireNonNegative,
  requireOneOf,
} from './validate.js';

// The lists of kinds, retentions, interfaces and copings live in choices.ts (a screen that only
// needs a list does not load these rules); re-exported here for the modules that import them from here.
export type { ImplantInterface, ImpressionCoping, MultiUnitAngleDeg, RestorationKind, Retention } from './choices.js';

/** Retentions where the restoration sits on an abutment, indexed to the implant's hex [common practice]. */
export const ABUTMENT_LEVEL_RETENTIONS: readonly Retention[] = Object.freeze([
  'cement-on-abutment',
  'lingual-set-screw',
]);

/**
 * True when the restoration can be taken off without cutting it: every retention but cement
 * [common practice: a cemented crown is cut off; screws and a lingual set screw are undone].
 */
export function isRetrievable(retention: Retention): boolean {
  return requireOneOf(retention, RETENTIONS, 'retention') !== 'cement-on-abutment';
}

/** One implant site of a plan. */
export interface RestorationPlanSite {
  /** FDI position of the implant. */
  fdi: number;
  interface: ImplantInterface;
  impressionCoping: ImpressionCoping;
  /** Implant axis direction (any units), for the divergence check. */
  axis?: Vec3;
  /** Angle of the multi-unit abutment, degrees. */
  multiUnitAngleDeg?: MultiUnitAngleDeg;
  /** Vertical restorative space at this site, mm. */
  restorativeSpaceMm?: number;
  /** The attachment abutment chosen (overdenture on stud attachments), with its catalogue values. */
  attachment?: AttachmentFacts | null;
}

/** A restoration plan to validate. */
export interface RestorationPlan {
  kind: RestorationKind;
  retention: Retention;
  /** Impression copings splinted together (e.g. with resin) before the impression is taken. */
  copingsSplinted?: boolean;
  sites: RestorationPlanSite[];
}

const RETENTION_LABELS: Record<Retention, string> = {
  'screw-to-implant': 'screw-retained on the implant',
  'screw-to-multi-unit': 'screw-retained on multi-unit abutments',
  'cement-on-abutment': 'cemented on an abutment',
  'lingual-set-screw': 'retained with a lingual set screw',
};

/**
 * Restorative design implied by a plan, for the space check: full-arch screw-retained → full-arch-hybrid;
 * other screw-to-implant → screw-implant-level; other screw-to-multi-unit → screw-abutment-level;
 * cement-on-abutment and lingual-set-screw → cement.
 */
export function restorativeDesignForPlan(plan: Pick<RestorationPlan, 'kind' | 'retention'>): RestorativeDesign {
  const kind = requireOneOf(plan.kind, RESTORATION_KINDS, 'plan.kind');
  const retention = requireOneOf(plan.retention, RETENTIONS, 'plan.retention');
  if (kind === 'overdenture-bar') return 'bar-overdenture';
  if (kind === 'full-arch' && (retention === 'screw-to-implant' || retention === 'screw-to-multi-unit'))
    return 'full-arch-hybrid';
  if (retention === 'screw-to-implant') return 'screw-implant-level';
  if (retention === 'screw-to-multi-unit') return 'screw-abutment-level';
  return 'cement';
}

/** Validates an axis (3 finite components, not zero), naming the plan's field in the error. */
function validateAxis(axis: Vec3, field: string): void {
  try {
    divergenceDeg(axis, axis);
  } catch (error) {
    if (error instanceof ValidationError) throw new ValidationError(error.code, error.message, field);
    throw error;
  }
}

function validateAttachment(part: AttachmentFacts, field: string): void {
  if (typeof part !== 'object' || typeof part.name !== 'string')
    throw new ValidationError('bad-value', 'The attachment is missing its name', field);
  if (part.maxDivergenceDeg !== null) requireNonNegative(part.maxDivergenceDeg, `${field}.maxDivergenceDeg`);
  if (part.collarHeightMm !== null) requireNonNegative(part.collarHeightMm, `${field}.collarHeightMm`);
}

/** A multi-unit angle within the range a catalogue may state. */
function requireAngle(value: unknown, field: string): void {
  const deg = requireFinite(value, field);
  const { min, max } = PART_ANGLE_RANGE_DEG;
  if (deg < min || deg > max)
    throw new ValidationError('out-of-range', `A multi-unit angle is from ${min}° to ${max}°; got ${fmt(deg)}°`, field);
}

function validateShape(plan: RestorationPlan): void {
  if (plan === null || typeof plan !== 'object') throw new ValidationError('bad-value', 'The plan is missing', 'plan');
  requireOneOf(plan.kind, RESTORATION_KINDS, 'plan.kind');
  requireOneOf(plan.retention, RETENTIONS, 'plan.retention');
  optionalBoolean(plan.copingsSplinted, 'plan.copingsSplinted');
  requireArray(plan.sites, 'plan.sites').forEach((s, i) => {
    const f = `plan.sites[${i}]`;
    if (s === null || typeof s !== 'object') throw new ValidationError('bad-value', 'A site of the plan is missing', f);
    const site = s as RestorationPlanSite;
    requireFinite(site.fdi, `${f}.fdi`);
    requireOneOf(site.interface, IMPLANT_INTERFACES, `${f}.interface`);
    requireOneOf(site.impressionCoping, IMPRESSION_COPINGS, `${f}.impressionCoping`);
    if (site.multiUnitAngleDeg !== undefined) requireAngle(site.multiUnitAngleDeg, `${f}.multiUnitAngleDeg`);
    if (site.restorativeSpaceMm !== undefined) requireNonNegative(site.restorativeSpaceMm, `${f}.restorativeSpaceMm`);
    if (site.axis !== undefined) validateAxis(site.axis, `${f}.axis`);
    if (site.attachment !== undefined && site.attachment !== null)
      validateAttachment(site.attachment, `${f}.attachment`);
  });
}

/**
 * Validates a restoration plan. Returns `[]` for a valid plan, otherwise the findings (errors first in the
 * order of the checks: site list, connections and impressions per site, divergence, restorative space).
 * @throws ValidationError for a malformed plan (unknown kind/retention/interface/coping, non-finite numbers,
 *   a negative restorative space, a zero or non-finite axis, a multi-unit angle outside 0–45°)
 */
export function validateRestorationPlan(plan: RestorationPlan): Finding[] {
  validateShape(plan);
  const findings: Finding[] = [];
  const { kind, retention, sites } = plan;
  const studs = kind === 'overdenture-studs';
  const splinted = kind !== 'single-crown' && !studs;
  const n = sites.length;

  // --- site list ---------------------------------------------------------------------------
  if (isOverdentureKind(kind)) {
    findings.push(...overdentureShapeFindings(kind, retention, n));
  } else if (kind === 'single-crown' && n !== 1) {
    findings.push({
      severity: 'error',
      code: PLAN_FINDING_CODES.SITE_COUNT,
      message: `A single crown is placed on exactly one implant; this plan lists ${n} sites.`,
      source: PLAN_SOURCES.COMMON_PRACTICE,
    });
  } else if (splinted && n < 2) {
    findings.push({
      severity: 'error',
      code: PLAN_FINDING_CODES.SITE_COUNT,
      message: `A ${kind === 'full-arch' ? 'full-arch restoration' : 'splinted bridge'} needs at least two implants; this plan lists ${n}.`,
      source: PLAN_SOURCES.COMMON_PRACTICE,
    });
  } else if (kind === 'full-arch' && n < 4) {
    findings.push({
      severity: 'warning',
      code: PLAN_FINDING_CODES.FEW_IMPLANTS_FULL_ARCH,
      message: `A fixed full-arch restoration is usually supported by at least four implants; this plan lists ${n}. Check that the implant system supports this design.`,
      source: PLAN_SOURCES.COMMON_PRACTICE,
    });
  }

  const seen = new Set<number>();
  const arches = new Map<ToothArch, number[]>();
  for (const site of sites) {
    if (!isValidFdi(site.fdi)) {
      findings.push({
        severity: 'error',
        code: PLAN_FINDING_CODES.INVALID_POSITION,
        message: `${String(site.fdi)} is not an FDI tooth position (11–18, 21–28, 31–38, 41–48).`,
        fdi: site.fdi,
        source: PLAN_SOURCES.ISO_3950,
      });
      continue;
    }
    if (seen.has(site.fdi)) {
      findings.push({
        severity: 'error',
        code: PLAN_FINDING_CODES.DUPLICATE_SITE,
        message: `Site ${site.fdi} is listed more than once; each implant site can appear only once in a plan.`,
        fdi: site.fdi,
        source: PLAN_SOURCES.COMMON_PRACTICE,
      });
      continue;
    }
    seen.add(site.fdi);
    if (isPrimaryTooth(site.fdi)) {
      findings.push({
        severity: 'warning',
        code: PLAN_FINDING_CODES.PRIMARY_TOOTH_POSITION,
        message: `Site ${site.fdi} is a primary-tooth position; implants are numbered at the permanent position they replace.`,
        fdi: site.fdi,
        source: PLAN_SOURCES.ISO_3950,
      });
    }
    const arch = toothArch(site.fdi);
    arches.set(arch, [...(arches.get(arch) ?? []), site.fdi]);
  }
  if ((splinted || studs) && arches.size === 2) {
    findings.push({
      severity: 'error',
      code: PLAN_FINDING_CODES.SITES_IN_BOTH_ARCHES,
      message: `One ${studs ? 'overdenture' : 'splinted restoration'} cannot join upper (${arches.get('upper')!.join(', ')}) and lower (${arches.get('lower')!.join(', ')}) implants; plan one restoration per arch.`,
      source: PLAN_SOURCES.COMMON_PRACTICE,
    });
  }

  // --- connection and impression, per site ----------------------------------------------------
  for (const site of sites) {
    const fdi = site.fdi;
    const at = `Site ${fdi}`;
    if (kind === 'single-crown' && site.interface === 'non-engaging') {
      findings.push({
        severity: 'error',
        code: PLAN_FINDING_CODES.NON_ENGAGING_SINGLE_CROWN,
        message: `${at}: a single crown needs an engaging (anti-rotational) connection; a non-engaging crown can turn on the implant and its screw will loosen.`,
        fdi,
        source: PLAN_SOURCES.COMMON_PRACTICE,
      });
    }
    if (splinted && retention === 'screw-to-implant' && site.interface === 'engaging') {
      findings.push({
        severity: 'error',
        code: PLAN_FINDING_CODES.ENGAGING_INTERFACE_ON_SPLINTED,
        message: `${at}: a splinted restoration screwed directly to the implants cannot seat on several hexes at once; use a non-engaging connection at every implant.`,
        fdi,
        source: PLAN_SOURCES.COMMON_PRACTICE,
      });
    }
    if (retention === 'screw-to-multi-unit') {
      if (site.impressionCoping !== 'multi-unit') {
        findings.push({
          severity: 'error',
          code: PLAN_FINDING_CODES.MULTI_UNIT_IMPRESSION_REQUIRED,
          message: `${at}: a restoration screwed to multi-unit abutments is recorded with multi-unit impression copings, not ${site.impressionCoping} implant-level copings.`,
          fdi,
          source: PLAN_SOURCES.COMMON_PRACTICE,
        });
      }
    } else {
      if (site.impressionCoping === 'multi-unit') {
        findings.push({
          severity: 'error',
          code: PLAN_FINDING_CODES.MULTI_UNIT_IMPRESSION_WITHOUT_ABUTMENT,
          message: `${at}: a multi-unit impression coping was chosen, but the restoration is ${RETENTION_LABELS[retention]}, without multi-unit abutments.`,
          fdi,
          source: PLAN_SOURCES.COMMON_PRACTICE,
        });
      }
      if (site.multiUnitAngleDeg !== undefined && site.multiUnitAngleDeg !== 0) {
        findings.push({
          severity: 'warning',
          code: PLAN_FINDING_CODES.MULTI_UNIT_ANGLE_WITHOUT_ABUTMENT,
          message: `${at}: a ${site.multiUnitAngleDeg}° multi-unit abutment is noted, but the restoration is ${RETENTION_LABELS[retention]}; the angle is ignored.`,
          fdi,
          source: PLAN_SOURCES.COMMON_PRACTICE,
        });
      }
      if (retention === 'screw-to-implant' && splinted && site.impressionCoping === 'engaging') {
        findings.push({
          severity: 'error',
          code: PLAN_FINDING_CODES.ENGAGING_IMPRESSION_FOR_PLATFORM_BRIDGE,
          message: `${at}: a splinted restoration screwed directly to the implants is made from non-engaging impression copings; an engaging coping records the inside of the connection, which the framework will not use.`,
          fdi,
          source: PLAN_SOURCES.COMMON_PRACTICE,
        });
      }
      // A stud attachment is round: neither it nor its denture housing uses the implant's hex.
      const indexed =
        ABUTMENT_LEVEL_RETENTIONS.includes(retention) || (retention === 'screw-to-implant' && kind === 'single-crown');
      if (indexed && site.impressionCoping === 'non-engaging') {
        findings.push({
          severity: 'error',
          code: PLAN_FINDING_CODES.NON_ENGAGING_IMPRESSION_FOR_INDEXED,
          message: `${at}: a restoration ${RETENTION_LABELS[retention]} needs an engaging impression coping to transfer the position of the implant's hex.`,
          fdi,
          source: PLAN_SOURCES.COMMON_PRACTICE,
        });
      }
    }
  }

  if (plan.copingsSplinted === true && n >= 2) {
    const engaging = sites.filter((s) => s.impressionCoping === 'engaging').map((s) => s.fdi);
    if (engaging.length > 0) {
      findings.push({
        severity: 'warning',
        code: PLAN_FINDING_CODES.SPLINTED_ENGAGING_COPINGS,
        message: `Engaging impression copings (at ${engaging.join(', ')}) are splinted together; engaging copings on implants that are not parallel may not share a path of draw, so the splinted impression may not come out or may distort. Use non-engaging copings or leave them unsplinted.`,
        source: PLAN_SOURCES.COMMON_PRACTICE,
      });
    }
  }

  // --- divergence between the implants of one splinted restoration ----------------------------
  if (splinted) findings.push(...divergenceFindings(retention === 'screw-to-multi-unit', sites));
  // --- stud attachments: each judged against its own stated tolerance (overdenture-plan.ts) ----
  if (studs) findings.push(...studAttachmentFindings(sites));

  // --- restorative space ---------------------------------------------------------------------
  // Carpentieri 2019 gives no minimum for stud attachments: the space of a stud overdenture is not judged.
  const spaced = studs ? [] : sites.filter((s) => s.restorativeSpaceMm !== undefined);
  if (spaced.length > 0) {
    const tightest = spaced.reduce((m, s) => (s.restorativeSpaceMm! < m.restorativeSpaceMm! ? s : m));
    const design = restorativeDesignForPlan(plan);
    const min = minRestorativeSpaceMm(design);
    if (tightest.restorativeSpaceMm! < min - EPS) {
      findings.push({
        severity: 'error',
        code: PLAN_FINDING_CODES.INSUFFICIENT_RESTORATIVE_SPACE,
        message: `Site ${tightest.fdi}: ${fmt(tightest.restorativeSpaceMm!)} mm of vertical restorative space is less than the ${fmt(min)} mm needed for a ${RESTORATIVE_DESIGN_LABELS[design]}.`,
        fdi: tightest.fdi,
        source: PLAN_SOURCES.CARPENTIERI_2019,
      });
    }
  }
  return findings;
}
