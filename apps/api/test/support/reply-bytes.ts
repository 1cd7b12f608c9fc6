// Supertest keeps only text and JSON bodies by default; files (PDFs, images, scans, exports) are
// read as bytes with `.buffer(true).parse(replyBytes)`, so `res.body` is the Buffer the API sent.
type Chunks = {
  on(event: 'data', listener: (chunk: Buffer) => void): unknown;
  on(event: 'end', listener: () => void): unknown;
};

export function replyBytes(res: Chunks, done: (error: Error | null, body: Buffer) => void): void {
  const chunks: Buffer[] = [];
  res.on('data', (chunk: Buffer) => chunks.push(chunk));
  res.on('end', () => done(null, Buffer.concat(chunks)));
}
