// The planner's form state and its translation into the API body and the domain plan.
import {
  ABUTMENT_KINDS,
  type CatalogueComponent,
  type ComponentKind,
  DENTURE_RETAINER_KINDS,
  type Finding,
  type ImpressionCopingKind,
  type InterfaceKind,
  type Material,
  type PlanBody,
  type RestorableSite,
  type RestorationDetail,
  type RestorationKind,
  type Retention,
  SCREW_KINDS,
} from '@torquetrail/contracts';
import {
  ABUTMENT_LEVEL_RETENTIONS,
  isOverdentureKind,
  catalogueValueFindings,
  DEFAULT_CANTILEVER_RATIO,
  type RestorationPlan,
  type SiteParts,
  ValidationError,
  type Vec3,
  cantileverFindings,
  recordsCantilevers,
  validateRestorationPlan,
} from '@torquetrail/domain';
import { fieldLabel } from '../../../lib/forms/field-labels';
import { INPUT_FINDING_CODES, parseDecimal, readSiteInputs } from './plan-inputs';

export interface SitePlan {
  siteId: string;
  interface: InterfaceKind;
  impressionCoping: ImpressionCopingKind;
  impressionCopingComponentId: string;
  multiUnitComponentId: string;
  abutmentComponentId: string;
  screwComponentIds: string[];
  /** Overdenture on stud attachments: the attachment abutment. */
  attachmentComponentId: string;
  /** Overdentures: retentive inserts or bar clips. */
  retainerComponentIds: string[];
  restorativeSpaceMm: string;
  /** Entered axis (x, y, z as typed); empty = the placement's axis. */
  axis: [string, string, string];
}

export interface PlanState {
  kind: RestorationKind;
  retention: Retention;
  material: Material;
  shade: string;
  copingsSplinted: boolean;
  labName: string;
  labEmail: string;
  dueOn: string;
  notes: string;
  /** A provisional awaiting its definitive restoration on `plannedReplacementOn` (YYYY-MM-DD). */
  provisional: boolean;
  plannedReplacementOn: string;
  /** Full-arch work (CANTILEVER_KINDS): cantilevers and the A-P spread as typed, mm. */
  cantileverLeftMm: string;
  cantileverRightMm: string;
  apSpreadMm: string;
  sites: SitePlan[];
  acknowledged: string[];
}

/** The cantilever fields the plan sends: only for the kinds that record them; typed non-numbers as NaN. */
function cantilevers(state: PlanState) {
  const on = recordsCantilevers(state.kind);
  const read = (text: string) => (on ? parseDecimal(text) : null);
  return {
    cantileverLeftMm: read(state.cantileverLeftMm),
    cantileverRightMm: read(state.cantileverRightMm),
    apSpreadMm: read(state.apSpreadMm),
  };
}

export const emptySitePlan = (siteId: string): SitePlan => ({
  siteId,
  interface: 'non-engaging',
  impressionCoping: 'non-engaging',
  impressionCopingComponentId: '',
  multiUnitComponentId: '',
  abutmentComponentId: '',
  screwComponentIds: [],
  attachmentComponentId: '',
  retainerComponentIds: [],
  restorativeSpaceMm: '',
  axis: ['', '', ''],
});

export const initialPlan: PlanState = {
  kind: 'splinted-bridge',
  retention: 'screw-to-implant',
  material: 'zirconia',
  shade: '',
  copingsSplinted: false,
  labName: '',
  labEmail: '',
  dueOn: '',
  notes: '',
  provisional: false,
  plannedReplacementOn: '',
  cantileverLeftMm: '',
  cantileverRightMm: '',
  apSpreadMm: '',
  sites: [],
  acknowledged: [],
};

export const ackKey = (f: Pick<Finding, 'code' | 'fdi'>) => `${f.code}:${f.fdi ?? ''}`;

/** Each chosen site's inputs as the rules read them (plan-inputs.ts), in the plan's order. */
function readSites(state: PlanState, sites: RestorableSite[], catalogue: Map<string, CatalogueComponent>) {
  return state.sites.map((s, i) => {
    const site = sites.find((x) => x.siteId === s.siteId);
    const mua = state.retention === 'screw-to-multi-unit' ? catalogue.get(s.multiUnitComponentId) : undefined;
    return readSiteInputs(i, s, { fdi: site?.fdi ?? 0, axis: site?.axis ?? null }, mua);
  });
}

