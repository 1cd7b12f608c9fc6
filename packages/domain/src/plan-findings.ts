/**
 * The vocabulary of a plan's Findings: severities, the finding shape, stable codes and the sources
 * named in them. Shared by the plan's rule modules (restoration-plan.ts and its divergence checks).
 */
import type { FindingSeverity } from './choices.js';

export type { FindingSeverity } from './choices.js';

/** One problem found in a plan. */
export interface Finding {
  severity: FindingSeverity;
  /** Stable code, see {@link PLAN_FINDING_CODES}. */
  code: string;
  /** Plain clinical English. */
  message: string;
  /** FDI position concerned, when the finding concerns one site. */
  fdi?: number;
  /** Source of the rule (author year, journal) or 'common practice'. */
  source?: string;
}

/** Stable codes of the findings of `validateRestorationPlan` (restoration-plan.ts). */
export const PLAN_FINDING_CODES = Object.freeze({
  SITE_COUNT: 'site-count',
  FEW_IMPLANTS_FULL_ARCH: 'few-implants-full-arch',
  INVALID_POSITION: 'invalid-position',
  PRIMARY_TOOTH_POSITION: 'primary-tooth-position',
  DUPLICATE_SITE: 'duplicate-site',
  SITES_IN_BOTH_ARCHES: 'sites-in-both-arches',
  ENGAGING_INTERFACE_ON_SPLINTED: 'engaging-interface-on-splinted',
  ENGAGING_IMPRESSION_FOR_PLATFORM_BRIDGE: 'engaging-impression-for-platform-bridge',
  NON_ENGAGING_IMPRESSION_FOR_INDEXED: 'non-engaging-impression-for-indexed',
  NON_ENGAGING_SINGLE_CROWN: 'non-engaging-single-crown',
  MULTI_UNIT_IMPRESSION_REQUIRED: 'multi-unit-impression-required',
  MULTI_UNIT_IMPRESSION_WITHOUT_ABUTMENT: 'multi-unit-impression-without-abutment',
  MULTI_UNIT_ANGLE_WITHOUT_ABUTMENT: 'multi-unit-angle-without-abutment',
  SPLINTED_ENGAGING_COPINGS: 'splinted-engaging-copings',
  DIVERGENCE_OVER_LIMIT: 'divergence-over-limit',
  ANGLED_MULTI_UNIT_NOT_NEEDED: 'angled-multi-unit-not-needed',
  INSUFFICIENT_RESTORATIVE_SPACE: 'insufficient-restorative-space',
  OVERDENTURE_RETENTION: 'overdenture-retention',
  ATTACHMENT_MISSING: 'attachment-missing',
  ATTACHMENT_DIVERGENCE_OVER_TOLERANCE: 'attachment-divergence-over-tolerance',
  CATALOGUE_VALUE_MISSING: 'catalogue-value-missing',
} as const);

/** Source strings used in findings. */
export const PLAN_SOURCES = Object.freeze({
  JANG_2011: 'Jang HK et al. 2011, Int J Oral Maxillofac Implants 26:1011–1015',
  CARPENTIERI_2019: 'Carpentieri J, Greenstein G, Cavallaro J 2019, JADA 150(8):695–706',
  ISO_3950: 'ISO 3950 (FDI two-digit notation) [memory]',
  COMMON_PRACTICE: 'common practice',
  OVERDENTURE_CONSENSUS:
    'McGill consensus (Feine JS et al. 2002) and York consensus (Thomason JM et al. 2009) on the two-implant mandibular overdenture',
  CATALOGUE: "the practice's catalogue (manufacturer's stated value)",
} as const);
