// The planner's form state and its translation into the API body and the domain plan.
import {
  ABUTMENT_KINDS,
  type CatalogueComponent,
  type ComponentKind,
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
  type RestorationPlan,
  ValidationError,
  validateRestorationPlan,
} from '@torquetrail/domain';

export interface SitePlan {
  siteId: string;
  interface: InterfaceKind;
  impressionCoping: ImpressionCopingKind;
  impressionCopingComponentId: string;
  multiUnitComponentId: string;
  abutmentComponentId: string;
  screwComponentIds: string[];
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
  sites: SitePlan[];
  acknowledged: string[];
}

export const emptySitePlan = (siteId: string): SitePlan => ({
  siteId,
  interface: 'non-engaging',
  impressionCoping: 'non-engaging',
  impressionCopingComponentId: '',
  multiUnitComponentId: '',
  abutmentComponentId: '',
  screwComponentIds: [],
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
  sites: [],
  acknowledged: [],
};

export const ackKey = (f: Pick<Finding, 'code' | 'fdi'>) => `${f.code}:${f.fdi ?? ''}`;

const num = (s: string) => (s.trim() === '' ? null : Number(s));
const enteredAxis = (a: SitePlan['axis']): [number, number, number] | null =>
  a.every((v) => v.trim() !== '') ? [Number(a[0]), Number(a[1]), Number(a[2])] : null;

export function toBody(patientId: string, state: PlanState, catalogue: Map<string, CatalogueComponent>): PlanBody {
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
    sites: state.sites.map((s) => {
      // Only the slots the retention uses are sent (a part chosen under another retention is dropped).
      const onMua = state.retention === 'screw-to-multi-unit';
      const onAbutment = ABUTMENT_LEVEL_RETENTIONS.includes(state.retention);
      const mua = onMua ? catalogue.get(s.multiUnitComponentId) : undefined;
      const angle = mua?.angleDeg;
      return {
        siteId: s.siteId,
        interface: s.interface,
        impressionCoping: s.impressionCoping,
        multiUnitAngleDeg: angle === 0 || angle === 17 || angle === 30 ? angle : null,
        restorativeSpaceMm: num(s.restorativeSpaceMm),
        axis: enteredAxis(s.axis),
        abutmentComponentId: (onAbutment && s.abutmentComponentId) || null,
        multiUnitComponentId: (onMua && s.multiUnitComponentId) || null,
        screwComponentIds: s.screwComponentIds,
        impressionCopingComponentId: s.impressionCopingComponentId || null,
      };
    }),
    acknowledgements: state.acknowledged.map((k) => {
      const [code, fdi] = k.split(':');
      return { code: code, fdi: fdi ? Number(fdi) : null };
    }),
  };
}

/**
 * The live Findings: the same validateRestorationPlan the server runs, on the sites chosen,
 * with each site's axis entered or taken from its placement. A malformed value (e.g. a zero
 * axis) is returned as a field message instead.
 */
export function liveFindings(
  state: PlanState,
  sites: RestorableSite[],
  catalogue: Map<string, CatalogueComponent>,
): { findings: Finding[]; invalid: Record<string, string> } {
  const body = toBody('', state, catalogue);
  const plan: RestorationPlan = {
    kind: state.kind,
    retention: state.retention,
    copingsSplinted: state.copingsSplinted,
    sites: body.sites.map((s) => {
      const site = sites.find((x) => x.siteId === s.siteId)!;
      const axis = s.axis ?? site.axis;
      return {
        fdi: site.fdi,
        interface: s.interface,
        impressionCoping: s.impressionCoping,
        ...(axis ? { axis } : {}),
        ...(s.multiUnitAngleDeg !== null && s.multiUnitAngleDeg !== undefined
          ? { multiUnitAngleDeg: s.multiUnitAngleDeg }
          : {}),
        ...(s.restorativeSpaceMm !== null && s.restorativeSpaceMm !== undefined
          ? { restorativeSpaceMm: s.restorativeSpaceMm }
          : {}),
      };
    }),
  };
  try {
    return { findings: validateRestorationPlan(plan), invalid: {} };
  } catch (error) {
    if (error instanceof ValidationError) {
      const field = (error.field ?? 'sites').replace(/^plan\./, '').replace(/\[(\d+)\]/g, '.$1');
      return { findings: [], invalid: { [field]: error.message } };
    }
    throw error;
  }
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
        restorativeSpaceMm: str(s.restorativeSpaceMm),
        axis: s.axis ? [String(s.axis[0]), String(s.axis[1]), String(s.axis[2])] : ['', '', ''],
      };
    }),
  };
}
