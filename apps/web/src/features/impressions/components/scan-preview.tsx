// The 3D preview of one scan file: three.js with its own loaders and OrbitControls (drag to
// rotate, wheel to zoom). Loaded lazily (React.lazy) so three stays out of the main bundle.
import { Callout, Spinner } from '@blueprintjs/core';
import type { ScanFile } from '@torquetrail/contracts';
import { useEffect, useRef, useState } from 'react';
import {
  AmbientLight,
  Box3,
  DirectionalLight,
  Mesh,
  MeshStandardMaterial,
  PerspectiveCamera,
  Scene,
  Vector3,
  WebGLRenderer,
} from 'three';
import { OrbitControls } from 'three/examples/jsm/controls/OrbitControls.js';
import { fetchScanFile } from '../api/impressions-api';
import { meshGeometry } from './mesh-geometry';

const SIZE = { width: 480, height: 360 };

/** A scan body recorded on the impression, as the legend names it. */
export interface RecordedScanBody {
  site: string;
  part: string;
  lot: string | null;
}

export default function ScanPreview({ file, scanBodies }: { file: ScanFile; scanBodies: RecordedScanBody[] }) {
  const host = useRef<HTMLDivElement>(null);
  const [state, setState] = useState<'loading' | 'ready' | 'failed'>('loading');
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
        host.current.appendChild(renderer.domElement);
        renderer.domElement.setAttribute('aria-label', `3D preview of ${file.originalName ?? 'the scan file'}`);
        const controls = new OrbitControls(camera, renderer.domElement);
        const draw = () => renderer.render(scene, camera);
        controls.addEventListener('change', draw);
        draw();
        setState('ready');
        dispose = () => {
          controls.dispose();
          geometry.dispose();
          renderer.dispose();
          renderer.domElement.remove();
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
  return (
    <div className="scan-preview" data-testid="scan-preview" data-state={state}>
      {state === 'loading' && <Spinner size={24} aria-label="Loading the scan file" />}
      {state === 'failed' && (
        <Callout intent="danger" compact>
          The scan file could not be shown.
        </Callout>
      )}
      <div ref={host} />
      {state === 'ready' && <p className="scan-preview__hint">Drag to rotate, scroll to zoom.</p>}
      {scanBodies.length > 0 && (
        <div className="scan-preview__legend" data-testid="scan-preview-legend">
          <strong>Scan bodies in this impression</strong>
          <ul>
            {scanBodies.map((b) => (
              <li key={b.site}>
                {b.site}: {b.part}
                {b.lot ? ` · lot ${b.lot}` : ''}
              </li>
            ))}
          </ul>
          {/* Said plainly: a mesh file carries no part names, so nothing in it is located or coloured. */}
          <p className="scan-preview__note">
            As recorded with the impression. The file itself does not say where each scan body is, so the preview does
            not mark them on the surface.
          </p>
        </div>
      )}
    </div>
  );
}
