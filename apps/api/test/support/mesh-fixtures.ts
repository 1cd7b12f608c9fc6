// Small meshes written in the test (a tetrahedron, invented), in each format the scan-file upload
// reads: ASCII and binary STL, ASCII PLY and OBJ. `scale` makes each call's bytes differ.
type V = [number, number, number];
const tetra = (scale: number): { vertices: V[]; faces: [number, number, number][] } => ({
  vertices: [
    [0, 0, 0],
    [scale, 0, 0],
    [0, scale, 0],
    [0, 0, scale],
  ],
  faces: [
    [0, 2, 1],
    [0, 1, 3],
    [0, 3, 2],
    [1, 2, 3],
  ],
});

export function asciiStl(scale = 1): Buffer {
  const { vertices, faces } = tetra(scale);
  const facets = faces.map(
    (f) =>
      `facet normal 0 0 0\n outer loop\n${f.map((i) => `  vertex ${vertices[i].join(' ')}\n`).join('')} endloop\nendfacet\n`,
  );
  return Buffer.from(`solid tetra\n${facets.join('')}endsolid tetra\n`);
}

export function binaryStl(scale = 1): Buffer {
  const { vertices, faces } = tetra(scale);
  const b = Buffer.alloc(84 + 50 * faces.length);
  b.write('binary tetra', 0, 'latin1');
  b.writeUInt32LE(faces.length, 80);
  faces.forEach((f, n) => {
    const at = 84 + 50 * n;
    f.forEach((i, k) => vertices[i].forEach((c, j) => b.writeFloatLE(c, at + 12 + 12 * k + 4 * j)));
  });
  return b;
}

export function asciiPly(scale = 1): Buffer {
  const { vertices, faces } = tetra(scale);
  return Buffer.from(
    [
      'ply',
      'format ascii 1.0',
      `element vertex ${vertices.length}`,
      'property float x',
      'property float y',
      'property float z',
      `element face ${faces.length}`,
      'property list uchar int vertex_indices',
      'end_header',
      ...vertices.map((v) => v.join(' ')),
      ...faces.map((f) => `3 ${f.join(' ')}`),
      '',
    ].join('\n'),
  );
}

export function objText(scale = 1): Buffer {
  const { vertices, faces } = tetra(scale);
  return Buffer.from(
    [
      '# tetra',
      ...vertices.map((v) => `v ${v.join(' ')}`),
      ...faces.map((f) => `f ${f.map((i) => i + 1).join(' ')}`),
      '',
    ].join('\n'),
  );
}
