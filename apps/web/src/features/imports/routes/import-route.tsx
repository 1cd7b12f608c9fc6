import '../components/import.css';
import { AnchorButton, Button, Callout, FileInput, ProgressBar } from '@blueprintjs/core';
import type { ImportPartMapping, ImportReport, ImportResult } from '@torquetrail/contracts';
import { useState } from 'react';
import { Link } from 'react-router-dom';
import { BreadcrumbTrail } from '../../../lib/components/breadcrumb-trail';
import { IMPORT_PHASE_LABEL } from '../../../lib/labels';
import { dryRunImport, runImport, useImportProgress } from '../api/imports-api';
import { ImportCountsTable, ImportIssues, PartMappings } from '../components/import-report';
import { ChartNumber } from '../../../lib/components/chart-number';
import { formatDateTime } from '../../../lib/dates';

type Step =
  | { kind: 'idle' }
  | { kind: 'running'; what: 'check' | 'import'; runId: string }
  | { kind: 'failed'; message: string };

/** The bar while a run goes: rows read while checking, records written while importing. */
function RunProgress({ runId, what }: { runId: string; what: 'check' | 'import' }) {
  const progress = useImportProgress(runId).data;
  const value =
    progress?.phase === 'writing' && progress.recordsToWrite
      ? Math.min(1, progress.rowsWritten / progress.recordsToWrite)
      : undefined;
  return (
    <div className="import-progress" data-testid="import-progress" aria-live="polite">
      <ProgressBar intent="primary" value={value} animate stripes={value === undefined} />
      <p>
        {what === 'check' ? 'Checking the file' : 'Importing'}
        {progress
          ? `: ${IMPORT_PHASE_LABEL[progress.phase]}, ${progress.rowsRead} rows read${
              progress.phase === 'writing' ? `, ${progress.rowsWritten} records written` : ''
            }`
          : '…'}
      </p>
    </div>
  );
}

/** /import-records: bring a practice's history in from a CSV — check it (dry run), then import it (admin, dentist). */
export function ImportRoute() {
  const [file, setFile] = useState<File | null>(null);
  const [mappings, setMappings] = useState<ImportPartMapping[]>([]);
  const [report, setReport] = useState<ImportReport | null>(null);
  const [result, setResult] = useState<ImportResult | null>(null);
  const [step, setStep] = useState<Step>({ kind: 'idle' });
  const running = step.kind === 'running';

  async function go(what: 'check' | 'import') {
    if (!file) return;
    const runId = crypto.randomUUID();
    setStep({ kind: 'running', what, runId });
    try {
      if (what === 'check') {
        setResult(null);
        setReport(await dryRunImport(file, { runId, mappings }));
      } else {
        setResult(await runImport(file, { runId, mappings }));
      }
      setStep({ kind: 'idle' });
    } catch (e) {
      setStep({ kind: 'failed', message: e instanceof Error ? e.message : 'The request failed.' });
    }
  }

  return (
    <div className="import-page">
      <title>Import records · Torquetrail</title>
      <BreadcrumbTrail items={[{ text: 'Practice' }, { text: 'Import records' }]} />
      <h1 className="page-title">Import records from a spreadsheet</h1>
      <p>
        One row per event — placement, delivery, part, torque entry or recall exam — in the documented columns. The file
        is checked first and nothing is written until you import it; importing the same file again changes nothing.
      </p>
      <p className="import-page__links">
        <AnchorButton icon="th" variant="minimal" href="/import/torquetrail-import-template.csv" download>
          Template (columns only)
        </AnchorButton>
        <AnchorButton icon="document" variant="minimal" href="/import/torquetrail-import-example.csv" download>
          Example file
        </AnchorButton>
      </p>
      <div className="import-page__file">
        <FileInput
          inputProps={{ accept: '.csv,text/csv', 'aria-label': 'CSV file to import', id: 'import-file' }}
          text={file ? file.name : 'Choose a CSV file…'}
          buttonText="Browse"
          onInputChange={(e) => {
            setFile(e.currentTarget.files?.[0] ?? null);
            setReport(null);
            setResult(null);
            setMappings([]);
            setStep({ kind: 'idle' });
          }}
        />
        <Button
          intent="primary"
          icon="search-template"
          text={report ? 'Check again' : 'Check the file'}
          disabled={!file || running}
          onClick={() => void go('check')}
        />
      </div>
      {step.kind === 'running' && <RunProgress runId={step.runId} what={step.what} />}
      {step.kind === 'failed' && (
        <Callout intent="danger" title="The file was not accepted" role="alert">
          {step.message} Nothing was written.
        </Callout>
      )}
      {report && !result && (
        <section aria-labelledby="import-report-heading" data-testid="import-report">
          <h2 id="import-report-heading">Check of {report.fileName}</h2>
          <p>
            {report.errors} error(s), {report.warnings} warning(s); read as{' '}
            {report.encoding === 'windows-1252' ? 'Windows-1252 (converted)' : 'UTF-8'}, separated by “
            {report.delimiter}”.
          </p>
          {report.alreadyImportedAt && (
            <Callout intent="primary" title="Already imported">
              This file was imported on {formatDateTime(report.alreadyImportedAt)}: importing it again changes nothing.
            </Callout>
          )}
          <ImportCountsTable counts={report.counts} />
          <PartMappings report={report} mappings={mappings} onChange={setMappings} />
          <ImportIssues report={report} />
          <Button
            intent="success"
            icon="import"
            text="Import"
            disabled={report.errors > 0 || running}
            title={report.errors > 0 ? 'Correct the errors (or map the parts) and check again' : undefined}
            onClick={() => void go('import')}
          />
        </section>
      )}
      {result && (
        <Callout
          intent="success"
          title={result.written ? 'Imported' : 'Already imported: nothing changed'}
          data-testid="import-result"
        >
          <p>
            {result.fileName}, imported {formatDateTime(result.importedAt)}.
          </p>
          <ImportCountsTable counts={result.counts} />
          {result.patients.length > 0 && (
            <ul className="import-result__patients">
              {result.patients.map((p) => (
                <li key={p.id}>
                  <Link to={`/patients/${p.id}`}>
                    {p.name} (<ChartNumber value={p.chartNumber} />)
                  </Link>
                </li>
              ))}
            </ul>
          )}
        </Callout>
      )}
    </div>
  );
}