export function toBody(
  patientId: string,
  state: PlanState,
  catalogue: Map<string, CatalogueComponent>,
  sites: RestorableSite[],
): PlanBody {
  const read = readSites(state, sites, catalogue);
  return {
    patientId,
    kind: state.kind,
    retention: state.retention,
    material: state.material,
    shade: state.shade || null,
    copingsSplinted: state.copingsSplinted,
    labName: state.labName || null,
    labEmail: state.labEmail || null,
    dueOn: state.dueOn || null,
    notes: state.notes || null,
    provisional: state.provisional,
    plannedReplacementOn: (state.provisional && state.plannedReplacementOn) || null,
    ...cantilevers(state),
    sites: state.sites.map((s, i) => {
      // Only the slots the retention uses are sent (a part chosen under another retention is dropped).
      const onMua = state.retention === 'screw-to-multi-unit';
      const onAbutment = ABUTMENT_LEVEL_RETENTIONS.includes(state.retention);
      const typedAxis = s.axis.some((v) => v.trim() !== '');
      return {
        siteId: s.siteId,
        interface: s.interface,
        impressionCoping: s.impressionCoping,
        multiUnitAngleDeg: read[i].multiUnitAngleDeg,
        restorativeSpaceMm: read[i].restorativeSpaceMm,
        // A typed axis the rules could not read goes as typed, for the contract to refuse.
        axis: read[i].axis ?? (typedAxis ? [Number.NaN, Number.NaN, Number.NaN] : null),
        abutmentComponentId: (onAbutment && s.abutmentComponentId) || null,
        multiUnitComponentId: (onMua && s.multiUnitComponentId) || null,
        screwComponentIds: s.screwComponentIds,
        impressionCopingComponentId: s.impressionCopingComponentId || null,
        attachmentComponentId: (state.kind === 'overdenture-studs' && s.attachmentComponentId) || null,
        retainerComponentIds: isOverdentureKind(state.kind) ? s.retainerComponentIds : [],
      };
    }),
    acknowledgements: state.acknowledged.map((k) => {
      const [code, fdi] = k.split(':');
      return { code: code, fdi: fdi ? Number(fdi) : null };
    }),
  };
}

/**
 * The live Findings: first what the inputs hold that the rules cannot evaluate (a non-number, a
 * partly typed axis with nothing to complete it, a value the rules refuse), each a Finding in
 * plain words and a message beside its field; then, when every input can be read, the same
 * validateRestorationPlan the server runs, with each site's axis typed (completed from its
 * placement) or taken from its placement. Whenever saving is blocked, the list says why.
 */
export function liveFindings(
  state: PlanState,
  sites: RestorableSite[],
  catalogue: Map<string, CatalogueComponent>,
  cantileverRatio: number = DEFAULT_CANTILEVER_RATIO,
): { findings: Finding[]; invalid: Record<string, string> } {
  const read = readSites(state, sites, catalogue);
  const notes = read.flatMap((r) => r.findings.filter((f) => f.severity !== 'error'));
  const unreadable = read.flatMap((r) => r.findings.filter((f) => f.severity === 'error'));
  if (unreadable.length > 0)
    return { findings: [...unreadable, ...notes], invalid: Object.assign({}, ...read.map((r) => r.invalid)) };
  const plan: RestorationPlan = {
    kind: state.kind,
    retention: state.retention,
    copingsSplinted: state.copingsSplinted,
    sites: state.sites.map((s, i) => {
      const site = sites.find((x) => x.siteId === s.siteId)!;
      const { axis: typed, multiUnitAngleDeg, restorativeSpaceMm } = read[i];
      const axis = typed ?? site.axis;
      const attachment = catalogue.get(s.attachmentComponentId);
      return {
        fdi: site.fdi,
        interface: s.interface,
        impressionCoping: s.impressionCoping,
        ...(axis ? { axis } : {}),
        ...(multiUnitAngleDeg !== null ? { multiUnitAngleDeg } : {}),
        ...(restorativeSpaceMm !== null ? { restorativeSpaceMm } : {}),
        attachment: attachment
          ? {
              name: attachment.name,
              maxDivergenceDeg: attachment.maxDivergenceDeg,
              collarHeightMm: attachment.collarHeightMm,
            }
          : null,
      };
    }),
  };
  const typed = cantilevers(state);
  const invalid: Record<string, string> = {};
  for (const [field, value] of Object.entries(typed))
    if (value !== null && Number.isNaN(value)) invalid[field] = 'Enter millimetres, e.g. 12.5';
  if (Object.keys(invalid).length > 0) {
    const message = 'A cantilever or the A-P spread is not a number, so the cantilevers cannot be checked.';
    return { findings: [{ severity: 'error', code: INPUT_FINDING_CODES.NOT_A_NUMBER, message }, ...notes], invalid };
  }
  const given = (n: number | null) => n ?? undefined;
  try {
    return {
      findings: [
        ...validateRestorationPlan(plan),
        ...catalogueValueFindings(state, chosenParts(state, sites, catalogue)),
        ...cantileverFindings(
          {
            kind: state.kind,
            leftMm: given(typed.cantileverLeftMm),
            rightMm: given(typed.cantileverRightMm),
            apSpreadMm: given(typed.apSpreadMm),
          },
          cantileverRatio,
        ),
        ...notes,
      ],
      invalid: {},
    };
  } catch (error) {
    if (error instanceof ValidationError) {
      const field = (error.field ?? 'sites').replace(/^plan\./, '').replace(/\[(\d+)\]/g, '.$1');
      const index = /^sites\.(\d+)/.exec(field)?.[1];
      const fdi = index === undefined ? undefined : plan.sites[Number(index)]?.fdi;
      const finding: Finding = {
        severity: 'error',
        code: INPUT_FINDING_CODES.NOT_EVALUATED,
        ...(fdi === undefined ? {} : { fdi }),
        message: `${fdi === undefined ? 'The plan' : `Site ${fdi}`}, ${fieldLabel(field.replace(/^sites\.\d+\./, '')).toLowerCase()}: ${error.message.replace(/\.$/, '')}. The rules cannot check the plan until it is corrected.`,
      };
      return { findings: [finding, ...notes], invalid: { [field]: error.message } };
    }
    throw error;
  }
}

