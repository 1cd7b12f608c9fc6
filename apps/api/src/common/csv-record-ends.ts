// PostgreSQL's COPY … (FORMAT csv) ends each record with a bare LF; the product's CSV files end
// them with CRLF (RFC 4180, csvLine in @torquetrail/contracts), and the files of both writers must
// be the same bytes. A line break inside a quoted cell is the cell's own text and stays as it is.

const QUOTE = 0x22;
const LF = 0x0a;
const CRLF = Buffer.from('\r\n');

/**
 * The chunks of a CSV written by COPY with each record's LF made CRLF. Chunks may cut a record (or
 * a quoted cell) anywhere: whether the next byte is inside quotes is carried from chunk to chunk.
 * A doubled quote inside a cell turns the state twice, so it needs no case of its own. No byte of
 * a multi-byte UTF-8 character is `"` or LF, so the bytes are scanned as they come.
 */
export async function* crlfRecords(chunks: AsyncIterable<Buffer>): AsyncGenerator<Buffer, void> {
  let quoted = false;
  for await (const chunk of chunks) {
    const parts: Buffer[] = [];
    let from = 0;
    for (let at = 0; at < chunk.length; at += 1) {
      const byte = chunk[at];
      if (byte === QUOTE) quoted = !quoted;
      else if (byte === LF && !quoted) {
        parts.push(chunk.subarray(from, at), CRLF);
        from = at + 1;
      }
    }
    parts.push(chunk.subarray(from));
    yield parts.length === 1 ? chunk : Buffer.concat(parts);
  }
}
