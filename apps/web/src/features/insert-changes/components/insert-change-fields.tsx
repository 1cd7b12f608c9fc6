import { HTMLSelect, TextArea } from '@blueprintjs/core';
import {
  type CatalogueComponent,
  DENTURE_RETAINER_KINDS,
  type InsertChangeReason,
  type SiteFile,
} from '@torquetrail/contracts';
import { useFormContext } from 'react-hook-form';
import { INSERT_CHANGE_REASON_LABEL } from '../../../lib/clinical-labels';
import { DateField, FormField, withInputRef } from '../../../lib/forms';
import { useCatalogue } from '../../catalogue';
import { strengthText } from './insert-strength';

/** What the log and amend forms type: the change's fields as text inputs. */
export interface InsertDraft {
  changedOn: string;
  /** '' = not known. */
  oldComponentId: string;
  newComponentId: string;
  reason: InsertChangeReason;
  notes: string;
}

/** The inserts (and, on a bar, clips) of the site's platform in the practice's catalogue. */
export function useInsertParts(site: SiteFile): CatalogueComponent[] {
  const catalogue = useCatalogue();
  // A stud overdenture takes inserts; a bar, clips or inserts (as the API accepts).
  const kinds: readonly string[] =
    site.restoration?.kind === 'overdenture-bar' ? DENTURE_RETAINER_KINDS : ['retentive-insert'];
  const platforms = (catalogue.data?.systems ?? [])
    .filter((sys) => !site.placement || sys.name === site.placement.systemName)
    .flatMap((sys) => sys.platforms)
    .filter((p) => !site.placement || p.name === site.placement.platformName);
  return platforms.flatMap((p) => p.components).filter((c) => kinds.includes(c.kind));
}

/** The fields of an insert change, shared by "Log insert change" and "Amend" (ids prefixed per form). */
export function InsertChangeFields({ idPrefix, parts }: { idPrefix: string; parts: CatalogueComponent[] }) {
  const { register } = useFormContext<InsertDraft>();
  const options = parts.map((p) => (
    <option key={p.id} value={p.id}>
      {strengthText({ name: p.name, retentionLabel: p.retentionLabel, retentionN: p.retentionN })}
    </option>
  ));
  return (
    <>
      <FormField name="changedOn" label="Date of the change" labelFor={`${idPrefix}-date`}>
        <DateField id={`${idPrefix}-date`} name="changedOn" />
      </FormField>
      <FormField name="oldComponentId" label="Insert taken out" labelFor={`${idPrefix}-old`}>
        <HTMLSelect id={`${idPrefix}-old`} {...register('oldComponentId')}>
          <option value="">Not known</option>
          {options}
        </HTMLSelect>
      </FormField>
      <FormField
        name="newComponentId"
        label="New insert"
        labelFor={`${idPrefix}-new`}
        help={parts.length === 0 ? 'The catalogue lists no insert for this platform: add one first.' : undefined}
      >
        <HTMLSelect id={`${idPrefix}-new`} {...register('newComponentId')}>
          <option value="">Choose the insert put in</option>
          {options}
        </HTMLSelect>
      </FormField>
      <FormField name="reason" label="Reason" labelFor={`${idPrefix}-reason`}>
        <HTMLSelect id={`${idPrefix}-reason`} {...register('reason')}>
          {Object.entries(INSERT_CHANGE_REASON_LABEL).map(([v, t]) => (
            <option key={v} value={v}>
              {t}
            </option>
          ))}
        </HTMLSelect>
      </FormField>
      <FormField name="notes" label="Note (optional)" labelFor={`${idPrefix}-notes`}>
        <TextArea id={`${idPrefix}-notes`} fill {...withInputRef(register('notes'))} />
      </FormField>
    </>
  );
}
