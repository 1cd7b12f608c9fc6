/**
 * Peri-implant health, mucositis and peri-implantitis after the 2017 World Workshop case definitions.
 *
 * Sources [pub]: Berglundh T et al. 2018, consensus report of workgroup 4,
 * J Clin Periodontol 45(S20):S286–S291 and J Periodontol 89(S1):S313–S318;
 * Renvert S et al. 2018, J Periodontol 89(S1):S304–S312.
 *
 * - Health: no BOP, no SUP, no bone loss beyond initial remodelling.
 * - Mucositis: BOP and/or SUP, no bone loss beyond initial remodelling.
 * - Peri-implantitis: BOP and/or SUP, and increased PD compared with the baseline, and bone loss
 *   beyond initial remodelling.
 * - Without a baseline: BOP/SUP with PD ≥ 6 mm and bone level ≥ 3 mm (all three — Torquetrail
 *   follows the consensus report, not the case-definition paper's "and/or").
 *
 * Thresholds for "increased PD" (default 1 mm) and "bone loss beyond remodelling" (default 0.5 mm)
 * are parameters [common practice; radiographic measurement error is of that order]. Both are
 * inclusive: an increase of exactly 1 mm, a loss of exactly 0.5 mm counts [decision].
 *
 * Decisions where the sources are silent (also in docs/clinical-rules.md):
 * - The status is that of the worst site; bone level is one value per implant (worse of mesial/distal).
 * - With a baseline, probing sites are compared one to one, in order; both lists must have the same length.
 * - No current bone level: peri-implantitis is never returned (it requires radiographic bone loss);
 *   inflamed sites give mucositis and the flag `bone-level-missing` says peri-implantitis cannot be excluded.
 *   Without baseline and without bone level an inflamed site with PD ≥ 6 mm additionally gets
 *   `peri-implantitis-not-excluded-without-baseline`.
 * - No inflammation but bone loss beyond the threshold (or bone level ≥ 3 mm without baseline): status
 *   'health' (no BOP/SUP; health can exist with reduced bone support) with the flag `bone-loss-without-inflammation`.
 */
import { PERI_IMPLANT_FLAGS, type PeriImplantFlag, type PeriImplantStatus } from './choices.js';
import { ValidationError } from './errors.js';
import { EPS, fmt, requireArray, requireBoolean, requireNonNegative } from './validate.js';

export type { PeriImplantStatus } from './choices.js';

/** One probing site of the current exam. */
export interface PeriImplantSite {
  /** Probing depth, mm (≥ 0). */
  probingDepthMm: number;
  /** Bleeding on probing (BOP). */
  bleeding: boolean;
  /** Suppuration (SUP). */
  suppuration: boolean;
}

/** Current peri-implant exam of one implant. */
export interface PeriImplantExam {
  /** Probing sites (commonly 4 or 6), in a fixed order. */
  sites: PeriImplantSite[];
  /**
   * Radiographic bone level, mm from the most coronal intra-osseous part of the implant to the first
   * bone contact, the worse of mesial/distal (≥ 0). Optional: without it peri-implantitis cannot be diagnosed.
   */
  boneLevelMm?: number;
}

/** Baseline exam, taken when the prosthesis was completed. */
export interface PeriImplantBaseline {
  /** Probing depths at the same sites, in the same order as the current exam. */
  sites: { probingDepthMm: number }[];
  /** Bone level at baseline, mm, measured as in {@link PeriImplantExam.boneLevelMm}. */
  boneLevelMm: number;
}

/** Thresholds for "increased PD" and "bone loss beyond initial remodelling". */
export interface PeriImplantOptions {
  /** PD increase over baseline that counts as increased, mm, inclusive. Default 1. */
  pdIncreaseMm?: number;
  /** Bone loss since baseline that counts as beyond remodelling, mm, inclusive. Default 0.5. */
  boneLossMm?: number;
}

/** Result of {@link classifyPeriImplant}. */
export interface PeriImplantResult {
  status: PeriImplantStatus;
  /** Human-readable reasons, per site (e.g. "site 3: BOP, PD 6 mm") then for the implant. */
  reasons: string[];
  /** Stable flag strings, see {@link PERI_IMPLANT_FLAGS}. */
  flags: PeriImplantFlag[];
}

