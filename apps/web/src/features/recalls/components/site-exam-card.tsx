import { Button, Card, Checkbox, Classes, FormGroup, HTMLSelect, InputGroup, Tag, TextArea } from '@blueprintjs/core';
import { PROBING_POSITIONS, type ExamContext, type RecallExam } from '@torquetrail/contracts';
import { PERI_IMPLANT_FLAG_LABEL, PROBING_POSITION_ABBREVIATION } from '../../../lib/clinical-labels';
import { formatDate } from '../../../lib/dates';
import { SITE_STATUS_LABEL } from '../../../lib/labels';
import { MaintenanceStatusLabel } from '../../../lib/maintenance-status';
import { depthProblem, liveVerdict, type SiteDraft } from './live-verdict';

type Site = ExamContext['sites'][number];

function ExamSummary({ label, exam }: { label: string; exam: RecallExam | null }) {
  return (
    <>
      <dt>{label}</dt>
      <dd>
        {exam ? (
          <>
            {formatDate(exam.examinedOn)} · <MaintenanceStatusLabel status={exam.status} />
            <br />
            PD {exam.sites.map((s) => `${s.probingDepthMm}${s.bleeding ? '*' : ''}`).join(' ')}
            {exam.boneLevelMm !== null ? ` · bone ${exam.boneLevelMm} mm` : ''}
          </>
        ) : (
          'none'
        )}
      </dd>
    </>
  );
}

