import { Checkbox, HTMLSelect, InputGroup } from '@blueprintjs/core';
import {
  ABUTMENT_KINDS,
  type CatalogueComponent,
  type ComponentKind,
  type ImpressionCopingKind,
  type InterfaceKind,
  MANUFACTURER_CAUTION,
  type RestorableSite,
  type RestorationKind,
  type Retention,
  SCREW_KINDS,
} from '@torquetrail/contracts';
import { ABUTMENT_LEVEL_RETENTIONS, formatTooth } from '@torquetrail/domain';
import { FormField } from '../../../lib/forms';
import type { ToothSystem } from '../../../lib/tooth-system';
import type { SitePlan } from './plan-state';
import { CONNECTION_LABEL, IMPRESSION_COPING_LABEL, INTERFACE_LABEL } from '../../../lib/clinical-labels';
import { PartValues } from './part-values';

const spec = (c: CatalogueComponent) =>
  c.torqueSpecNcm === null ? 'hand-tight' : `${c.torqueSpecNcm} N·cm ±${c.tolerancePct} %`;
/** An attachment's catalogue values as the rules read them; a value the catalogue lacks is said so. */
const attachmentFacts = (c: CatalogueComponent) =>
  [
    c.maxDivergenceDeg === null ? 'divergence tolerance not stated' : `up to ${c.maxDivergenceDeg}° between implants`,
    c.collarHeightMm === null ? 'collar height not stated' : `collar ${c.collarHeightMm} mm`,
    spec(c),
  ].join(', ');
const retainerFacts = (c: CatalogueComponent) =>
  [c.retentionLabel, c.retentionN === null ? null : `${c.retentionN} N`].filter(Boolean).join(', ') ||
  'retention not stated';

interface Props {
  index: number;
  site: RestorableSite;
  plan: SitePlan;
  retention: Retention;
  kind: RestorationKind;
  parts: CatalogueComponent[];
  system: ToothSystem;
  /** Messages computed live from the draft (Findings, malformed values), by field path. */
  live: Record<string, string>;
  onChange: (next: SitePlan) => void;
}

