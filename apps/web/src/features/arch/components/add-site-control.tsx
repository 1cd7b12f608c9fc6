import { Button, Callout, FormGroup, HTMLSelect } from '@blueprintjs/core';
import type { ArchSite } from '@torquetrail/contracts';
import { formatTooth, TOOTH_POSITIONS_PERMANENT } from '@torquetrail/domain';
import { type FormEvent, useState } from 'react';
import { isApiError } from '../../../lib/api-client';
import type { ToothSystem } from '../../../lib/tooth-system';
import { useAddSite } from '../api/add-site';

/** A small form to plan an implant site at a permanent position that has no live site. */
export function AddSiteControl({ patientId, sites, system }: { patientId: string; sites: ArchSite[]; system: ToothSystem }) {
  const taken = new Set(sites.map((s) => s.fdi));
  const free = TOOTH_POSITIONS_PERMANENT.filter((fdi) => !taken.has(fdi));
  const [fdi, setFdi] = useState('');
  const [error, setError] = useState<string | null>(null);
  const [added, setAdded] = useState<string | null>(null);
  const add = useAddSite(patientId);

  const submit = async (event: FormEvent) => {
    event.preventDefault();
    setAdded(null);
    if (!fdi) return setError('Choose a tooth position');
    setError(null);
    try {
      const site = await add.mutateAsync({ fdi: Number(fdi) });
      setAdded(`Planned site ${formatTooth(site.fdi, system)} added`);
      setFdi('');
    } catch (e) {
      if (isApiError(e)) setError(e.fields.fdi ?? e.message);
    }
  };

  return (
    <form className="add-site" onSubmit={submit} aria-label="Plan an implant site" data-testid="add-site">
      <FormGroup label="Add planned site" labelFor="add-site-position" inline helperText={error ?? undefined} intent={error ? 'danger' : 'none'}>
        <HTMLSelect id="add-site-position" value={fdi} onChange={(e) => setFdi(e.currentTarget.value)}>
          <option value="">Position…</option>
          {free.map((p) => (
            <option key={p} value={p}>
              {formatTooth(p, system)}
            </option>
          ))}
        </HTMLSelect>
        <Button type="submit" text="Add" loading={add.isPending} />
      </FormGroup>
      {added && (
        <Callout intent="success" compact role="status">
          {added}
        </Callout>
      )}
    </form>
  );
}