/** One implant's exam: the six-site probing grid (depths first, in chart order), indices, and the live status. */
export function SiteExamCard({
  site,
  draft,
  onChange,
  errors,
  onAmendPrevious,
  amending = false,
}: {
  site: Site;
  draft: SiteDraft;
  onChange: (next: SiteDraft) => void;
  errors: Record<string, string>;
  /** Offered when the previous exam may be amended (hygienist). */
  onAmendPrevious?: () => void;
  /** The card edits an amendment of the previous exam rather than a new exam. */
  amending?: boolean;
}) {
  const fdi = site.fdi;
  const verdict = draft.include ? liveVerdict(draft, site.baseline) : null;
  const set = <K extends keyof SiteDraft>(key: K, value: SiteDraft[K]) => onChange({ ...draft, [key]: value });
  const setAt = (key: 'depths' | 'bop' | 'sup', i: number, value: string | boolean) => onChange({ ...draft, [key]: draft[key].map((v, j) => (j === i ? value : v)) as never });
  const error = (path: string) => errors[path] && <div className="field-error">{errors[path]}</div>;

  return (
    <Card className="exam-site" data-testid={`exam-site-${fdi}`}>
      <h3>
        Implant {fdi} <Tag minimal>{SITE_STATUS_LABEL[site.status].toLowerCase()}</Tag>
      </h3>
      {!amending && <Checkbox checked={draft.include} onChange={(e) => set('include', e.currentTarget.checked)} label={`Examine ${fdi} in this visit`} />}
      {draft.include && (
        <div className="exam-site__layout">
          <div>
            <table className="probing-grid">
              <thead>
                <tr>
                  <th />
                  {PROBING_POSITIONS.map((p, i) => (
                    <th key={p} scope="col" title={p} className={i === 3 ? 'probing-grid__split' : undefined}>
                      {PROBING_POSITION_ABBREVIATION[p]}
                    </th>
                  ))}
                </tr>
              </thead>
              <tbody>
                <tr>
                  <th scope="row">PD (mm)</th>
                  {PROBING_POSITIONS.map((p, i) => (
                    <td key={p}>
                      <input
                        type="text"
                        inputMode="decimal"
                        className={Classes.INPUT}
                        aria-label={`${fdi} ${p} probing depth`}
                        aria-invalid={depthProblem(draft.depths[i]!) !== null}
                        value={draft.depths[i]}
                        onChange={(e) => setAt('depths', i, e.currentTarget.value)}
                      />
                    </td>
                  ))}
                </tr>
                <tr>
                  <th scope="row">BOP</th>
                  {PROBING_POSITIONS.map((p, i) => (
                    <td key={p}>
                      <input type="checkbox" aria-label={`${fdi} ${p} bleeding on probing`} checked={draft.bop[i]} onChange={(e) => setAt('bop', i, e.currentTarget.checked)} />
                    </td>
                  ))}
                </tr>
                <tr>
                  <th scope="row">SUP</th>
                  {PROBING_POSITIONS.map((p, i) => (
                    <td key={p}>
                      <input type="checkbox" aria-label={`${fdi} ${p} suppuration`} checked={draft.sup[i]} onChange={(e) => setAt('sup', i, e.currentTarget.checked)} />
                    </td>
                  ))}
                </tr>
              </tbody>
            </table>
            {draft.depths.map((d, i) => {
              const problem = depthProblem(d);
              return problem ? (
                <div key={i} className="field-error">
                  {PROBING_POSITIONS[i]}: {problem}
                </div>
              ) : null;
            })}
            {Object.entries(errors)
              .filter(([k]) => k.includes('.sites'))
              .map(([k, v]) => (
                <div key={k} className="field-error">
                  {k.replace(/^exams\.\d+\./, '')}: {v}
                </div>
              ))}
            <div className="exam-site__fields">
              <Checkbox checked={draft.mobility} onChange={(e) => set('mobility', e.currentTarget.checked)} label="Mobility" />
              <FormGroup label="Plaque index (mPlI)" labelFor={`pli-${fdi}`}>
                <HTMLSelect id={`pli-${fdi}`} value={draft.plaqueIndex} onChange={(e) => set('plaqueIndex', e.currentTarget.value)} options={['', '0', '1', '2', '3']} />
              </FormGroup>
              <FormGroup label="Bleeding index (mBI)" labelFor={`mbi-${fdi}`}>
                <HTMLSelect id={`mbi-${fdi}`} value={draft.bleedingIndex} onChange={(e) => set('bleedingIndex', e.currentTarget.value)} options={['', '0', '1', '2', '3']} />
              </FormGroup>
              <FormGroup label="Keratinized mucosa (mm)" labelFor={`km-${fdi}`}>
                <InputGroup id={`km-${fdi}`} value={draft.keratinizedMucosaMm} onChange={(e) => set('keratinizedMucosaMm', e.currentTarget.value)} style={{ width: 70 }} />
              </FormGroup>
              <FormGroup label="Bone level (mm, when known)" labelFor={`bone-${fdi}`}>
                <InputGroup id={`bone-${fdi}`} value={draft.boneLevelMm} onChange={(e) => set('boneLevelMm', e.currentTarget.value)} style={{ width: 70 }} />
              </FormGroup>
              <Checkbox checked={draft.residualCement} onChange={(e) => set('residualCement', e.currentTarget.checked)} label="Residual cement seen" />
              <Checkbox checked={draft.isBaseline} onChange={(e) => set('isBaseline', e.currentTarget.checked)} label="Mark as baseline" />
            </div>
            {error(`keratinizedMucosaMm`)}
            <FormGroup label="Notes" labelFor={`notes-${fdi}`}>
              <TextArea id={`notes-${fdi}`} fill value={draft.notes} onChange={(e) => set('notes', e.currentTarget.value)} />
            </FormGroup>
          </div>
          <div>
            <div className="live-status" aria-live="polite" data-testid={`live-status-${fdi}`}>
              <h4>Computed status</h4>
              {verdict?.state === 'ready' ? (
                <>
                  <MaintenanceStatusLabel status={verdict.result.status} />
                  <div className="live-status__flags" data-testid={`live-flags-${fdi}`}>
                    {verdict.result.flags.map((f) => (
                      <Tag key={f} intent="warning" minimal data-flag={f}>
                        {PERI_IMPLANT_FLAG_LABEL[f]}
                      </Tag>
                    ))}
                  </div>
                  <ul>
                    {verdict.result.reasons.map((r) => (
                      <li key={r}>{r}</li>
                    ))}
                  </ul>
                </>
              ) : (
                <span>{verdict?.message}</span>
              )}
            </div>
            <dl className="exam-compare">
              <ExamSummary label="Baseline" exam={site.baseline} />
              <ExamSummary label="Previous exam" exam={site.previous} />
            </dl>
            {onAmendPrevious && site.previous && !amending && (
              <Button size="small" icon="edit" onClick={onAmendPrevious}>
                Amend the exam of {formatDate(site.previous.examinedOn)}
              </Button>
            )}
          </div>
        </div>
      )}
    </Card>
  );
}