/** One site of the plan: interface, impression technique and coping, parts from this platform only. */
export function SitePlanFields({ index, site, plan, retention, kind, parts, system, live, onChange }: Props) {
  const key = (f: string) => `sites.${index}.${f}`;
  /** A field's error paths (the first names it) and its live message. */
  const err = (...fields: string[]) => ({ name: fields.map(key), live: fields.map((f) => live[key(f)]).find(Boolean) });
  const of = (...kinds: ComponentKind[]) => parts.filter((p) => kinds.includes(p.kind));
  const byId = (partId: string) => parts.find((p) => p.id === partId);
  const copings = of('impression-coping').filter((c) =>
    plan.impressionCoping === 'engaging' ? c.engaging === true : c.engaging !== true,
  );
  const set = (patch: Partial<SitePlan>) => onChange({ ...plan, ...patch });
  const id = (f: string) => `plan-${site.fdi}-${f}`;
  const label = formatTooth(site.fdi, system);

  return (
    <fieldset className="planner-site" data-testid={`planner-site-${site.fdi}`}>
      <legend>
        Site {label} · {site.systemName} · {site.platformName}{' '}
        {site.connection ? ` (${CONNECTION_LABEL[site.connection]})` : ''}
      </legend>
      <div className="planner-grid">
        <FormField label="Interface to the implant" labelFor={id('interface')} {...err('interface')}>
          <HTMLSelect
            id={id('interface')}
            value={plan.interface}
            onChange={(e) => set({ interface: e.currentTarget.value as InterfaceKind })}
          >
            {Object.entries(INTERFACE_LABEL).map(([value, text]) => (
              <option key={value} value={value}>
                {text}
              </option>
            ))}
          </HTMLSelect>
        </FormField>
        <FormField
          label="Impression technique"
          labelFor={id('coping')}
          {...err('impressionCoping', 'impressionCopingComponentId')}
        >
          <HTMLSelect
            id={id('coping')}
            value={plan.impressionCoping}
            onChange={(e) =>
              set({ impressionCoping: e.currentTarget.value as ImpressionCopingKind, impressionCopingComponentId: '' })
            }
          >
            {Object.entries(IMPRESSION_COPING_LABEL).map(([value, text]) => (
              <option key={value} value={value}>
                {text}
              </option>
            ))}
          </HTMLSelect>
        </FormField>
        <FormField label="Impression coping (catalogue)" labelFor={id('coping-part')} name={[]}>
          <HTMLSelect
            id={id('coping-part')}
            value={plan.impressionCopingComponentId}
            onChange={(e) => set({ impressionCopingComponentId: e.currentTarget.value })}
          >
            <option value="">Not chosen</option>
            {copings.map((c) => (
              <option key={c.id} value={c.id}>
                {c.name} [{c.referenceCode}]
              </option>
            ))}
          </HTMLSelect>
        </FormField>
        {retention === 'screw-to-multi-unit' ? (
          <FormField
            label="Multi-unit abutment"
            labelFor={id('mua')}
            {...err('multiUnitComponentId', 'multiUnitAngleDeg')}
          >
            <HTMLSelect
              id={id('mua')}
              value={plan.multiUnitComponentId}
              onChange={(e) => set({ multiUnitComponentId: e.currentTarget.value })}
            >
              <option value="">Not chosen</option>
              {of('multi-unit-abutment').map((c) => (
                <option key={c.id} value={c.id}>
                  {c.name} [{c.referenceCode}], {spec(c)}
                </option>
              ))}
            </HTMLSelect>
            <PartValues part={byId(plan.multiUnitComponentId)} />
          </FormField>
        ) : ABUTMENT_LEVEL_RETENTIONS.includes(retention) ? (
          <FormField label="Abutment" labelFor={id('abutment')} {...err('abutmentComponentId')}>
            <HTMLSelect
              id={id('abutment')}
              value={plan.abutmentComponentId}
              onChange={(e) => set({ abutmentComponentId: e.currentTarget.value })}
            >
              <option value="">Not chosen</option>
              {of(...ABUTMENT_KINDS).map((c) => (
                <option key={c.id} value={c.id}>
                  {c.name} [{c.referenceCode}]
                </option>
              ))}
            </HTMLSelect>
            <PartValues part={byId(plan.abutmentComponentId)} />
          </FormField>
        ) : null}
        {kind === 'overdenture-studs' && (
          <FormField
            label="Attachment abutment"
            labelFor={id('attachment')}
            help={MANUFACTURER_CAUTION}
            {...err('attachmentComponentId')}
          >
            <HTMLSelect
              id={id('attachment')}
              value={plan.attachmentComponentId}
              onChange={(e) => set({ attachmentComponentId: e.currentTarget.value })}
            >
              <option value="">Not chosen</option>
              {of('attachment-abutment').map((c) => (
                <option key={c.id} value={c.id}>
                  {c.name} [{c.referenceCode}], {attachmentFacts(c)}
                </option>
              ))}
            </HTMLSelect>
          </FormField>
        )}
        <FormField label="Restorative space (mm)" labelFor={id('space')} {...err('restorativeSpaceMm')}>
          <InputGroup
            id={id('space')}
            inputMode="decimal"
            value={plan.restorativeSpaceMm}
            onValueChange={(v) => set({ restorativeSpaceMm: v })}
          />
        </FormField>
        <FormField
          label="Implant axis (x, y, z)"
          {...err('axis', 'axis.0', 'axis.1', 'axis.2')}
          help={
            site.axis
              ? `From the placement: ${site.axis.join(', ')}; type to override`
              : 'Not in the placement record: enter a direction vector'
          }
        >
          <div className="planner-axis">
            {(['x', 'y', 'z'] as const).map((c, i) => (
              <InputGroup
                key={c}
                aria-label={`Axis ${c} at ${label}`}
                inputMode="decimal"
                placeholder={site.axis ? String(site.axis[i]) : c}
                value={plan.axis[i]}
                onValueChange={(v) => set({ axis: plan.axis.map((a, j) => (j === i ? v : a)) as SitePlan['axis'] })}
              />
            ))}
          </div>
        </FormField>
      </div>
      <FormField label="Screws" {...err('screwComponentIds')}>
        {of(...SCREW_KINDS).map((c) => (
          <Checkbox
            key={c.id}
            label={`${c.name} [${c.referenceCode}], ${spec(c)}`}
            checked={plan.screwComponentIds.includes(c.id)}
            onChange={(e) =>
              set({
                screwComponentIds: e.currentTarget.checked
                  ? [...plan.screwComponentIds, c.id]
                  : plan.screwComponentIds.filter((x) => x !== c.id),
              })
            }
          />
        ))}
      </FormField>
      {(kind === 'overdenture-studs' || kind === 'overdenture-bar') && (
        <FormField
          label={kind === 'overdenture-studs' ? 'Retentive inserts' : 'Bar clips'}
          {...err('retainerComponentIds')}
        >
          {of(kind === 'overdenture-studs' ? 'retentive-insert' : 'bar-clip').map((c) => (
            <Checkbox
              key={c.id}
              label={`${c.name} [${c.referenceCode}], ${retainerFacts(c)}`}
              checked={plan.retainerComponentIds.includes(c.id)}
              onChange={(e) =>
                set({
                  retainerComponentIds: e.currentTarget.checked
                    ? [...plan.retainerComponentIds, c.id]
                    : plan.retainerComponentIds.filter((x) => x !== c.id),
                })
              }
            />
          ))}
        </FormField>
      )}
    </fieldset>
  );
}
