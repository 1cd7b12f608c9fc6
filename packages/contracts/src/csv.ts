// CSV for every download (Recall desk, audit trail, the import report): RFC 4180, safe to open in a
// spreadsheet. One helper for the API and the web, so no writer forgets the formula defusing.

/** RFC 4180 field quoting; a leading = + - @ is prefixed with ' so spreadsheets do not run it as a formula. */
export function csvField(value: string | number | null | undefined): string {
  if (value === null || value === undefined) return '';
  let text = String(value);
  if (/^[=+\-@\t\r]/.test(text) && typeof value === 'string') text = `'${text}`;
  return /[",\r\n]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
}

export function csvLine(fields: (string | number | null | undefined)[]): string {
  return `${fields.map(csvField).join(',')}\r\n`;
}