/** Default PD increase that counts as increased, mm [common practice]. */
export const DEFAULT_PD_INCREASE_MM = 1;
/** Default bone loss beyond baseline that counts as beyond initial remodelling, mm [common practice]. */
export const DEFAULT_BONE_LOSS_MM = 0.5;
/** No-baseline probing-depth limit, mm, inclusive (Berglundh 2018) [pub]. */
export const NO_BASELINE_PD_MM = 6;
/** No-baseline bone-level limit, mm apical to the most coronal intra-osseous part, inclusive (Berglundh 2018) [pub]. */
export const NO_BASELINE_BONE_LEVEL_MM = 3;

const RANK: Record<PeriImplantStatus, number> = { health: 0, mucositis: 1, 'peri-implantitis': 2 };

function validateExam(exam: PeriImplantExam): void {
  if (exam === null || typeof exam !== 'object') throw new ValidationError('bad-value', 'The exam is missing', 'exam');
  const sites = requireArray(exam.sites, 'exam.sites');
  if (sites.length === 0) throw new ValidationError('empty', 'Record at least one probing site', 'exam.sites');
  sites.forEach((s, i) => {
    const site = s as PeriImplantSite;
    if (site === null || typeof site !== 'object')
      throw new ValidationError('bad-value', 'A probing site is missing', `exam.sites[${i}]`);
    requireNonNegative(site.probingDepthMm, `exam.sites[${i}].probingDepthMm`);
    requireBoolean(site.bleeding, `exam.sites[${i}].bleeding`);
    requireBoolean(site.suppuration, `exam.sites[${i}].suppuration`);
  });
  if (exam.boneLevelMm !== undefined) requireNonNegative(exam.boneLevelMm, 'exam.boneLevelMm');
}

function validateBaseline(baseline: PeriImplantBaseline, siteCount: number): void {
  if (baseline === null || typeof baseline !== 'object')
    throw new ValidationError('bad-value', 'The baseline exam is missing', 'baseline');
  const sites = requireArray(baseline.sites, 'baseline.sites');
  if (sites.length === 0)
    throw new ValidationError('empty', 'The baseline exam has no probing sites', 'baseline.sites');
  if (sites.length !== siteCount) {
    throw new ValidationError(
      'site-mismatch',
      `The baseline exam has ${sites.length} probing sites and this exam ${siteCount}; they are compared site by site`,
      'baseline.sites',
    );
  }
  sites.forEach((s, i) => {
    if (s === null || typeof s !== 'object')
      throw new ValidationError('bad-value', 'A probing site of the baseline exam is missing', `baseline.sites[${i}]`);
    requireNonNegative((s as { probingDepthMm: unknown }).probingDepthMm, `baseline.sites[${i}].probingDepthMm`);
  });
  requireNonNegative(baseline.boneLevelMm, 'baseline.boneLevelMm');
}

/**
 * Classifies one implant as health, mucositis or peri-implantitis (2017 World Workshop, consensus-report reading).
 *
 * @param exam current exam: probing sites and, optionally, the radiographic bone level
 * @param baseline exam at prosthesis completion; when absent the no-baseline definition is used and flagged
 * @param options thresholds: `pdIncreaseMm` (default 1), `boneLossMm` (default 0.5), both inclusive
 * @throws ValidationError for NaN/negative depths or bone levels, empty site lists, mismatched baseline sites
 */
