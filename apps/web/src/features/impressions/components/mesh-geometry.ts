// A scan file's bytes as a three.js geometry, read by three's own loaders (STL ASCII and binary,
// PLY, OBJ). Kept apart from the canvas so the reading can be tested without a browser.
import { BufferGeometry, Mesh } from 'three';
import type { ScanFileType } from '@torquetrail/contracts';
import { OBJLoader } from 'three/examples/jsm/loaders/OBJLoader.js';
import { PLYLoader } from 'three/examples/jsm/loaders/PLYLoader.js';
import { STLLoader } from 'three/examples/jsm/loaders/STLLoader.js';

/** The geometry of the file; an OBJ's meshes are merged into one list of positions. */
export function meshGeometry(type: ScanFileType, bytes: ArrayBuffer): BufferGeometry {
  let geometry: BufferGeometry;
  switch (type) {
    case 'stl':
      geometry = new STLLoader().parse(bytes);
      break;
    case 'ply':
      geometry = new PLYLoader().parse(bytes);
      break;
    case 'obj': {
      const group = new OBJLoader().parse(new TextDecoder().decode(bytes));
      const first = group.children.find((c): c is Mesh => c instanceof Mesh);
      geometry = first ? first.geometry : new BufferGeometry();
      break;
    }
  }
  return geometry;
}

/** How many vertices the geometry draws (three's position attribute). */
export const vertexCount = (g: BufferGeometry) => g.getAttribute('position')?.count ?? 0;
