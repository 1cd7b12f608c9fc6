/**
 * Divergence between the implants of one splinted restoration, and what angled multi-unit abutments
 * do about it.
 *
 * Sources: Jang HK et al. 2011, Int J Oral Maxillofac Implants 26:1011–1015 [pub] (impressions accurate
 * below about 15° of divergence, framework gaps at 20°); angled multi-unit abutments (17°, 30°) exist to
 * correct the angulation of an implant [common practice].
 *
 * Decisions where the sources are silent (also in docs/clinical-rules.md):
 * - With screw-to-multi-unit retention the divergence of a pair is reduced by the sum of both sites'
 *   angles (best case: abutments turned towards each other), floored at 0°; the warning fires when the
 *   residual is more than 15°.
 * - An angled multi-unit is called for at a site when its implant diverges more than 15° from at least one
 *   other implant of the restoration before any correction. When every other implant with a known axis is
 *   within 15° of it, the angle corrects nothing the impression or the framework needs: an informational
 *   Finding says so (the angle also costs restorative height and, on most systems, a lower screw torque).
 *   A site without an axis, or with no other site giving one, is not judged.
 */
import { DIVERGENCE_LIMIT_DEG, divergenceDeg, type Vec3 } from './geometry.js';
import { type Finding, PLAN_FINDING_CODES, PLAN_SOURCES } from './plan-findings.js';
import { EPS, fmt } from './validate.js';

/** What the divergence checks read of a site. */
interface AxisSite {
  fdi: number;
  axis?: Vec3;
  multiUnitAngleDeg?: number;
}

/**
 * Findings about the divergence of a splinted restoration's implants: `divergence-over-limit` (warning)
 * for each pair still more than 15° apart after multi-unit correction, and `angled-multi-unit-not-needed`
 * (info) for each angled multi-unit that no divergence calls for. Sites are assumed validated.
 */
export function divergenceFindings(onMultiUnits: boolean, sites: readonly AxisSite[]): Finding[] {
  const findings: Finding[] = [];
  const withAxis = sites.filter((s): s is AxisSite & { axis: Vec3 } => s.axis !== undefined);
  const angle = (s: AxisSite) => (onMultiUnits ? (s.multiUnitAngleDeg ?? 0) : 0);
  for (let i = 0; i < withAxis.length; i++) {
    for (let j = i + 1; j < withAxis.length; j++) {
      const a = withAxis[i];
      const b = withAxis[j];
      const theta = divergenceDeg(a.axis, b.axis);
      const correction = angle(a) + angle(b);
      const residual = Math.max(0, theta - correction);
      if (residual > DIVERGENCE_LIMIT_DEG + EPS) {
        const corrected =
          correction > 0
            ? ` Even with the angled multi-unit abutments (${angle(a)}° + ${angle(b)}°), ${fmt(residual)}° remain.`
            : '';
        findings.push({
          severity: 'warning',
          code: PLAN_FINDING_CODES.DIVERGENCE_OVER_LIMIT,
          message: `The implants at ${a.fdi} and ${b.fdi} diverge by ${fmt(theta)}°, more than ${DIVERGENCE_LIMIT_DEG}°.${corrected} Impressions lose accuracy beyond about 15° (framework gaps were found at 20°); consider angled multi-unit abutments and verify the framework fit.`,
          source: PLAN_SOURCES.JANG_2011,
        });
      }
    }
  }
  if (!onMultiUnits) return findings;
  for (const site of withAxis) {
    if (angle(site) === 0) continue;
    const others = withAxis.filter((o) => o !== site);
    if (others.length === 0) continue;
    const widest = Math.max(...others.map((o) => divergenceDeg(site.axis, o.axis)));
    if (widest > DIVERGENCE_LIMIT_DEG + EPS) continue;
    findings.push({
      severity: 'info',
      code: PLAN_FINDING_CODES.ANGLED_MULTI_UNIT_NOT_NEEDED,
      message: `Site ${site.fdi}: a ${angle(site)}° multi-unit abutment is chosen, but this implant diverges at most ${fmt(widest)}° from the others, within the ${DIVERGENCE_LIMIT_DEG}° impressions tolerate; an angled abutment is chosen to correct divergence, so a straight one may do. Check the reason for the angle (e.g. the screw-access position).`,
      fdi: site.fdi,
      source: `${PLAN_SOURCES.JANG_2011}; angle correction: ${PLAN_SOURCES.COMMON_PRACTICE}`,
    });
  }
  return findings;
}
