// Scan files are typed by their bytes, never their name: the four mesh formats, and the 415's words
// for what is not a mesh.
import { describe, expect, it } from 'vitest';
import { asciiPly, asciiStl, binaryStl, objText } from '../../test/support/mesh-fixtures.js';
import { detectMesh } from './mesh-type.js';

describe('detectMesh', () => {
  it('reads ASCII STL, PLY and OBJ as text formats', () => {
    expect(detectMesh(asciiStl())).toEqual({ type: 'stl' });
    expect(detectMesh(asciiPly())).toEqual({ type: 'ply' });
    expect(detectMesh(objText())).toEqual({ type: 'obj' });
  });
  it('reads a binary STL and the exact length its triangle count implies', () => {
    const stl = binaryStl();
    expect(detectMesh(stl)).toEqual({ type: 'stl', stlBinaryBytes: stl.length });
  });
  it('names a renamed image and plain text for the 415', () => {
    const png = Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0, 0, 0, 13]);
    expect(detectMesh(png)).toEqual({ type: null, described: 'a PNG image' });
    expect(detectMesh(Buffer.from('Dear lab,\nplease find the scan.\n'))).toEqual({
      type: null,
      described: 'not a mesh we can read',
    });
    expect(detectMesh(Buffer.alloc(0))).toEqual({ type: null, described: 'an empty file' });
  });
});
