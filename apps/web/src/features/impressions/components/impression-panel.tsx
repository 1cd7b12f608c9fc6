import { Button, Callout, FileInput, HTMLTable, ProgressBar, Spinner } from '@blueprintjs/core';
import type { RestorationSiteDetail, ScanFile } from '@torquetrail/contracts';
import { formatTooth, type Retention } from '@torquetrail/domain';
import { useQueryClient } from '@tanstack/react-query';
import { lazy, Suspense, useState } from 'react';
import { Can, useAppAbility } from '../../../lib/ability';
import { IMPRESSION_METHOD_LABEL, SCAN_FILE_TYPE_LABEL } from '../../../lib/clinical-labels';
import { formatDate } from '../../../lib/dates';
import type { ToothSystem } from '../../../lib/tooth-system';
import { impressionKeys } from '../api/keys';
import { uploadScanFile, useImpressions } from '../api/impressions-api';
import { ImpressionForm } from './impression-form';

// three is loaded only when a preview is opened: it stays out of the main bundle.
const ScanPreview = lazy(() => import('./scan-preview'));

const kb = (n: number) => `${Math.max(1, Math.round(n / 1024))} KB`;

/** A restoration's impression: its method, scan bodies with lots, and scan files with upload and preview. */
export function ImpressionPanel({
  restorationId,
  sites,
  system,
  retention,
}: {
  restorationId: string;
  sites: RestorationSiteDetail[];
  system: ToothSystem;
  retention?: Retention;
}) {
  const query = useImpressions(restorationId);
  const ability = useAppAbility();
  const queryClient = useQueryClient();
  const [recording, setRecording] = useState(false);
  const [upload, setUpload] = useState<{ name: string; size: number; loaded: number; error?: string } | null>(null);
  const [open, setOpen] = useState<ScanFile | null>(null);
  if (query.isPending) return <Spinner size={16} aria-label="Loading the impression" />;
  if (query.isError) return <Callout intent="danger">The impression could not be loaded.</Callout>;
  const current = query.data.items.find((i) => i.current);
  if (!current)
    return (
      <section className="impression" data-testid="impression-panel">
        <p className="impression__empty">No impression is recorded yet.</p>
        <Can I="create" a="Impression">
          {recording ? (
            <ImpressionForm
              restorationId={restorationId}
              sites={sites}
              system={system}
              retention={retention}
              onDone={() => setRecording(false)}
            />
          ) : (
            <Button
              icon="add"
              text="Record the impression"
              onClick={() => setRecording(true)}
              data-testid="open-impression-form"
            />
          )}
        </Can>
      </section>
    );
  const start = (file: File) => {
    setUpload({ name: file.name, size: file.size, loaded: 0 });
    uploadScanFile(current.id, file, (loaded) => setUpload((u) => u && { ...u, loaded })).done.then(
      () => {
        setUpload((u) => u && { ...u, loaded: u.size });
        void queryClient.invalidateQueries({ queryKey: impressionKeys.ofRestoration(restorationId) });
      },
      (e: unknown) => setUpload((u) => u && { ...u, error: e instanceof Error ? e.message : 'The upload failed' }),
    );
  };
  return (
    <section className="impression" data-testid="impression-panel">
      <h3>
        Impression · {IMPRESSION_METHOD_LABEL[current.method]} · {formatDate(current.takenOn)}
      </h3>
      {query.data.findings.map((f) => (
        <Callout key={f.code} intent="warning" icon="warning-sign" compact data-testid="impression-finding">
          {f.message} <span className="muted">({f.source ?? 'common practice'})</span>
        </Callout>
      ))}
      {current.scanBodies.length > 0 && (
        <HTMLTable compact>
          <thead>
            <tr>
              <th>Site</th>
              <th>Scan body</th>
              <th>Lot</th>
            </tr>
          </thead>
          <tbody>
            {current.scanBodies.map((b) => (
              <tr key={b.siteId}>
                <td>{formatTooth(b.fdi, system)}</td>
                <td>
                  {b.name} ({b.referenceCode})
                </td>
                <td>{b.lot ?? '—'}</td>
              </tr>
            ))}
          </tbody>
        </HTMLTable>
      )}
      {current.method === 'digital' && (
        <>
          <h4>Scan files</h4>
          {query.data.scanFiles.length === 0 && <p>No scan file uploaded yet.</p>}
          <ul className="impression__files">
            {query.data.scanFiles.map((f) => (
              <li key={f.id}>
                {f.originalName ?? f.id} · {SCAN_FILE_TYPE_LABEL[f.fileType]} · {kb(f.sizeBytes)}{' '}
                <Button small icon="cube" text="Preview in 3D" onClick={() => setOpen(f)} />
              </li>
            ))}
          </ul>
          <Can I="create" a="Impression">
            <FileInput
              text="Choose an STL, PLY or OBJ file…"
              inputProps={{ accept: '.stl,.ply,.obj', 'aria-label': 'Scan file' }}
              onInputChange={(e) => {
                const file = e.currentTarget.files?.[0];
                if (file) start(file);
              }}
            />
          </Can>
          {upload && (
            <div className="impression__upload" data-testid="scan-upload">
              <span>
                {upload.name}: {kb(upload.loaded)} of {kb(upload.size)}
              </span>
              <ProgressBar
                aria-label={`Upload of ${upload.name}`}
                value={upload.size ? upload.loaded / upload.size : 1}
                intent={upload.error ? 'danger' : upload.loaded >= upload.size ? 'success' : 'primary'}
                animate={false}
              />
              {upload.error && <p className="impression__error">{upload.error}</p>}
            </div>
          )}
          {open && (
            <Suspense fallback={<Spinner size={24} aria-label="Loading the 3D preview" />}>
              <ScanPreview
                key={open.id}
                file={open}
                canMark={ability.can('create', 'Impression')}
                scanBodies={current.scanBodies.map((b) => ({
                  siteId: b.siteId,
                  fdi: b.fdi,
                  site: formatTooth(b.fdi, system),
                  part: `${b.name} (${b.referenceCode})`,
                  lot: b.lot,
                }))}
              />
            </Suspense>
          )}
        </>
      )}
    </section>
  );
}
