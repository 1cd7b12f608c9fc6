// Server-side check of a plan: the parts must exist in the practice's catalogue, be of the right
// kind and fit the site's platform; then the same `validateRestorationPlan` the web runs live.
import {
  ABUTMENT_KINDS,
  type ComponentKind,
  type CopingLevel,
  DENTURE_RETAINER_KINDS,
  type ImpressionCopingKind,
  type InterfaceKind,
  type MultiUnitAngleDeg,
  type PlanBodyParsed,
  SCREW_KINDS,
  findingField,
} from '@torquetrail/contracts';
import {
  catalogueValueFindings,
  type Finding,
  type RestorationPlan,
  type SiteParts,
  ValidationError,
  type Vec3,
  cantileverFindings,
  validateRestorationPlan,
} from '@torquetrail/domain';
import { fieldError } from '../common/field-error.js';
import type { RestorableSiteRow } from './restorations.repository.js';

export interface CatalogueRow {
  id: string;
  platformId: string;
  kind: ComponentKind;
  name: string;
  engaging: boolean | null;
  angleDeg: number | null;
  collarHeightMm: number | null;
  maxDivergenceDeg: number | null;
  copingLevel: CopingLevel | null;
}

interface CheckedSite {
  siteId: string;
  fdi: number;
  interface: InterfaceKind;
  impressionCoping: ImpressionCopingKind;
  multiUnitAngleDeg: MultiUnitAngleDeg | null;
  restorativeSpaceMm: number | null;
  /** The axis entered in the planner (stored), or null when the placement's axis was used. */
  enteredAxis: Vec3 | null;
  componentIds: string[];
}

export interface CheckedPlan {
  findings: Finding[];
  sites: CheckedSite[];
}

const SLOT_KINDS: Record<
  | 'abutmentComponentId'
  | 'multiUnitComponentId'
  | 'screwComponentIds'
  | 'impressionCopingComponentId'
  | 'attachmentComponentId'
  | 'retainerComponentIds',
  readonly ComponentKind[]
> = {
  abutmentComponentId: ABUTMENT_KINDS,
  multiUnitComponentId: ['multi-unit-abutment'],
  screwComponentIds: SCREW_KINDS,
  impressionCopingComponentId: ['impression-coping'],
  attachmentComponentId: ['attachment-abutment'],
  retainerComponentIds: DENTURE_RETAINER_KINDS,
};
/** The slots only an overdenture on stud attachments fills, and what its retainers must be. */
const RETAINERS_OF_KIND: Partial<Record<PlanBodyParsed['kind'], ComponentKind>> = {
  'overdenture-studs': 'retentive-insert',
  'overdenture-bar': 'bar-clip',
};

const axisOf = (s: RestorableSiteRow): Vec3 | null =>
  s.axisX !== null && s.axisY !== null && s.axisZ !== null ? [s.axisX, s.axisY, s.axisZ] : null;

const orUndefined = (n: number | null) => n ?? undefined;

/**
 * Throws 400 with `fields` for every problem; returns the findings (warnings and infos) and the
 * resolved sites. `cantileverRatio` is the practice's limit (cantilever ≤ ratio × A-P spread).
 */
