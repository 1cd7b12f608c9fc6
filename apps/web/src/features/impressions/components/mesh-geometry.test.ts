// Scan files made here and read back by three's own loaders (an independent reader): STL in ASCII
// and binary, PLY in ASCII and binary little-endian. A two-triangle square (invented geometry).
import { describe, expect, it } from 'vitest';
import { meshGeometry, vertexCount } from './mesh-geometry';

const vertices = [
  [0, 0, 0],
  [10, 0, 0],
  [10, 10, 0],
  [0, 10, 0],
];
const faces = [
  [0, 1, 2],
  [0, 2, 3],
];
const bytes = (s: string) => new TextEncoder().encode(s).buffer;

function asciiStl(): ArrayBuffer {
  const facets = faces
    .map(
      (f) =>
        `facet normal 0 0 1\nouter loop\n${f.map((i) => `vertex ${vertices[i].join(' ')}\n`).join('')}endloop\nendfacet\n`,
    )
    .join('');
  return bytes(`solid square\n${facets}endsolid square\n`);
}

function binaryStl(): ArrayBuffer {
  const b = new ArrayBuffer(84 + 50 * faces.length);
  const v = new DataView(b);
  v.setUint32(80, faces.length, true);
  faces.forEach((f, n) => {
    const at = 84 + 50 * n;
    v.setFloat32(at + 8, 1, true); // normal (0, 0, 1)
    f.forEach((i, k) => vertices[i].forEach((c, j) => v.setFloat32(at + 12 + 12 * k + 4 * j, c, true)));
  });
  return b;
}

const plyHeader = (format: string) =>
  `ply\nformat ${format} 1.0\nelement vertex ${vertices.length}\nproperty float x\nproperty float y\nproperty float z\nelement face ${faces.length}\nproperty list uchar int vertex_indices\nend_header\n`;

function asciiPly(): ArrayBuffer {
  return bytes(
    plyHeader('ascii') +
      vertices.map((p) => p.join(' ')).join('\n') +
      '\n' +
      faces.map((f) => `3 ${f.join(' ')}`).join('\n') +
      '\n',
  );
}

function binaryPly(): ArrayBuffer {
  const header = new TextEncoder().encode(plyHeader('binary_little_endian'));
  const body = new ArrayBuffer(vertices.length * 12 + faces.length * 13);
  const v = new DataView(body);
  vertices.forEach((p, n) => p.forEach((c, j) => v.setFloat32(n * 12 + j * 4, c, true)));
  faces.forEach((f, n) => {
    const at = vertices.length * 12 + n * 13;
    v.setUint8(at, 3);
    f.forEach((i, k) => v.setInt32(at + 1 + 4 * k, i, true));
  });
  const all = new Uint8Array(header.length + body.byteLength);
  all.set(header);
  all.set(new Uint8Array(body), header.length);
  return all.buffer;
}

describe("scan files read by three's loaders", () => {
  it('an ASCII STL gives three vertices per triangle', () => {
    expect(vertexCount(meshGeometry('stl', asciiStl()))).toBe(6);
  });
  it('a binary STL gives the same vertices, at the same places', () => {
    const g = meshGeometry('stl', binaryStl());
    expect(vertexCount(g)).toBe(6);
    expect(Array.from(g.getAttribute('position').array)).toEqual(faces.flatMap((f) => f.flatMap((i) => vertices[i])));
  });
  it('an ASCII PLY keeps its four shared vertices and two faces', () => {
    const g = meshGeometry('ply', asciiPly());
    expect(vertexCount(g)).toBe(4);
    expect(g.getIndex()?.count).toBe(6);
  });
  it('a binary little-endian PLY reads the same', () => {
    const g = meshGeometry('ply', binaryPly());
    expect(vertexCount(g)).toBe(4);
    expect(Array.from(g.getAttribute('position').array)).toEqual(vertices.flat());
  });
  it('an OBJ gives its triangles', () => {
    const obj = `${vertices.map((p) => `v ${p.join(' ')}`).join('\n')}\n${faces.map((f) => `f ${f.map((i) => i + 1).join(' ')}`).join('\n')}\n`;
    expect(vertexCount(meshGeometry('obj', bytes(obj)))).toBe(6);
  });
});
