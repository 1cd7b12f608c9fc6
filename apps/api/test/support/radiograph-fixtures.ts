// Radiograph files for the API tests. DICOM files are written by dcmjs, a general-purpose DICOM
// library independent of the parser the API uses (dicom-parser), so the upload path is checked
// against a second implementation of PS3.10; PNG and JPEG are made with sharp.
import dcmjs from 'dcmjs';
import sharp from 'sharp';

const { DicomDict, DicomMetaDictionary } = dcmjs.data;

export interface DicomFixture {
  rows: number;
  columns: number;
  bits: 8 | 16;
  photometric: 'MONOCHROME1' | 'MONOCHROME2';
  /** Pixel value at (row, col). */
  pixel: (row: number, col: number) => number;
  transferSyntax?: string;
  window?: { center: number; width: number };
  pixelSpacing?: [number, number];
  imagerPixelSpacing?: [number, number];
  magnification?: number;
  studyDate?: string;
  /** Makes each file unique (the API refuses the same bytes twice for one patient). */
  seriesNumber?: number;
}

export function dicomFile(f: DicomFixture): Buffer {
  const n = f.rows * f.columns;
  const pixels = f.bits === 8 ? new Uint8Array(n) : new Uint16Array(n);
  for (let r = 0; r < f.rows; r++) for (let c = 0; c < f.columns; c++) pixels[r * f.columns + c] = f.pixel(r, c);
  const sopInstance = DicomMetaDictionary.uid();
  const meta = {
    FileMetaInformationVersion: new Uint8Array([0, 1]).buffer,
    MediaStorageSOPClassUID: '1.2.840.10008.5.1.4.1.1.1.3', // Digital Intra-Oral X-Ray Image Storage – For Presentation
    MediaStorageSOPInstanceUID: sopInstance,
    TransferSyntaxUID: f.transferSyntax ?? '1.2.840.10008.1.2.1',
    ImplementationClassUID: '2.25.318848101431744352474563950135914212',
  };
  const dataset: Record<string, unknown> = {
    SOPClassUID: meta.MediaStorageSOPClassUID,
    SOPInstanceUID: sopInstance,
    Modality: 'IO',
    SeriesNumber: f.seriesNumber ?? 1,
    Rows: f.rows,
    Columns: f.columns,
    SamplesPerPixel: 1,
    PhotometricInterpretation: f.photometric,
    BitsAllocated: f.bits,
    BitsStored: f.bits === 8 ? 8 : 12,
    HighBit: f.bits === 8 ? 7 : 11,
    PixelRepresentation: 0,
    PixelData: [pixels.buffer],
    _vrMap: { PixelData: f.bits === 8 ? 'OB' : 'OW' },
  };
  if (f.studyDate) dataset.StudyDate = f.studyDate;
  if (f.pixelSpacing) dataset.PixelSpacing = f.pixelSpacing;
  if (f.imagerPixelSpacing) dataset.ImagerPixelSpacing = f.imagerPixelSpacing;
  if (f.magnification) dataset.EstimatedRadiographicMagnificationFactor = f.magnification;
  if (f.window) {
    dataset.WindowCenter = f.window.center;
    dataset.WindowWidth = f.window.width;
  }
  const dict = new DicomDict(DicomMetaDictionary.denaturalizeDataset(meta));
  dict.dict = DicomMetaDictionary.denaturalizeDataset(dataset);
  return Buffer.from(dict.write());
}

/** A greyscale PNG whose left half is `left` and right half `right`. */
export const halvesPng = (width: number, height: number, left: number, right: number) => {
  const raw = Buffer.alloc(width * height);
  for (let r = 0; r < height; r++) for (let c = 0; c < width; c++) raw[r * width + c] = c < width / 2 ? left : right;
  return sharp(raw, { raw: { width, height, channels: 1 } })
    .png()
    .toBuffer();
};

export const jpeg = (width: number, height: number, grey: number) =>
  sharp({ create: { width, height, channels: 3, background: { r: grey, g: grey, b: grey } } })
    .jpeg()
    .toBuffer();

/** The grey value of a PNG (from the API) at (row, col). */
export async function greyAt(png: Buffer, row: number, col: number): Promise<number> {
  const { data, info } = await sharp(png).raw().toBuffer({ resolveWithObject: true });
  return data[(row * info.width + col) * info.channels];
}

interface Http {
  get: (url: string) => { set: (name: string, value: string) => PromiseLike<{ status: number; body: unknown }> };
}

/**
 * Waits until the preview job has finished with a radiograph (ready or unavailable) and returns the
 * radiograph as the API then shows it. Previews are made off the request path, by the job queue.
 */
export async function waitForPreview(http: Http, cookie: string, id: string, timeoutMs = 30_000) {
  const end = Date.now() + timeoutMs;
  for (;;) {
    const res = await http.get(`/api/radiographs/${id}`).set('Cookie', cookie);
    const body = res.body as { previewStatus?: string; previewProblem?: string | null; previewAttempts?: number };
    if (res.status !== 200) throw new Error(`radiograph ${id}: ${res.status} ${JSON.stringify(body)}`);
    if (body.previewStatus !== 'pending') return body;
    if (Date.now() > end) throw new Error(`the preview of ${id} is still pending after ${timeoutMs} ms`);
    await new Promise((r) => setTimeout(r, 200));
  }
}
