import { describe, expect, it } from 'vitest';
import { pdfFilename } from './pdf-filename.js';

describe('pdfFilename', () => {
  it('keeps an ordinary chart number', () => {
    expect(pdfFilename('LL-1001')).toBe('lab-prescription-LL-1001.pdf');
  });
  it('neutralises quotes, line breaks and path characters that could break the header or the attachment', () => {
    expect(pdfFilename('x"; filename="evil.exe\r\nX-Injected: 1/../')).toBe(
      'lab-prescription-x_filename_evil_exe_X-Injected_1_.pdf',
    );
  });
});