export function checkPlan(
  body: PlanBodyParsed,
  patientSites: RestorableSiteRow[],
  catalogue: Map<string, CatalogueRow>,
  cantileverRatio: number,
): CheckedPlan {
  const fields: Record<string, string> = {};
  if (body.provisional && !body.plannedReplacementOn)
    fields.plannedReplacementOn = 'Enter the day the definitive restoration is planned to replace this provisional';
  if (!body.provisional && body.plannedReplacementOn)
    fields.plannedReplacementOn = 'Only a provisional restoration has a planned replacement day';
  const sites: CheckedSite[] = [];
  const planSites: RestorationPlan['sites'] = [];
  const siteParts: SiteParts[] = [];

  body.sites.forEach((s, i) => {
    const site = patientSites.find((p) => p.siteId === s.siteId);
    if (!site) {
      fields[`sites.${i}.siteId`] = 'Not an implant site of this patient';
      return;
    }
    if (!site.platformId) {
      fields[`sites.${i}.siteId`] = `No placement is recorded at ${site.fdi}: the implant's platform is unknown`;
      return;
    }
    const componentIds: string[] = [];
    const chosen: Partial<Record<keyof typeof SLOT_KINDS, CatalogueRow>> = {};
    for (const slot of Object.keys(SLOT_KINDS) as (keyof typeof SLOT_KINDS)[]) {
      const value = s[slot];
      const ids = Array.isArray(value) ? value : value ? [value] : [];
      ids.forEach((id, j) => {
        const key = Array.isArray(value) ? `sites.${i}.${slot}.${j}` : `sites.${i}.${slot}`;
        const part = catalogue.get(id);
        if (!part) fields[key] = 'No such part in the practice catalogue';
        else if (part.platformId !== site.platformId)
          fields[key] = `${part.name} does not fit the platform at ${site.fdi} (${site.platformName})`;
        else if (!SLOT_KINDS[slot].includes(part.kind))
          fields[key] = `${part.name} is not a part of this kind (${SLOT_KINDS[slot].join(', ')})`;
        else if (slot === 'attachmentComponentId' && body.kind !== 'overdenture-studs')
          fields[key] = `Site ${site.fdi}: an attachment abutment belongs to an overdenture on stud attachments`;
        else if (slot === 'retainerComponentIds' && RETAINERS_OF_KIND[body.kind] !== part.kind)
          fields[key] = RETAINERS_OF_KIND[body.kind]
            ? `Site ${site.fdi}: ${part.name} does not fit this overdenture (it needs a ${RETAINERS_OF_KIND[body.kind]})`
            : `Site ${site.fdi}: inserts and clips belong to overdentures`;
        else {
          // The current version, whichever version's id was sent (ADR 0006).
          componentIds.push(part.id);
          if (!Array.isArray(value)) chosen[slot] = part;
        }
      });
    }
    const coping = chosen.impressionCopingComponentId;
    if (
      coping &&
      coping.engaging !== null &&
      (coping.engaging ? s.impressionCoping !== 'engaging' : s.impressionCoping === 'engaging')
    ) {
      fields[`sites.${i}.impressionCopingComponentId`] =
        `${coping.name} is ${coping.engaging ? 'engaging' : 'non-engaging'}, but the impression technique says ${s.impressionCoping}`;
    }
    // The angle is the one the catalogue states for the chosen multi-unit; one entered for the site
    // must agree with it. A part whose catalogue entry states none is a Finding (catalogue-values.ts).
    let angle = s.multiUnitAngleDeg;
    const mua = chosen.multiUnitComponentId;
    if (mua && mua.angleDeg !== null) {
      if (angle === null) angle = mua.angleDeg;
      else if (mua.angleDeg !== angle)
        fields[`sites.${i}.multiUnitAngleDeg`] = `${mua.name} is ${mua.angleDeg}°, not ${angle}°`;
    }
    siteParts.push({
      fdi: site.fdi,
      interface: s.interface,
      ...(mua ? { multiUnit: mua } : {}),
      ...(chosen.abutmentComponentId ? { abutment: chosen.abutmentComponentId } : {}),
      ...(coping ? { impressionCoping: coping } : {}),
      enteredMultiUnitAngleDeg: s.multiUnitAngleDeg,
    });
    const axis = s.axis ?? axisOf(site);
    const attachment = chosen.attachmentComponentId;
    sites.push({
      siteId: site.siteId,
      fdi: site.fdi,
      interface: s.interface,
      impressionCoping: s.impressionCoping,
      multiUnitAngleDeg: angle,
      restorativeSpaceMm: s.restorativeSpaceMm,
      enteredAxis: s.axis,
      componentIds,
    });
    planSites.push({
      fdi: site.fdi,
      interface: s.interface,
      impressionCoping: s.impressionCoping,
      ...(axis ? { axis } : {}),
      ...(angle !== null ? { multiUnitAngleDeg: angle } : {}),
      ...(s.restorativeSpaceMm !== null ? { restorativeSpaceMm: s.restorativeSpaceMm } : {}),
      attachment: attachment
        ? {
            name: attachment.name,
            maxDivergenceDeg: attachment.maxDivergenceDeg,
            collarHeightMm: attachment.collarHeightMm,
          }
        : null,
    });
  });
  if (Object.keys(fields).length > 0) throw fieldError(fields);

  let findings: Finding[];
  try {
    findings = [
      ...validateRestorationPlan({
        kind: body.kind,
        retention: body.retention,
        copingsSplinted: body.copingsSplinted,
        sites: planSites,
      }),
      ...catalogueValueFindings(body, siteParts),
    ];
    findings.push(
      ...cantileverFindings(
        {
          kind: body.kind,
          leftMm: orUndefined(body.cantileverLeftMm),
          rightMm: orUndefined(body.cantileverRightMm),
          apSpreadMm: orUndefined(body.apSpreadMm),
        },
        cantileverRatio,
      ),
    );
  } catch (error) {
    if (error instanceof ValidationError) {
      const field = (error.field ?? 'sites').replace(/^plan\./, '').replace(/\[(\d+)\]/g, '.$1');
      throw fieldError({ [field]: error.message });
    }
    throw error;
  }

  const fdis = sites.map((s) => s.fdi);
  const errors = findings.filter((f) => f.severity === 'error');
  if (errors.length > 0) {
    const out: Record<string, string> = {};
    for (const f of errors) out[findingField(f, fdis)] ??= f.message;
    throw fieldError(
      out,
      `The plan has ${errors.length === 1 ? 'an error' : `${errors.length} errors`}: ${errors.map((f) => f.message).join(' ')}`,
    );
  }
  const unacknowledged = findings.filter(
    (f) =>
      f.severity === 'warning' &&
      !body.acknowledgements.some((a) => a.code === f.code && (a.fdi ?? undefined) === f.fdi),
  );
  if (unacknowledged.length > 0) {
    const out: Record<string, string> = {};
    for (const f of unacknowledged) out[findingField(f, fdis)] ??= `Acknowledge this warning to save: ${f.message}`;
    throw fieldError(
      out,
      `Acknowledge the warnings to save the plan: ${unacknowledged.map((f) => f.message).join(' ')}`,
    );
  }
  return { findings, sites };
}
