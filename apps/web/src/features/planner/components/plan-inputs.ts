// What the planner reads from a site's typed inputs before the rules run. Every value the rules
// evaluate is read here, so a value they cannot evaluate becomes a Finding in the list (and a
// message beside its field) instead of vanishing: the list and the Save button then agree.
import type { CatalogueComponent, Finding, RestorableSite } from '@torquetrail/contracts';
import type { MultiUnitAngleDeg, Vec3 } from '@torquetrail/domain';

/** Codes of the Findings about inputs (not clinical rules: they say which value the rules could not read). */
export const INPUT_FINDING_CODES = Object.freeze({
  /** A value typed in a numeric field is not a number. */
  NOT_A_NUMBER: 'input-not-a-number',
  /** Some but not all components of the implant axis are typed, and the placement gives none to complete them. */
  PARTIAL_AXIS: 'input-partial-axis',
  /** The value is a number the rules refuse (a zero axis, a negative space). */
  NOT_EVALUATED: 'input-not-evaluated',
} as const);

const AXIS_NAMES = ['x', 'y', 'z'] as const;

/**
 * A decimal as a clinician types it: digits with one decimal point or comma, an optional sign,
 * spaces around. `null` when empty; NaN when it is not such a number (hex, exponents and words are
 * not read as numbers, which `Number()` would do for "0x10" or "1e3").
 */
export function parseDecimal(text: string): number | null {
  const t = text.trim();
  if (t === '') return null;
  if (!/^[-+]?(\d+([.,]\d*)?|[.,]\d+)$/.test(t)) return Number.NaN;
  return Number(t.replace(',', '.'));
}

/** What the rules get from one site's inputs, and the Findings about values they cannot use. */
export interface SiteInputs {
  restorativeSpaceMm: number | null;
  /** The axis as typed, completed from the placement's axis where a component is left empty; null when none is typed. */
  axis: Vec3 | null;
  multiUnitAngleDeg: MultiUnitAngleDeg | null;
  findings: Finding[];
  /** Messages beside the fields, by form path. */
  invalid: Record<string, string>;
}

/** Reads one site's typed values (`index` is its place in the plan, for the form paths). */
export function readSiteInputs(
  index: number,
  plan: { restorativeSpaceMm: string; axis: readonly [string, string, string] },
  site: Pick<RestorableSite, 'fdi' | 'axis'>,
  multiUnit: CatalogueComponent | undefined,
): SiteInputs {
  const findings: Finding[] = [];
  const invalid: Record<string, string> = {};
  const at = `Site ${site.fdi}`;
  const problem = (code: string, path: string, beside: string, message: string) => {
    invalid[`sites.${index}.${path}`] ??= beside;
    findings.push({ severity: 'error', code, fdi: site.fdi, message: `${at}: ${message}` });
  };

  const space = parseDecimal(plan.restorativeSpaceMm);
  if (space !== null && Number.isNaN(space))
    problem(
      INPUT_FINDING_CODES.NOT_A_NUMBER,
      'restorativeSpaceMm',
      'Enter the space in millimetres, e.g. 7.5',
      `the restorative space “${plan.restorativeSpaceMm.trim()}” is not a number, so the space cannot be checked. Enter millimetres, e.g. 7.5.`,
    );

  const typed = plan.axis.map(parseDecimal);
  let axis: Vec3 | null = null;
  typed.forEach((v, i) => {
    if (v !== null && Number.isNaN(v))
      problem(
        INPUT_FINDING_CODES.NOT_A_NUMBER,
        `axis.${i}`,
        `Enter a number for ${AXIS_NAMES[i]}`,
        `the implant axis ${AXIS_NAMES[i]} “${plan.axis[i].trim()}” is not a number, so the divergence cannot be checked.`,
      );
  });
  if (typed.some((v) => v !== null)) {
    const missing = AXIS_NAMES.filter((_, i) => typed[i] === null);
    if (missing.length > 0 && !site.axis) {
      problem(
        INPUT_FINDING_CODES.PARTIAL_AXIS,
        'axis',
        `Enter ${missing.join(' and ')} too`,
        `the implant axis has no ${missing.join(' or ')}, and the placement record gives no axis to complete it; enter all three components (or clear them) so the divergence can be checked.`,
      );
    } else {
      // An empty component takes the placement's value, the one its box shows greyed.
      axis = typed.map((v, i) => v ?? site.axis![i]) as Vec3;
    }
  }

  // The angle the catalogue states for the chosen multi-unit, whatever it is; a part that states
  // none is a Finding of catalogueValueFindings (the domain's), not of the inputs.
  const angle: MultiUnitAngleDeg | null = multiUnit?.angleDeg ?? null;
  return {
    restorativeSpaceMm: space,
    axis,
    multiUnitAngleDeg: angle,
    findings,
    invalid,
  };
}
