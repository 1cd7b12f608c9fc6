import '../components/radiographs.css';
import { Button, ButtonGroup, Card, Slider, Switch } from '@blueprintjs/core';
import type { Measurement } from '@torquetrail/contracts';
import { useState, type KeyboardEvent, type WheelEvent } from 'react';
import { useParams } from 'react-router-dom';
import { Can } from '../../../lib/ability';
import { BreadcrumbTrail } from '../../../lib/components/breadcrumb-trail';
import { ErrorState } from '../../../lib/components/error-state';
import { LoadingState } from '../../../lib/components/loading-state';
import { RADIOGRAPH_KIND_LABEL } from '../../../lib/labels';
import { usePatient } from '../../patients';
import { useRadiograph } from '../api/radiographs-api';
import { EnteredInErrorCard } from '../components/entered-in-error-form';
import { MeasureWorkspace } from '../components/measure-workspace';
import { PreviewNotice } from '../components/preview-notice';
import { useCloseOnEscape } from '../../../lib/use-close-on-escape';

const ZOOM_STEP = 1.25;
const mm = (v: number) => `${v.toFixed(2)} mm`;

/** /patients/:patientId/radiographs/:radiographId: the preview with zoom, pan, windowing and the bone-level marks. */
export function RadiographViewerRoute() {
  const { patientId = '', radiographId = '' } = useParams();
  const patient = usePatient(patientId);
  const radiograph = useRadiograph(radiographId);
  const [zoom, setZoom] = useState(1);
  const [pan, setPan] = useState({ x: 0, y: 0 });
  const [drag, setDrag] = useState<{ x: number; y: number } | null>(null);
  const [brightness, setBrightness] = useState(100);
  const [contrast, setContrast] = useState(100);
  const [invert, setInvert] = useState(false);
  const [amending, setAmending] = useState<Measurement | null>(null);
  useCloseOnEscape(amending !== null, () => setAmending(null));

  // The measuring form takes its site from the patient's sites as it first renders: it waits for
  // both, or it would keep an empty site and refuse every save with no field to show why.
  if (radiograph.isPending || patient.isPending) return <LoadingState label="Loading the radiograph" />;
  if (radiograph.isError)
    return (
      <ErrorState
        title="Could not load the radiograph"
        error={radiograph.error}
        onRetry={() => void radiograph.refetch()}
      />
    );
  const r = radiograph.data;
  const sites = (patient.data?.sites ?? []).filter((s) => r.siteIds.includes(s.id));
  const patientName = patient.data ? `${patient.data.givenName} ${patient.data.familyName}` : 'Patient';
  const fit = () => {
    setZoom(1);
    setPan({ x: 0, y: 0 });
  };
  const onKey = (e: KeyboardEvent) => {
    if (e.key === '+' || e.key === '=') setZoom((z) => z * ZOOM_STEP);
    else if (e.key === '-') setZoom((z) => z / ZOOM_STEP);
    else if (e.key === '0') fit();
  };
  const onWheel = (e: WheelEvent) => setZoom((z) => (e.deltaY < 0 ? z * ZOOM_STEP : z / ZOOM_STEP));
  return (
    <div className="radiograph-viewer">
      <title>Radiograph · Torquetrail</title>
      <BreadcrumbTrail
        items={[
          { text: 'Patients', to: '/patients' },
          { text: patientName, to: `/patients/${patientId}` },
          { text: 'Radiographs', to: `/patients/${patientId}/radiographs` },
          { text: `${RADIOGRAPH_KIND_LABEL[r.kind]} ${r.takenOn ?? ''}` },
        ]}
      />
      <div className="viewer-tools">
        <ButtonGroup>
          <Button icon="zoom-in" aria-label="Zoom in" onClick={() => setZoom((z) => z * ZOOM_STEP)} />
          <Button icon="zoom-out" aria-label="Zoom out" onClick={() => setZoom((z) => z / ZOOM_STEP)} />
          <Button icon="zoom-to-fit" text="Fit" onClick={fit} />
        </ButtonGroup>
        <label className="viewer-slider">
          Brightness
          <Slider
            min={20}
            max={300}
            stepSize={5}
            labelRenderer={false}
            value={brightness}
            onChange={setBrightness}
            handleHtmlProps={{ 'aria-label': 'Brightness' }}
          />
        </label>
        <label className="viewer-slider">
          Contrast
          <Slider
            min={20}
            max={300}
            stepSize={5}
            labelRenderer={false}
            value={contrast}
            onChange={setContrast}
            handleHtmlProps={{ 'aria-label': 'Contrast' }}
          />
        </label>
        <Switch label="Invert" checked={invert} onChange={() => setInvert((v) => !v)} />
      </div>
      {r.previewStatus !== 'ready' && <PreviewNotice radiograph={r} />}
      <MeasureWorkspace
        // A new form for each measurement amended: its marks and reason start empty.
        key={amending?.id ?? 'new'}
        radiograph={r}
        sites={sites}
        amending={amending}
        locked={r.enteredInError !== null}
        onDone={() => setAmending(null)}
        renderStage={({ onClick, marks }) =>
          r.previewStatus !== 'ready' ? null : (
            <div
              className="viewer-stage"
              tabIndex={0}
              role="group"
              aria-label="Radiograph: + and − zoom, 0 fits, drag with the right button to pan"
              onKeyDown={onKey}
              onWheel={onWheel}
              onMouseDown={(e) => e.button === 2 && setDrag({ x: e.clientX - pan.x, y: e.clientY - pan.y })}
              onMouseMove={(e) => drag && setPan({ x: e.clientX - drag.x, y: e.clientY - drag.y })}
              onMouseUp={() => setDrag(null)}
              onContextMenu={(e) => e.preventDefault()}
            >
              <div className="viewer-layer" style={{ transform: `translate(${pan.x}px, ${pan.y}px) scale(${zoom})` }}>
                <img
                  src={`/api/radiographs/${r.id}/preview`}
                  alt={`${RADIOGRAPH_KIND_LABEL[r.kind]} radiograph`}
                  data-testid="viewer-image"
                  style={{ filter: `brightness(${brightness}%) contrast(${contrast}%) invert(${invert ? 1 : 0})` }}
                  onClick={onClick}
                  draggable={false}
                />
                {marks}
              </div>
            </div>
          )
        }
      />
      <Card>
        <h2>Measurements</h2>
        {r.measurements.length === 0 ? (
          <p>None yet.</p>
        ) : (
          <ul data-testid="measurements">
            {r.measurements.map((m) => (
              <li key={m.id}>
                Mesial {mm(m.mesialMm)}, distal {mm(m.distalMm)} from the platform (implant {m.implantTrueMm} mm)
                {m.spacingEstimate &&
                  ` · by Pixel Spacing: mesial ${mm(m.spacingEstimate.mesialMm)}, distal ${mm(m.spacingEstimate.distalMm)}`}
                {m.spacingEstimate?.flagged &&
                  ` · the two scales differ by ${Math.round(Math.abs(m.spacingEstimate.disagreement) * 100)} %: the projection may be foreshortened or elongated`}
                {` · ${m.measuredBy}`}
                {m.supersedesId && ` · amended: ${m.amendmentReason ?? ''}`}
                {!r.enteredInError && !amending && (
                  <Can I="amend" a="Radiograph">
                    {' '}
                    <Button size="small" icon="edit" text="Amend" onClick={() => setAmending(m)} />
                  </Can>
                )}
              </li>
            ))}
          </ul>
        )}
        <small>Supporting information, not a diagnosis.</small>
      </Card>
      <EnteredInErrorCard radiograph={r} />
    </div>
  );
}