export function classifyPeriImplant(
  exam: PeriImplantExam,
  baseline?: PeriImplantBaseline,
  options?: PeriImplantOptions,
): PeriImplantResult {
  validateExam(exam);
  if (baseline !== undefined) validateBaseline(baseline, exam.sites.length);
  const pdIncreaseMm =
    options?.pdIncreaseMm === undefined
      ? DEFAULT_PD_INCREASE_MM
      : requireNonNegative(options.pdIncreaseMm, 'options.pdIncreaseMm');
  const boneLossLimitMm =
    options?.boneLossMm === undefined
      ? DEFAULT_BONE_LOSS_MM
      : requireNonNegative(options.boneLossMm, 'options.boneLossMm');

  const flags = new Set<PeriImplantFlag>();
  const reasons: string[] = [];
  const boneLevel = exam.boneLevelMm;

  // Implant-level bone criterion: true / false / null (unknown).
  let boneCriterion: boolean | null;
  let boneLine: string;
  if (baseline !== undefined) {
    if (boneLevel === undefined) {
      boneCriterion = null;
      boneLine = 'no current bone level: bone loss since baseline cannot be judged';
    } else {
      const loss = boneLevel - baseline.boneLevelMm;
      boneCriterion = loss >= boneLossLimitMm - EPS;
      boneLine = `bone loss ${fmt(loss)} mm since baseline (limit ${fmt(boneLossLimitMm)} mm): ${boneCriterion ? 'beyond' : 'within'} initial remodelling`;
    }
  } else {
    flags.add(PERI_IMPLANT_FLAGS.NO_BASELINE);
    if (boneLevel === undefined) {
      boneCriterion = null;
      boneLine = 'no baseline and no current bone level: bone loss cannot be judged';
    } else {
      boneCriterion = boneLevel >= NO_BASELINE_BONE_LEVEL_MM - EPS;
      boneLine = `no baseline: bone level ${fmt(boneLevel)} mm apical to the implant's intra-osseous part (limit ${NO_BASELINE_BONE_LEVEL_MM} mm): ${boneCriterion ? 'reached' : 'not reached'}`;
    }
  }
  if (boneCriterion === null) flags.add(PERI_IMPLANT_FLAGS.BONE_LEVEL_MISSING);

  let status = 'health' as PeriImplantStatus;
  let anyInflamed = false;
  exam.sites.forEach((site, i) => {
    const inflamed = site.bleeding || site.suppuration;
    anyInflamed ||= inflamed;
    const signs: string[] = [];
    if (site.bleeding) signs.push('BOP');
    if (site.suppuration) signs.push('SUP');

    let pdCriterion: boolean;
    let pdText = `PD ${fmt(site.probingDepthMm)} mm`;
    if (baseline !== undefined) {
      const base = baseline.sites[i].probingDepthMm;
      const increase = site.probingDepthMm - base;
      pdCriterion = increase >= pdIncreaseMm - EPS;
      pdText += ` (baseline ${fmt(base)} mm, ${increase >= 0 ? '+' : ''}${fmt(increase)} mm)`;
    } else {
      pdCriterion = site.probingDepthMm >= NO_BASELINE_PD_MM - EPS;
    }

    let siteStatus: PeriImplantStatus = 'health';
    if (inflamed) {
      siteStatus = pdCriterion && boneCriterion === true ? 'peri-implantitis' : 'mucositis';
      // No baseline: only one of the two limits reached (or PD reached and the bone level unknown).
      if (baseline === undefined && siteStatus === 'mucositis' && (pdCriterion || boneCriterion === true)) {
        flags.add(PERI_IMPLANT_FLAGS.PERI_IMPLANTITIS_NOT_EXCLUDED_WITHOUT_BASELINE);
      }
    }
    if (RANK[siteStatus] > RANK[status]) status = siteStatus;
    if (inflamed) reasons.push(`site ${i + 1}: ${[...signs, pdText].join(', ')} → ${siteStatus}`);
    else if (pdCriterion) reasons.push(`site ${i + 1}: ${pdText} without bleeding or suppuration`);
  });

  if (!anyInflamed) reasons.push('no bleeding or suppuration at any site');
  reasons.push(boneLine);
  if (!anyInflamed && boneCriterion === true) flags.add(PERI_IMPLANT_FLAGS.BONE_LOSS_WITHOUT_INFLAMMATION);

  if (status === 'peri-implantitis') {
    reasons.push(
      baseline !== undefined
        ? 'peri-implantitis: bleeding/suppuration with increased probing depth and bone loss beyond initial remodelling'
        : `peri-implantitis (no baseline): bleeding/suppuration with PD ≥ ${NO_BASELINE_PD_MM} mm and bone level ≥ ${NO_BASELINE_BONE_LEVEL_MM} mm`,
    );
  } else if (status === 'mucositis') {
    reasons.push(
      baseline !== undefined
        ? 'mucositis: bleeding/suppuration without the combination of increased probing depth and bone loss beyond initial remodelling'
        : `mucositis (no baseline): bleeding/suppuration, but no bleeding or suppurating site with PD ≥ ${NO_BASELINE_PD_MM} mm together with a bone level ≥ ${NO_BASELINE_BONE_LEVEL_MM} mm`,
    );
  } else {
    reasons.push('health: no bleeding or suppuration');
  }
  return { status, reasons, flags: [...flags] };
}
