// The 3D preview of one scan file: three.js with its own loaders and OrbitControls (drag to
// rotate, wheel to zoom). Loaded lazily (React.lazy) so three stays out of the main bundle.
// The recorded scan bodies are pins on the mesh, placed by a clinician who may record the
// impression (a click on the surface, read by three's Raycaster) and saved as markers.
import './scan-preview.css';
import { Button, Callout, Spinner } from '@blueprintjs/core';
import type { MarkerPoint, ScanFile } from '@torquetrail/contracts';
import { useEffect, useMemo, useRef, useState } from 'react';
import {
  AmbientLight,
  Box3,
  DirectionalLight,
  Mesh,
  MeshStandardMaterial,
  PerspectiveCamera,
  Scene,
  SphereGeometry,
  Vector3,
  WebGLRenderer,
} from 'three';
import { OrbitControls } from 'three/examples/jsm/controls/OrbitControls.js';
import { runMutation } from '../../../lib/run-mutation';
import { fetchScanFile, useSaveScanBodyMarkers, useScanBodyMarkers } from '../api/impressions-api';
import { cameraFacing, isClick, markerChanges, pickPoint, pointerToNdc, shownMarkers } from './marker-picking';
import { meshGeometry } from './mesh-geometry';

const SIZE = { width: 480, height: 360 };
const PIN = 0x2f9e8f;
const PIN_ACTIVE = 0xf5b53c;

/** A scan body recorded on the impression, as the legend and its pin name it. */
export interface RecordedScanBody {
  siteId: string;
  /** The site in the practice's numbering (e.g. "15" or "UR5"). */
  site: string;
  /** The FDI number, always given beside the practice's numbering on a pin. */
  fdi: number;
  part: string;
  lot: string | null;
}

/** What the three.js view keeps between renders. */
interface View {
  mesh: Mesh;
  camera: PerspectiveCamera;
  controls: OrbitControls;
  pins: Map<string, Mesh>;
  pinGeometry: SphereGeometry;
  radius: number;
  draw: () => void;
}