/** The catalogue parts chosen at each site in the slots the retention uses, for catalogueValueFindings. */
function chosenParts(
  state: PlanState,
  sites: RestorableSite[],
  catalogue: Map<string, CatalogueComponent>,
): SiteParts[] {
  const onMua = state.retention === 'screw-to-multi-unit';
  const onAbutment = ABUTMENT_LEVEL_RETENTIONS.includes(state.retention);
  return state.sites.map((s) => {
    const multiUnit = onMua ? catalogue.get(s.multiUnitComponentId) : undefined;
    const abutment = onAbutment ? catalogue.get(s.abutmentComponentId) : undefined;
    const impressionCoping = catalogue.get(s.impressionCopingComponentId);
    return {
      fdi: sites.find((x) => x.siteId === s.siteId)?.fdi ?? 0,
      interface: s.interface,
      ...(multiUnit ? { multiUnit } : {}),
      ...(abutment ? { abutment } : {}),
      ...(impressionCoping ? { impressionCoping } : {}),
    };
  });
}

/** The axis each chosen site is judged with (typed and completed, or its placement's), for the divergence table. */
export function judgedAxes(
  state: PlanState,
  sites: RestorableSite[],
  catalogue: Map<string, CatalogueComponent>,
): { fdi: number; axis: Vec3 | null }[] {
  const read = readSites(state, sites, catalogue);
  return state.sites.map((s, i) => {
    const site = sites.find((x) => x.siteId === s.siteId)!;
    const typed = s.axis.some((v) => v.trim() !== '');
    return { fdi: site.fdi, axis: typed ? read[i].axis : site.axis };
  });
}

/** The planner's state from a saved restoration, to amend it. */
export function stateFromRestoration(r: RestorationDetail): PlanState {
  const str = (n: number | null) => (n === null ? '' : String(n));
  return {
    kind: r.kind,
    retention: r.retention,
    material: r.material,
    shade: r.shade ?? '',
    copingsSplinted: r.copingsSplinted,
    labName: r.labName ?? '',
    labEmail: r.labEmail ?? '',
    dueOn: r.dueOn ?? '',
    notes: r.notes ?? '',
    provisional: r.provisional,
    plannedReplacementOn: r.plannedReplacementOn ?? '',
    cantileverLeftMm: str(r.cantileverLeftMm),
    cantileverRightMm: str(r.cantileverRightMm),
    apSpreadMm: str(r.apSpreadMm),
    acknowledged: (r.acknowledgements ?? []).map((a) => `${a.code}:${a.fdi ?? ''}`),
    sites: r.sites.map((s) => {
      const first = (...kinds: ComponentKind[]) => s.components.find((c) => kinds.includes(c.kind))?.id ?? '';
      return {
        siteId: s.siteId,
        interface: s.interface,
        impressionCoping: s.impressionCoping,
        impressionCopingComponentId: first('impression-coping'),
        multiUnitComponentId: first('multi-unit-abutment'),
        abutmentComponentId: first(...ABUTMENT_KINDS),
        screwComponentIds: s.components
          .filter((c) => (SCREW_KINDS as readonly ComponentKind[]).includes(c.kind))
          .map((c) => c.id),
        attachmentComponentId: first('attachment-abutment'),
        retainerComponentIds: s.components
          .filter((c) => (DENTURE_RETAINER_KINDS as readonly ComponentKind[]).includes(c.kind))
          .map((c) => c.id),
        restorativeSpaceMm: str(s.restorativeSpaceMm),
        axis: s.axis ? [String(s.axis[0]), String(s.axis[1]), String(s.axis[2])] : ['', '', ''],
      };
    }),
  };
}
