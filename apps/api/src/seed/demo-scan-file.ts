// A small scan file drawn by code at seed time (invented geometry, no patient's scan): a stretch
// of alveolar ridge as a rounded block with two hexagonal scan bodies standing on it, written as
// a binary STL (80-byte header, triangle count, 50 bytes per triangle).
type P = [number, number, number];

function prism(cx: number, cy: number, z0: number, z1: number, radius: number, sides: number): P[][] {
  const ring = (z: number) =>
    Array.from({ length: sides }, (_, i): P => {
      const a = (2 * Math.PI * i) / sides;
      return [cx + radius * Math.cos(a), cy + radius * Math.sin(a), z];
    });
  const lo = ring(z0);
  const hi = ring(z1);
  const tris: P[][] = [];
  for (let i = 0; i < sides; i++) {
    const j = (i + 1) % sides;
    tris.push([lo[i], lo[j], hi[j]], [lo[i], hi[j], hi[i]]);
    tris.push([[cx, cy, z1], hi[i], hi[j]], [[cx, cy, z0], lo[j], lo[i]]);
  }
  return tris;
}

/**
 * The centre of the top face of each scan body, by site, in the file's coordinates: 16 (the more
 * distal, towards the patient's right) stands at negative x, 15 at positive x.
 */
export const DEMO_SCAN_BODY_TOPS = { 16: [-4.5, 0, 16], 15: [4.5, 0, 16] } as const;

/** The ridge (a 24-sided prism stretched along x) and scan bodies over the two implant positions. */
export function demoScanTriangles(): P[][] {
  const ridge = prism(0, 0, 0, 6, 5, 24).map((t) => t.map(([x, y, z]): P => [x * 2.2, y, z]));
  const body = ([x, y, z]: readonly [number, number, number]) => prism(x, y, 6, z, 2, 6);
  return [...ridge, ...body(DEMO_SCAN_BODY_TOPS[16]), ...body(DEMO_SCAN_BODY_TOPS[15])];
}

export function binaryStl(triangles: P[][], header: string): Buffer {
  const b = Buffer.alloc(84 + 50 * triangles.length);
  b.write(header.slice(0, 80), 0, 'latin1');
  b.writeUInt32LE(triangles.length, 80);
  triangles.forEach((t, n) => {
    const at = 84 + 50 * n;
    t.forEach((p, k) => p.forEach((c, j) => b.writeFloatLE(c, at + 12 + 12 * k + 4 * j)));
  });
  return b;
}
