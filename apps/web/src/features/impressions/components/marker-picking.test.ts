// Marking scan bodies on the mesh: the click read as a ray by three's own Raycaster against a real
// BufferGeometry (no browser needed), the point kept in the file's coordinates, the camera turned
// to a pin, and only real changes sent.
import { BoxGeometry, Mesh, MeshBasicMaterial, PerspectiveCamera, Vector2, Vector3 } from 'three';
import { describe, expect, it } from 'vitest';
import { cameraFacing, isClick, markerChanges, pickPoint, pointerToNdc, shownMarkers } from './marker-picking';

/** A 2 × 2 × 2 box standing with its top at z = 16 (as a scan body's top in the demo file), centred in view. */
function scene() {
  const geometry = new BoxGeometry(2, 2, 2);
  geometry.translate(4.5, 0, 15);
  const mesh = new Mesh(geometry, new MeshBasicMaterial());
  // The preview moves the mesh so its centre is at the origin.
  mesh.position.set(-4.5, 0, -15);
  mesh.updateMatrixWorld(true);
  const camera = new PerspectiveCamera(40, 480 / 360, 0.1, 1000);
  camera.position.set(0, 0, 30);
  camera.lookAt(0, 0, 0);
  camera.updateMatrixWorld(true);
  return { mesh, camera };
}
const rect = { left: 100, top: 50, width: 480, height: 360 };

describe('picking a point on the mesh', () => {
  it('reads the canvas centre as the ray straight ahead, and the corners as ±1', () => {
    expect(pointerToNdc(340, 230, rect).toArray()).toEqual([0, 0]);
    expect(pointerToNdc(100, 50, rect).toArray()).toEqual([-1, 1]);
    expect(pointerToNdc(580, 410, rect).toArray()).toEqual([1, -1]);
  });

  it('a click at the centre hits the top of the box, given in the file coordinates, not the view', () => {
    const { mesh, camera } = scene();
    const point = pickPoint(mesh, camera, new Vector2(0, 0));
    expect(point).not.toBeNull();
    expect(point!.x).toBeCloseTo(4.5, 6);
    expect(point!.y).toBeCloseTo(0, 6);
    expect(point!.z).toBeCloseTo(16, 6);
  });

  it('a click beside the mesh picks nothing', () => {
    const { mesh, camera } = scene();
    expect(pickPoint(mesh, camera, new Vector2(0.9, 0.9))).toBeNull();
  });

  it('ignores the pins hung on the mesh: only the mesh surface is hit', () => {
    const { mesh, camera } = scene();
    const pin = new Mesh(new BoxGeometry(1, 1, 1), new MeshBasicMaterial());
    pin.position.set(4.5, 0, 25);
    mesh.add(pin);
    mesh.updateMatrixWorld(true);
    expect(pickPoint(mesh, camera, new Vector2(0, 0))!.z).toBeCloseTo(16, 6);
  });

  it('tells a click from a drag that rotates the view', () => {
    expect(isClick({ x: 10, y: 10 }, { x: 13, y: 12 })).toBe(true);
    expect(isClick({ x: 10, y: 10 }, { x: 30, y: 10 })).toBe(false);
  });
});

describe('turning the camera to a pin', () => {
  it('puts the camera on the line from the target through the pin, at the same distance', () => {
    const at = cameraFacing(new Vector3(0, 0, 0), new Vector3(3, 0, 4), 20)!;
    [12, 0, 16].forEach((v, i) => expect(at.toArray()[i]).toBeCloseTo(v, 9));
    expect(cameraFacing(new Vector3(1, 1, 1), new Vector3(1, 1, 1), 20)).toBeNull();
  });
});

describe('markers changed in the preview', () => {
  const a = { x: 1, y: 2, z: 3 };
  const b = { x: 4, y: 5, z: 6 };
  const saved = new Map([['s15', a]]);

  it('sends a placement, a move and a clear, and nothing for an edit back to the saved point', () => {
    expect(markerChanges(saved, new Map([['s16', b]]))).toEqual([{ siteId: 's16', point: b }]);
    expect(markerChanges(saved, new Map([['s15', b]]))).toEqual([{ siteId: 's15', point: b }]);
    expect(markerChanges(saved, new Map([['s15', null]]))).toEqual([{ siteId: 's15', point: null }]);
    expect(markerChanges(saved, new Map([['s15', { ...a }]]))).toEqual([]);
    // Clearing a marker never saved is no change.
    expect(markerChanges(saved, new Map([['s16', null]]))).toEqual([]);
  });

  it('shows the saved markers with the edits laid over them', () => {
    const shown = shownMarkers(
      saved,
      new Map<string, typeof a | null>([
        ['s15', null],
        ['s16', b],
      ]),
    );
    expect([...shown]).toEqual([['s16', b]]);
  });
});
