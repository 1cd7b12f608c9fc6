// The pure parts of marking scan bodies on a scan file's mesh: a click on the canvas as a ray
// (three's Raycaster) to a point in the mesh's own coordinates (the file's, as stored), the camera
// turned to face a pin, and the markers changed in the preview against the saved ones. Kept apart
// from the canvas so each can be tested without a browser.
import type { MarkerPoint } from '@torquetrail/contracts';
import { type Camera, type Object3D, Raycaster, Vector2, Vector3 } from 'three';

/** A pointer position as three's normalised device coordinates (−1…1, y up) within the canvas. */
export function pointerToNdc(
  clientX: number,
  clientY: number,
  rect: { left: number; top: number; width: number; height: number },
): Vector2 {
  return new Vector2(((clientX - rect.left) / rect.width) * 2 - 1, -((clientY - rect.top) / rect.height) * 2 + 1);
}

/** A press and release this close together is a click (a placement), not a drag that rotates the view. */
export const isClick = (down: { x: number; y: number }, up: { x: number; y: number }, tolerancePx = 4) =>
  Math.hypot(up.x - down.x, up.y - down.y) <= tolerancePx;

/**
 * The nearest point of the mesh under the pointer, in the mesh's local coordinates (the file's own:
 * the preview moves the mesh to the centre of the view, the stored point must not move with it).
 * Only the mesh itself is hit, never the pins hung on it. Null when the ray misses.
 */
export function pickPoint(mesh: Object3D, camera: Camera, ndc: Vector2): MarkerPoint | null {
  const ray = new Raycaster();
  ray.setFromCamera(ndc, camera);
  const [hit] = ray.intersectObject(mesh, false);
  if (!hit) return null;
  const local = mesh.worldToLocal(hit.point.clone());
  return { x: local.x, y: local.y, z: local.z };
}

/**
 * Where the camera goes to face a pin: on the line from the orbit's target through the pin, at the
 * camera's present distance, so the pin comes to the front of the view. Null when the pin is at the
 * target itself (any direction would do; the view is left as it is).
 */
export function cameraFacing(target: Vector3, pinWorld: Vector3, distance: number): Vector3 | null {
  const direction = pinWorld.clone().sub(target);
  if (direction.lengthSq() < 1e-12) return null;
  return target.clone().add(direction.normalize().multiplyScalar(distance));
}

const samePoint = (a: MarkerPoint, b: MarkerPoint) => a.x === b.x && a.y === b.y && a.z === b.z;

/** The markers as the preview shows them: saved ones, with the edits not saved yet laid over them. */
export function shownMarkers(
  saved: ReadonlyMap<string, MarkerPoint>,
  edits: ReadonlyMap<string, MarkerPoint | null>,
): Map<string, MarkerPoint> {
  const shown = new Map(saved);
  for (const [siteId, point] of edits) {
    if (point) shown.set(siteId, point);
    else shown.delete(siteId);
  }
  return shown;
}

/** What saving sends: one body per site whose marker was really placed, moved or cleared. */
export function markerChanges(
  saved: ReadonlyMap<string, MarkerPoint>,
  edits: ReadonlyMap<string, MarkerPoint | null>,
): { siteId: string; point: MarkerPoint | null }[] {
  const changes: { siteId: string; point: MarkerPoint | null }[] = [];
  for (const [siteId, point] of edits) {
    const before = saved.get(siteId);
    if (point === null ? before !== undefined : !before || !samePoint(before, point)) changes.push({ siteId, point });
  }
  return changes;
}
