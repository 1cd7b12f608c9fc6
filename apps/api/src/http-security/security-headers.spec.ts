// The page's inline scripts are allowed by hash (CSP Level 2: sha256 of the script's text, exactly
// as served, base64). A script that changes by one character is no longer allowed.
import { describe, expect, it } from 'vitest';
import { inlineScriptSources } from './security-headers.js';

describe('inlineScriptSources', () => {
  it("hashes each inline script's text as CSP expects it", () => {
    // sha256("alert(1)"), base64: a fixed vector, not recomputed here.
    expect(inlineScriptSources('<head><script>alert(1)</script></head>')).toEqual([
      "'sha256-bhHHL3z2vDgxUt0W3dWQOrprscmda2Y5pLsLg4GF+pI='",
    ]);
  });

  it('differs when the script differs by one character', () => {
    const [one] = inlineScriptSources('<script>alert(1)</script>');
    const [two] = inlineScriptSources('<script>alert(2)</script>');
    expect(one).not.toBe(two);
  });

  it('leaves out scripts loaded from a file, and finds every inline one', () => {
    const html =
      '<script type="module" crossorigin src="/assets/index.js"></script>' +
      '<script>first()</script><p>text</p><script type="text/javascript">\nsecond()\n</script>';
    expect(inlineScriptSources(html)).toHaveLength(2);
    expect(inlineScriptSources('<html><head></head></html>')).toEqual([]);
  });
});
