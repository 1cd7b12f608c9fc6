/**
 * Rules of an overdenture plan: on stud attachments (one attachment abutment per implant, a retentive
 * insert in the denture) or on a bar (screwed to the implants or to multi-unit abutments, clips in the
 * denture). The bar is splinted and is judged like a bridge by restoration-plan.ts; this module adds
 * what only overdentures need.
 *
 * Sources: two implants as the minimum for a mandibular overdenture — McGill consensus (Feine JS et al.
 * 2002, Gerodontology 19:3–4) and York consensus (Thomason JM et al. 2009, Br Dent J 207:185–186)
 * [memory: citations recalled, confirm page numbers]; the divergence an attachment tolerates is the
 * manufacturer's, read from the practice's catalogue, never from code.
 *
 * Decisions where the sources are silent (also in docs/clinical-rules.md):
 * - A pair of implants is judged against the smaller of its two attachments' stated tolerances (the
 *   stricter part limits the pair); more than that is a warning to acknowledge, not an error, since
 *   angle-correcting inserts or housings may still seat the denture.
 * - An attachment whose catalogue entry states no divergence tolerance (or no collar height) is a
 *   warning naming the part: the rule cannot be checked, and the practice should complete the catalogue.
 * - Stud attachments are screwed into the implant: their retention is `screw-to-implant`. A bar is
 *   screwed to the implants or to multi-unit abutments. Cement and a lingual set screw do not apply.
 */
import { divergenceDeg, type Vec3 } from './geometry.js';
import { type Finding, PLAN_FINDING_CODES, PLAN_SOURCES } from './plan-findings.js';
import { EPS, fmt } from './validate.js';

/** The overdenture kinds of {@link RESTORATION_KINDS} (restoration-plan.ts). */
export const OVERDENTURE_KINDS = ['overdenture-studs', 'overdenture-bar'] as const;
/** An overdenture kind. */
export type OverdentureKind = (typeof OVERDENTURE_KINDS)[number];

/** What the attachment rules read of the attachment abutment chosen at a site (from the catalogue). */
export interface AttachmentFacts {
  /** The catalogue's name of the part, for messages. */
  name: string;
  /** Largest divergence between two implants the manufacturer states the attachment tolerates; null when not stated. */
  maxDivergenceDeg: number | null;
  /** Collar (gingival) height, mm; null when not stated. */
  collarHeightMm: number | null;
}

/** What the overdenture rules read of a site. */
interface OverdentureSite {
  fdi: number;
  axis?: Vec3;
  /** The attachment abutment chosen; absent or null when none is chosen. */
  attachment?: AttachmentFacts | null;
}

/** True for the overdenture kinds. */
export function isOverdentureKind(kind: string): kind is OverdentureKind {
  return (OVERDENTURE_KINDS as readonly string[]).includes(kind);
}

const KIND_WORDS: Record<OverdentureKind, string> = {
  'overdenture-studs': 'An overdenture on stud attachments',
  'overdenture-bar': 'A bar overdenture',
};

/** Site count and retention of an overdenture plan. */
export function overdentureShapeFindings(kind: OverdentureKind, retention: string, siteCount: number): Finding[] {
  const findings: Finding[] = [];
  if (siteCount < 2) {
    findings.push({
      severity: 'error',
      code: PLAN_FINDING_CODES.SITE_COUNT,
      message: `${KIND_WORDS[kind]} needs at least two implants; this plan lists ${siteCount}.`,
      source: PLAN_SOURCES.OVERDENTURE_CONSENSUS,
    });
  }
  const allowed = kind === 'overdenture-studs' ? ['screw-to-implant'] : ['screw-to-implant', 'screw-to-multi-unit'];
  if (!allowed.includes(retention)) {
    findings.push({
      severity: 'error',
      code: PLAN_FINDING_CODES.OVERDENTURE_RETENTION,
      message:
        kind === 'overdenture-studs'
          ? 'Stud attachments are screwed into the implants: choose "screw-retained on the implant".'
          : 'A bar is screwed to the implants or to multi-unit abutments: choose one of those retentions.',
      source: PLAN_SOURCES.COMMON_PRACTICE,
    });
  }
  return findings;
}

/**
 * Attachment findings of a stud overdenture: an attachment abutment at every site, its catalogue values
 * present, and every pair of implants within the smaller of their attachments' stated tolerances.
 */
export function studAttachmentFindings(sites: readonly OverdentureSite[]): Finding[] {
  const findings: Finding[] = [];
  for (const site of sites) {
    const part = site.attachment;
    if (!part) {
      findings.push({
        severity: 'error',
        code: PLAN_FINDING_CODES.ATTACHMENT_MISSING,
        message: `Site ${site.fdi}: choose an attachment abutment for this implant.`,
        fdi: site.fdi,
        source: PLAN_SOURCES.COMMON_PRACTICE,
      });
      continue;
    }
    if (part.maxDivergenceDeg === null) {
      findings.push({
        severity: 'warning',
        code: PLAN_FINDING_CODES.CATALOGUE_VALUE_MISSING,
        message: `Site ${site.fdi}: the catalogue does not state the divergence tolerance of ${part.name}; the divergence between the implants cannot be checked. Add the manufacturer's value to the catalogue.`,
        fdi: site.fdi,
        source: PLAN_SOURCES.CATALOGUE,
      });
    }
    if (part.collarHeightMm === null) {
      findings.push({
        severity: 'warning',
        code: PLAN_FINDING_CODES.CATALOGUE_VALUE_MISSING,
        message: `Site ${site.fdi}: the catalogue does not state the collar height of ${part.name}. Add the manufacturer's value to the catalogue.`,
        fdi: site.fdi,
        source: PLAN_SOURCES.CATALOGUE,
      });
    }
  }
  const judged = sites.filter(
    (s): s is OverdentureSite & { axis: Vec3; attachment: AttachmentFacts & { maxDivergenceDeg: number } } =>
      s.axis !== undefined && !!s.attachment && s.attachment.maxDivergenceDeg !== null,
  );
  for (let i = 0; i < judged.length; i++) {
    for (let j = i + 1; j < judged.length; j++) {
      const a = judged[i];
      const b = judged[j];
      const theta = divergenceDeg(a.axis, b.axis);
      const strict = a.attachment.maxDivergenceDeg <= b.attachment.maxDivergenceDeg ? a : b;
      const limit = strict.attachment.maxDivergenceDeg;
      if (theta > limit + EPS) {
        findings.push({
          severity: 'warning',
          code: PLAN_FINDING_CODES.ATTACHMENT_DIVERGENCE_OVER_TOLERANCE,
          message: `The implants at ${a.fdi} and ${b.fdi} diverge by ${fmt(theta)}°, more than the ${fmt(limit)}° the catalogue states for ${strict.attachment.name} (at ${strict.fdi}). The inserts may wear fast or the denture may not seat; consider angle-correcting parts and check the manufacturer's instructions.`,
          source: PLAN_SOURCES.CATALOGUE,
        });
      }
    }
  }
  return findings;
}
