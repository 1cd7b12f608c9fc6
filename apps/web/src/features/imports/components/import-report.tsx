import { Button, Callout, FormGroup, HTMLSelect, HTMLTable, InputGroup, Tag } from '@blueprintjs/core';
import {
  IMPORT_EVENTS,
  IMPORT_ISSUE_LEVELS,
  csvLine,
  type ImportIssueLevel,
  type ImportPartMapping,
  type ImportReport,
} from '@torquetrail/contracts';
import { useState } from 'react';
import { IMPORT_EVENT_LABEL, IMPORT_ISSUE_LEVEL_LABEL } from '../../../lib/labels';

/** Problems shown at once; the download has them all. */
const SHOWN = 500;

/** The problems as CSV (through the shared helper, so no cell can run as a formula). */
function downloadIssues(report: ImportReport, issues: ImportReport['issues']) {
  const text =
    csvLine(['row', 'column', 'level', 'message']) +
    issues.map((i) => csvLine([i.row, i.column, IMPORT_ISSUE_LEVEL_LABEL[i.level], i.message])).join('');
  const url = URL.createObjectURL(new Blob([text], { type: 'text/csv;charset=utf-8' }));
  const a = document.createElement('a');
  a.href = url;
  a.download = `${report.fileName.replace(/\.csv$/i, '')}-problems.csv`;
  a.click();
  URL.revokeObjectURL(url);
}

export function ImportCountsTable({ counts }: { counts: ImportReport['counts'] }) {
  return (
    <HTMLTable compact className="import-counts" data-testid="import-counts">
      <tbody>
        <tr>
          <th scope="row">Rows read</th>
          <td>{counts.rows}</td>
        </tr>
        <tr>
          <th scope="row">New patients</th>
          <td>{counts.patientsNew}</td>
        </tr>
        <tr>
          <th scope="row">Existing patients matched</th>
          <td>{counts.patientsMatched}</td>
        </tr>
        <tr>
          <th scope="row">New implant sites</th>
          <td>{counts.sites}</td>
        </tr>
        {IMPORT_EVENTS.map((e) => (
          <tr key={e}>
            <th scope="row">{IMPORT_EVENT_LABEL[e]}</th>
            <td>{counts[e]}</td>
          </tr>
        ))}
      </tbody>
    </HTMLTable>
  );
}

/** The problems of a dry run: filter by level and words, download as CSV. */
export function ImportIssues({ report }: { report: ImportReport }) {
  const [level, setLevel] = useState<ImportIssueLevel | ''>('');
  const [words, setWords] = useState('');
  if (report.issues.length === 0) return <p data-testid="import-no-issues">No problems found in the file.</p>;
  const needle = words.trim().toLowerCase();
  const shown = report.issues.filter(
    (i) =>
      (!level || i.level === level) &&
      (!needle || `${i.row} ${i.column ?? ''} ${i.message}`.toLowerCase().includes(needle)),
  );
  return (
    <section aria-labelledby="import-issues-heading">
      <h2 id="import-issues-heading">Problems</h2>
      <div className="import-issues__filters">
        <FormGroup label="Show" labelFor="import-issue-level" inline>
          <HTMLSelect
            id="import-issue-level"
            value={level}
            onChange={(e) => setLevel(e.currentTarget.value as ImportIssueLevel | '')}
          >
            <option value="">Errors and warnings</option>
            {IMPORT_ISSUE_LEVELS.map((l) => (
              <option key={l} value={l}>
                {IMPORT_ISSUE_LEVEL_LABEL[l]}s only
              </option>
            ))}
          </HTMLSelect>
        </FormGroup>
        <FormGroup label="Containing" labelFor="import-issue-words" inline>
          <InputGroup
            id="import-issue-words"
            value={words}
            onValueChange={setWords}
            placeholder="row, column or words"
          />
        </FormGroup>
        <Button icon="download" text="Download as CSV" onClick={() => downloadIssues(report, shown)} />
      </div>
      <HTMLTable compact striped className="import-issues" data-testid="import-issues">
        <thead>
          <tr>
            <th scope="col">Row</th>
            <th scope="col">Column</th>
            <th scope="col">Level</th>
            <th scope="col">Problem</th>
          </tr>
        </thead>
        <tbody>
          {shown.slice(0, SHOWN).map((i) => (
            <tr key={`${i.row}-${i.column}-${i.message}`} data-level={i.level}>
              <td>{i.row || 'file'}</td>
              <td>{i.column ?? ''}</td>
              <td>
                <Tag minimal intent={i.level === 'error' ? 'danger' : 'warning'}>
                  {IMPORT_ISSUE_LEVEL_LABEL[i.level]}
                </Tag>
              </td>
              <td>{i.message}</td>
            </tr>
          ))}
        </tbody>
      </HTMLTable>
      {shown.length > SHOWN && <p>{shown.length - SHOWN} more in the download.</p>}
    </section>
  );
}

const FREE_TEXT = 'free-text';

/** For each part reference not in the catalogue: map it to a catalogue part or keep it as free text. */
export function PartMappings({
  report,
  mappings,
  onChange,
}: {
  report: ImportReport;
  mappings: ImportPartMapping[];
  onChange: (next: ImportPartMapping[]) => void;
}) {
  if (report.unknownParts.length === 0) return null;
  const choiceOf = (partRef: string) => {
    const m = mappings.find((x) => x.partRef === partRef);
    return !m ? '' : 'componentId' in m ? m.componentId : FREE_TEXT;
  };
  const choose = (partRef: string, value: string) => {
    const rest = mappings.filter((m) => m.partRef !== partRef);
    if (!value) return onChange(rest);
    onChange([...rest, value === FREE_TEXT ? { partRef, freeText: true } : { partRef, componentId: value }]);
  };
  return (
    <Callout intent="warning" title="Parts not in the catalogue" className="import-mappings">
      <p>
        Choose a catalogue part for each reference, or keep it as free text (shown in the Timeline; its torque entries
        cannot be judged). Then check the file again.
      </p>
      {report.unknownParts.map((u) => (
        <FormGroup
          key={u.partRef}
          label={`${u.partRef}${u.partName ? ` (${u.partName})` : ''}, rows ${u.rows.slice(0, 8).join(', ')}${u.rows.length > 8 ? '…' : ''}`}
          labelFor={`map-${u.partRef}`}
        >
          <HTMLSelect
            id={`map-${u.partRef}`}
            value={choiceOf(u.partRef)}
            onChange={(e) => choose(u.partRef, e.currentTarget.value)}
          >
            <option value="">Not chosen yet</option>
            <option value={FREE_TEXT}>Keep as free text</option>
            {report.catalogueParts.map((c) => (
              <option key={c.id} value={c.id}>
                {c.referenceCode}: {c.name} ({c.platformName})
              </option>
            ))}
          </HTMLSelect>
        </FormGroup>
      ))}
    </Callout>
  );
}
