import { Button, Card, FormGroup, HTMLSelect, InputGroup, ProgressBar } from '@blueprintjs/core';
import { formatTooth } from '@torquetrail/domain';
import { useToothSystem } from '../../../lib/tooth-system';
import { RADIOGRAPH_KINDS, RadiographUploadQuery, type RadiographKind } from '@torquetrail/contracts';
import { useQueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import { FormProvider } from 'react-hook-form';
import { DateField, draftSchema, FormField, useContractForm } from '../../../lib/forms';
import { RADIOGRAPH_KIND_LABEL } from '../../../lib/labels';
import { radiographKeys } from '../api/keys';
import { uploadRadiograph, type UploadDetails, type UploadHandle } from '../api/radiographs-api';

interface Draft {
  kind: RadiographKind;
  takenOn: string;
  note: string;
  siteIds: string[] | false;
}
const schema = draftSchema(RadiographUploadQuery, (d: Draft) => ({
  kind: d.kind,
  takenOn: d.takenOn || undefined,
  note: d.note || undefined,
  // react-hook-form gives `false` when no box of a checkbox group is ticked
  siteIds: d.siteIds ? d.siteIds.join(',') : undefined,
}));

interface Row {
  key: string;
  file: File;
  loaded: number;
  state: 'uploading' | 'done' | 'failed';
  message?: string;
  handle?: UploadHandle;
}

const kb = (n: number) => `${new Intl.NumberFormat().format(Math.round(n / 1024))} KB`;

/** Pick one or several files, then each uploads with its own progress, cancel and retry. */
export function UploadPanel({
  patientId,
  sites,
}: {
  patientId: string;
  sites: readonly { id: string; fdi: number }[];
}) {
  const form = useContractForm<Draft, UploadDetails>(schema, {
    kind: 'periapical',
    takenOn: '',
    note: '',
    siteIds: [],
  });
  const [system] = useToothSystem();
  const queryClient = useQueryClient();
  const [picked, setPicked] = useState<File[]>([]);
  const [rows, setRows] = useState<Row[]>([]);
  // A new key empties the native file input after the picked files are handed over.
  const [inputKey, setInputKey] = useState(0);

  const patch = (key: string, change: Partial<Row>) =>
    setRows((all) => all.map((r) => (r.key === key ? { ...r, ...change } : r)));

  const start = (key: string, file: File, query: UploadDetails) => {
    const handle = uploadRadiograph(patientId, file, query, (loaded) => patch(key, { loaded }));
    patch(key, { state: 'uploading', loaded: 0, message: undefined, handle });
    handle.done.then(
      () => {
        patch(key, { state: 'done', loaded: file.size });
        void queryClient.invalidateQueries({ queryKey: radiographKeys.all });
      },
      (e: unknown) => patch(key, { state: 'failed', message: e instanceof Error ? e.message : 'The upload failed' }),
    );
  };

  const submit = form.handleSubmit((query) => {
    const added = picked.map((file) => ({ key: crypto.randomUUID(), file, loaded: 0, state: 'uploading' as const }));
    setRows((all) => [...added, ...all]);
    setPicked([]);
    setInputKey((k) => k + 1);
    for (const r of added) start(r.key, r.file, query);
  });

  return (
    <Card className="radiograph-upload">
      <FormProvider {...form}>
        <form onSubmit={(e) => void submit(e)} noValidate>
          <FormGroup label="Files (PNG, JPEG or DICOM)" labelFor="radiograph-files">
            <input
              id="radiograph-files"
              key={inputKey}
              type="file"
              multiple
              data-testid="radiograph-files"
              onChange={(e) => setPicked(Array.from(e.target.files ?? []))}
            />
          </FormGroup>
          <FormField name="kind" label="Kind" labelFor="radiograph-kind">
            <HTMLSelect id="radiograph-kind" {...form.register('kind')} data-testid="radiograph-kind">
              {RADIOGRAPH_KINDS.map((k) => (
                <option key={k} value={k}>
                  {RADIOGRAPH_KIND_LABEL[k]}
                </option>
              ))}
            </HTMLSelect>
          </FormField>
          <FormField
            name="takenOn"
            label="Date taken"
            labelFor="radiograph-taken-on"
            help="Left empty, the DICOM study date is used"
          >
            {(a11y) => <DateField id="radiograph-taken-on" name="takenOn" {...a11y} />}
          </FormField>
          <fieldset className="radiograph-sites">
            <legend>Implant sites shown</legend>
            {sites.map((site) => (
              <label key={site.id} className="bp6-control bp6-checkbox bp6-inline">
                <input type="checkbox" value={site.id} {...form.register('siteIds')} />
                <span className="bp6-control-indicator" />
                {formatTooth(site.fdi, system)}
              </label>
            ))}
          </fieldset>
          <FormField name="note" label="Note" labelFor="radiograph-note">
            {(a11y) => <InputGroup id="radiograph-note" {...form.register('note')} {...a11y} />}
          </FormField>
          <Button type="submit" intent="primary" disabled={picked.length === 0} data-testid="radiograph-upload">
            Upload
          </Button>
        </form>
      </FormProvider>
      <ul className="radiograph-upload-rows">
        {rows.map((r) => (
          <li key={r.key} data-testid="upload-row">
            <span>{r.file.name}</span>{' '}
            <span>
              {kb(r.loaded)} of {kb(r.file.size)} ({r.file.size ? Math.round((100 * r.loaded) / r.file.size) : 100} %)
            </span>
            <ProgressBar
              aria-label={`Upload of ${r.file.name}`}
              value={r.file.size ? r.loaded / r.file.size : 1}
              animate={r.state === 'uploading'}
              stripes={r.state === 'uploading'}
              intent={r.state === 'failed' ? 'danger' : r.state === 'done' ? 'success' : 'primary'}
            />
            {r.state === 'uploading' && <Button small text="Cancel" onClick={() => r.handle?.cancel()} />}
            {r.state === 'failed' && (
              <>
                <span role="alert">{r.message}</span>{' '}
                <Button small text="Retry" onClick={() => start(r.key, r.file, schema.parse(form.getValues()))} />
              </>
            )}
          </li>
        ))}
      </ul>
    </Card>
  );
}