export default function ScanPreview({
  file,
  scanBodies,
  canMark,
}: {
  file: ScanFile;
  scanBodies: RecordedScanBody[];
  /** The user may record the impression, so may place, move and clear its markers. */
  canMark: boolean;
}) {
  const host = useRef<HTMLDivElement>(null);
  const view = useRef<View | null>(null);
  const labels = useRef(new Map<string, HTMLElement>());
  const [state, setState] = useState<'loading' | 'ready' | 'failed'>('loading');
  const markers = useScanBodyMarkers(file.id);
  const save = useSaveScanBodyMarkers(file.id);
  const [edits, setEdits] = useState(new Map<string, MarkerPoint | null>());
  const [placing, setPlacing] = useState<string | null>(null);
  const [active, setActive] = useState<string | null>(null);
  const [saveError, setSaveError] = useState<string | null>(null);
  // The canvas's pointer handler is set up once per file; it reads the site being placed from here.
  const placingRef = useRef(placing);
  useEffect(() => {
    placingRef.current = placing;
  }, [placing]);

  const saved = useMemo(
    () => new Map((markers.data?.items ?? []).flatMap((m) => (m.point ? [[m.siteId, m.point] as const] : []))),
    [markers.data],
  );
  const shown = useMemo(() => shownMarkers(saved, edits), [saved, edits]);
  const changes = markerChanges(saved, edits);

  useEffect(() => {
    const abort = new AbortController();
    let dispose = () => {};
    fetchScanFile(file.id, abort.signal).then(
      (bytes) => {
        if (!host.current) return;
        const geometry = meshGeometry(file.fileType, bytes);
        geometry.computeVertexNormals();
        const mesh = new Mesh(geometry, new MeshStandardMaterial({ color: 0xd9c9a8, flatShading: true }));
        const box = new Box3().setFromObject(mesh);
        const centre = box.getCenter(new Vector3());
        mesh.position.sub(centre);
        const radius = Math.max(box.getSize(new Vector3()).length() / 2, 1e-3);
        const scene = new Scene();
        scene.add(mesh, new AmbientLight(0xffffff, 0.6));
        const light = new DirectionalLight(0xffffff, 1.2);
        light.position.set(1, 1, 2);
        scene.add(light);
        const camera = new PerspectiveCamera(40, SIZE.width / SIZE.height, radius / 100, radius * 100);
        camera.position.set(0, 0, radius * 3);
        // preserveDrawingBuffer: the canvas keeps its last frame, so a test can read its pixels.
        const renderer = new WebGLRenderer({ antialias: true, preserveDrawingBuffer: true });
        renderer.setSize(SIZE.width, SIZE.height);
        renderer.setClearColor(0x20262c);
        host.current.prepend(renderer.domElement);
        const canvas = renderer.domElement;
        canvas.setAttribute('aria-label', `3D preview of ${file.originalName ?? 'the scan file'}`);
        canvas.dataset.testid = 'scan-preview-canvas';
        const controls = new OrbitControls(camera, canvas);
        const pins = new Map<string, Mesh>();
        const draw = () => {
          renderer.render(scene, camera);
          // Each pin's label follows its pin on the canvas (hidden when the pin is behind the camera).
          for (const [siteId, pin] of pins) {
            const label = labels.current.get(siteId);
            if (!label) continue;
            const at = pin.getWorldPosition(new Vector3()).project(camera);
            label.hidden = at.z > 1;
            label.style.transform = `translate(${((at.x + 1) / 2) * SIZE.width}px, ${((1 - at.y) / 2) * SIZE.height}px)`;
          }
        };
        controls.addEventListener('change', draw);
        // A press and release on one spot places the marker chosen in the legend; a drag rotates.
        let down: { x: number; y: number } | null = null;
        const onDown = (e: PointerEvent) => {
          down = { x: e.clientX, y: e.clientY };
        };
        const onUp = (e: PointerEvent) => {
          const siteId = placingRef.current;
          if (!down || !siteId || !isClick(down, { x: e.clientX, y: e.clientY })) return;
          const point = pickPoint(mesh, camera, pointerToNdc(e.clientX, e.clientY, canvas.getBoundingClientRect()));
          if (!point) return;
          setEdits((m) => new Map(m).set(siteId, point));
          setPlacing(null);
        };
        canvas.addEventListener('pointerdown', onDown);
        canvas.addEventListener('pointerup', onUp);
        view.current = {
          mesh,
          camera,
          controls,
          pins,
          pinGeometry: new SphereGeometry(radius * 0.035, 16, 12),
          radius,
          draw,
        };
        draw();
        setState('ready');
        dispose = () => {
          canvas.removeEventListener('pointerdown', onDown);
          canvas.removeEventListener('pointerup', onUp);
          controls.dispose();
          geometry.dispose();
          view.current?.pinGeometry.dispose();
          view.current = null;
          renderer.dispose();
          canvas.remove();
        };
      },
      () => {
        if (!abort.signal.aborted) setState('failed');
      },
    );
    return () => {
      abort.abort();
      dispose();
    };
  }, [file]);

  // The pins on the mesh follow the markers shown (saved, with the edits laid over them).
  useEffect(() => {
    const v = view.current;
    if (!v || state !== 'ready') return;
    for (const [siteId, pin] of v.pins) {
      if (shown.has(siteId)) continue;
      v.mesh.remove(pin);
      (pin.material as MeshStandardMaterial).dispose();
      v.pins.delete(siteId);
    }
    for (const [siteId, point] of shown) {
      let pin = v.pins.get(siteId);
      if (!pin) {
        pin = new Mesh(v.pinGeometry, new MeshStandardMaterial({ color: PIN }));
        v.pins.set(siteId, pin);
        v.mesh.add(pin);
      }
      // The point is in the file's coordinates: the pin is the mesh's child, so it moves with it.
      pin.position.set(point.x, point.y, point.z);
      (pin.material as MeshStandardMaterial).color.setHex(siteId === active ? PIN_ACTIVE : PIN);
      pin.scale.setScalar(siteId === active ? 1.6 : 1);
    }
    v.draw();
  }, [shown, active, state]);

  /** Focus a scan body: its pin is highlighted and the camera turns to face it. */
  const focus = (siteId: string) => {
    setActive(siteId);
    const v = view.current;
    const pin = v?.pins.get(siteId);
    if (!v || !pin) return;
    const target = v.controls.target;
    const to = cameraFacing(target, pin.getWorldPosition(new Vector3()), v.camera.position.distanceTo(target));
    if (!to) return;
    v.camera.position.copy(to);
    v.camera.lookAt(target);
    v.controls.update();
    v.draw();
  };

  const saveAll = () => {
    setSaveError(null);
    runMutation(save, changes, {
      onSuccess: () => setEdits(new Map()),
      onError: (e) => setSaveError(e.message),
    });
  };

  const byId = new Map(scanBodies.map((b) => [b.siteId, b]));
  const placingBody = placing ? byId.get(placing) : undefined;
  return (
    <div className="scan-preview" data-testid="scan-preview" data-state={state}>
      {state === 'loading' && <Spinner size={24} aria-label="Loading the scan file" />}
      {state === 'failed' && (
        <Callout intent="danger" compact>
          The scan file could not be shown.
        </Callout>
      )}
      <div ref={host} className={`scan-preview__stage${placing ? ' scan-preview__stage--placing' : ''}`}>
        {[...shown.keys()].map((siteId) => {
          const b = byId.get(siteId);
          return (
            <span
              key={siteId}
              ref={(el) => {
                if (el) labels.current.set(siteId, el);
                else labels.current.delete(siteId);
              }}
              className={`scan-preview__pin${siteId === active ? ' scan-preview__pin--active' : ''}`}
              data-testid="scan-body-pin"
              data-site-id={siteId}
              data-fdi={b?.fdi}
              data-point={(() => {
                const p = shown.get(siteId)!;
                return [p.x, p.y, p.z].map((c) => (Math.abs(c) < 0.005 ? 0 : c).toFixed(2)).join(' ');
              })()}
            >
              {b ? (b.site === String(b.fdi) ? `${b.site} (FDI)` : `${b.site} · FDI ${b.fdi}`) : 'Site'}
            </span>
          );
        })}
      </div>
      {state === 'ready' && (
        <p className="scan-preview__hint" aria-live="polite">
          {placingBody
            ? `Click the scan body of site ${placingBody.site} on the scan to place its marker (drag still rotates).`
            : 'Drag to rotate, scroll to zoom.'}
        </p>
      )}
      {scanBodies.length > 0 && (
        <div className="scan-preview__legend" data-testid="scan-preview-legend">
          <strong>Scan bodies in this impression</strong>
          {state === 'ready' && markers.isSuccess && shown.size === 0 && (
            <p className="scan-preview__empty" data-testid="scan-markers-empty">
              No scan body is marked on this scan yet.
              {canMark ? ' Choose “Place” beside one, then click its shape on the scan.' : ''}
            </p>
          )}
          <ul>
            {scanBodies.map((b) => {
              const marked = shown.has(b.siteId);
              return (
                <li
                  key={b.siteId}
                  className={b.siteId === active ? 'scan-preview__row scan-preview__row--active' : 'scan-preview__row'}
                  data-testid={`scan-body-row-${b.fdi}`}
                  onMouseEnter={() => setActive(b.siteId)}
                  onMouseLeave={() => setActive(null)}
                >
                  {/* Keyboard: focusing a scan body highlights its pin and turns the camera to it. */}
                  <button
                    type="button"
                    className="scan-preview__focus"
                    aria-label={`Site ${b.site}: ${b.part}${marked ? ', marked on the scan: show it' : ', not marked on the scan'}`}
                    onFocus={() => focus(b.siteId)}
                    onClick={() => focus(b.siteId)}
                    onBlur={() => setActive(null)}
                  >
                    {b.site}: {b.part}
                    {b.lot ? ` · lot ${b.lot}` : ''}
                    {marked ? '' : ' · not marked'}
                  </button>
                  {canMark && state === 'ready' && (
                    <span className="scan-preview__actions">
                      <Button
                        small
                        minimal
                        icon="map-marker"
                        text={placing === b.siteId ? 'Placing…' : marked ? 'Move' : 'Place'}
                        active={placing === b.siteId}
                        aria-label={`${marked ? 'Move' : 'Place'} the marker of site ${b.site}`}
                        onClick={() => setPlacing((p) => (p === b.siteId ? null : b.siteId))}
                      />
                      {marked && (
                        <Button
                          small
                          minimal
                          icon="cross"
                          text="Clear"
                          aria-label={`Clear the marker of site ${b.site}`}
                          onClick={() => setEdits((m) => new Map(m).set(b.siteId, null))}
                        />
                      )}
                    </span>
                  )}
                </li>
              );
            })}
          </ul>
          {canMark && changes.length > 0 && (
            <div className="scan-preview__save">
              <Button
                intent="primary"
                small
                text={changes.length === 1 ? 'Save the marker' : `Save ${changes.length} markers`}
                loading={save.isPending}
                onClick={saveAll}
                data-testid="save-scan-markers"
              />
              <Button small minimal text="Discard" onClick={() => setEdits(new Map())} disabled={save.isPending} />
            </div>
          )}
          {saveError && (
            <Callout intent="danger" compact>
              {saveError}
            </Callout>
          )}
          {/* Said plainly: a pin is where a clinician put it, not something read out of the file. */}
          <p className="scan-preview__note">
            Pins are placed by hand on the scan; the file itself does not name its parts. Check each pin against the
            scan before relying on it.
          </p>
        </div>
      )}
    </div>
  );
}
