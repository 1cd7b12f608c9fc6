// The seed's radiograph files: the minimal DICOM writer is read back by the API's parser and by
// dcmjs, an independent PS3.10 implementation; the drawing puts the bone crest where the seeded
// bone level says, so the image and its measurement agree.
import dcmjs from 'dcmjs';
import { describe, expect, it } from 'vitest';
import { dicomAttributes, parseDicom } from '../radiographs/dicom.js';
import { detectFileType } from '../radiographs/file-type.js';
import { DEMO_MM_PER_PX, dicomOf, drawRadiograph, implantGeometry } from './demo-radiograph-files.js';

const implants = [
  { lengthMm: 10, mesialMm: 1.2, distalMm: 0.8 },
  { lengthMm: 11.5, mesialMm: 3.4, distalMm: null },
];

describe('the seed’s DICOM writer', () => {
  const image = drawRadiograph(implants, 7);
  const file = dicomOf(image, { studyDate: '2023-05-16', seriesNumber: 3, name: 'spec' });

  it('writes Part 10 that the API reads: type by bytes, attributes measurement needs', () => {
    expect(detectFileType(file)).toEqual({ type: 'dicom', dicomPreamble: true });
    expect(dicomAttributes(parseDicom(file, true))).toEqual({
      transferSyntaxUid: '1.2.840.10008.1.2.1',
      rows: image.height,
      columns: image.width,
      pixelSpacing: [DEMO_MM_PER_PX, DEMO_MM_PER_PX],
      imagerPixelSpacing: null,
      magnificationFactor: null,
      studyDate: '2023-05-16',
      modality: 'IO',
      bitsStored: 12,
      photometricInterpretation: 'MONOCHROME2',
    });
  });

  it('is read the same by dcmjs, pixel values included', () => {
    const buffer = file.buffer.slice(file.byteOffset, file.byteOffset + file.byteLength);
    const dict = dcmjs.data.DicomMessage.readFile(buffer);
    const ds = dcmjs.data.DicomMetaDictionary.naturalizeDataset(dict.dict);
    expect([ds.Rows, ds.Columns, ds.BitsAllocated, ds.StudyDate, ds.SeriesNumber]).toEqual([
      image.height,
      image.width,
      16,
      '20230516',
      3,
    ]);
    expect(ds.PixelSpacing.map(Number)).toEqual([0.1, 0.1]);
    const pixels = new Uint16Array(ds.PixelData[0]);
    for (const i of [0, 1234, image.pixels.length - 1]) expect(pixels[i]).toBe(image.pixels[i]);
  });
});

describe('the drawing', () => {
  const image = drawRadiograph(implants, 7);
  /** Mean grey of a 6-px run of one row, to look through the noise. */
  const mean = (row: number, col: number) => {
    let sum = 0;
    for (let c = col; c < col + 6; c++) sum += image.pixels[Math.round(row) * image.width + c];
    return sum / 6;
  };

  it('puts the bone crest at the bone level below the platform, each side, and the implant brightest', () => {
    const g = implantGeometry(0, 10);
    const crestMesial = g.platformRow + 1.2 / DEMO_MM_PER_PX;
    const crestDistal = g.platformRow + 0.8 / DEMO_MM_PER_PX;
    expect(mean(crestMesial - 3, g.left - 10)).toBeLessThan(1000); // soft tissue above the crest
    expect(mean(crestMesial + 3, g.left - 10)).toBeGreaterThan(1400); // bone below it
    expect(mean(crestDistal - 3, g.right + 4)).toBeLessThan(1000);
    expect(mean(crestDistal + 3, g.right + 4)).toBeGreaterThan(1400);
    expect(mean(g.platformRow + 30, g.centre - 3)).toBeGreaterThan(3000);
    expect(image.height).toBe(implantGeometry(1, 11.5).apexRow + 40);
  });
});
