import { Button, Card, Checkbox, Classes, FormGroup, HTMLSelect, InputGroup, Tag, TextArea } from '@blueprintjs/core';
import { PROBING_POSITIONS, type ExamContext, type RecallExam } from '@torquetrail/contracts';
import { boneLevelOfferFor } from '@torquetrail/domain';
import { useFormContext, useWatch } from 'react-hook-form';
import { PERI_IMPLANT_FLAG_LABEL, PROBING_POSITION_ABBREVIATION } from '../../../lib/clinical-labels';
import { formatDate } from '../../../lib/dates';
import { SITE_STATUS_LABEL } from '../../../lib/labels';
import { FieldError, FormField, useFieldError, withInputRef } from '../../../lib/forms';
import { MaintenanceStatusLabel } from '../../../lib/maintenance-status';
import { boneLevelSourceId, depthProblem, liveVerdict, type SiteDraft } from './live-verdict';
import { MeasuredBoneLevel } from './measured-bone-level';

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

/**
 * One probing site's problem: the depth as typed, checked live (a number of mm, 0.5 mm steps), or
 * else what the contract said at the last submit (e.g. a depth left empty).
 */
function DepthError({ position, typed, path }: { position: string; typed: string; path: string }) {
  const message = useFieldError(path, depthProblem(typed) ?? undefined, 'live');
  return message ? (
    <div className="field-error">
      {position}: {message}
    </div>
  ) : null;
}

/**
 * One implant's exam: the six-site probing grid (depths first, in chart order), indices, and the
 * live status. Its inputs are the draft at `name` in the surrounding form; the contract's messages
 * for it are under `errorPrefix` (a visit's `exams.<n>.`, or nothing for an amendment).
 */
export function SiteExamCard({
  site,
  examinedOn,
  name,
  errorPrefix,
  onAmendPrevious,
  amending = false,
}: {
  site: Site;
  /** The exam's date: the bone level offered is the latest measured on or before it. */
  examinedOn: string;
  name: string;
  errorPrefix: string;
  /** Offered when the previous exam may be amended (hygienist). */
  onAmendPrevious?: () => void;
  /** The card edits an amendment of the previous exam rather than a new exam. */
  amending?: boolean;
}) {
  const fdi = site.fdi;
  const { control, register, setValue } = useFormContext();
  const draft = useWatch({ control, name }) as SiteDraft;
  const verdict = draft.include ? liveVerdict(draft, site.baseline) : null;
  const field = (key: string) => register(`${name}.${key}`);

  return (
    <Card className="exam-site" data-testid={`exam-site-${fdi}`}>
      <h3>
        Implant {fdi} <Tag minimal>{SITE_STATUS_LABEL[site.status].toLowerCase()}</Tag>
      </h3>
      {!amending && <Checkbox label={`Examine ${fdi} in this visit`} {...withInputRef(field('include'))} />}
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
                        aria-invalid={depthProblem(draft.depths[i]) !== null}
                        {...field(`depths.${i}`)}
                      />
                    </td>
                  ))}
                </tr>
                <tr>
                  <th scope="row">BOP</th>
                  {PROBING_POSITIONS.map((p, i) => (
                    <td key={p}>
                      <input type="checkbox" aria-label={`${fdi} ${p} bleeding on probing`} {...field(`bop.${i}`)} />
                    </td>
                  ))}
                </tr>
                <tr>
                  <th scope="row">SUP</th>
                  {PROBING_POSITIONS.map((p, i) => (
                    <td key={p}>
                      <input type="checkbox" aria-label={`${fdi} ${p} suppuration`} {...field(`sup.${i}`)} />
                    </td>
                  ))}
                </tr>
              </tbody>
            </table>
            {PROBING_POSITIONS.map((p, i) => (
              <DepthError
                key={p}
                position={p}
                typed={draft.depths[i]}
                path={`${errorPrefix}sites.${i}.probingDepthMm`}
              />
            ))}
            <div className="exam-site__fields">
              <Checkbox label="Mobility" {...withInputRef(field('mobility'))} />
              {/* Their messages show below the row (a message inside it would push the fields out of line). */}
              <FormGroup label="Plaque index (mPlI)" labelFor={`pli-${fdi}`}>
                <HTMLSelect id={`pli-${fdi}`} options={['', '0', '1', '2', '3']} {...field('plaqueIndex')} />
              </FormGroup>
              <FormGroup label="Bleeding index (mBI)" labelFor={`mbi-${fdi}`}>
                <HTMLSelect id={`mbi-${fdi}`} options={['', '0', '1', '2', '3']} {...field('bleedingIndex')} />
              </FormGroup>
              <FormGroup label="Keratinized mucosa (mm)" labelFor={`km-${fdi}`}>
                <InputGroup id={`km-${fdi}`} style={{ width: 70 }} {...withInputRef(field('keratinizedMucosaMm'))} />
              </FormGroup>
              <FormGroup label="Bone level (mm, when known)" labelFor={`bone-${fdi}`}>
                <InputGroup id={`bone-${fdi}`} style={{ width: 70 }} {...withInputRef(field('boneLevelMm'))} />
              </FormGroup>
              <Checkbox label="Residual cement seen" {...withInputRef(field('residualCement'))} />
              <Checkbox label="Mark as baseline" {...withInputRef(field('isBaseline'))} />
            </div>
            <FieldError as="div" className="field-error" name={`${errorPrefix}keratinizedMucosaMm`} />
            <FieldError as="div" className="field-error" name={`${errorPrefix}boneLevelMm`} />
            <MeasuredBoneLevel
              offer={boneLevelOfferFor(site.measuredBoneLevels, examinedOn)}
              examinedOn={examinedOn}
              fdi={fdi}
              accepted={boneLevelSourceId(draft) !== null}
              onAccept={(offer) => {
                setValue(`${name}.boneLevelMm`, String(offer.boneLevelMm), { shouldDirty: true });
                setValue(`${name}.boneLevelSource`, {
                  measurementId: offer.measurementId,
                  boneLevelMm: offer.boneLevelMm,
                });
              }}
            />
            <FieldError as="div" className="field-error" name={`${errorPrefix}boneLevelMeasurementId`} />
            <FormField name={`${errorPrefix}notes`} label="Notes" labelFor={`notes-${fdi}`}>
              <TextArea id={`notes-${fdi}`} fill {...withInputRef(field('notes'))} />
            </FormField>
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
