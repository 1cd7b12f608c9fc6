// The web declares `"sideEffects": ["*.css"]` (package.json), so the bundler may skip a module whose
// exports are only passed through: a re-export barrel (a feature's index.ts). A stylesheet imported
// there is then dropped from the build, and the screens it styles show unstyled (the torque panel
// and the Timeline did). A stylesheet is imported by the component that uses its classes.
import { describe, expect, it } from 'vitest';

// Vite reads the sources as text (the web's type-check has no Node types).
const sources: Record<string, string> = import.meta.glob(['../**/*.{ts,tsx}', '!../**/*.test.{ts,tsx}'], {
  query: '?raw',
  import: 'default',
  eager: true,
});

const CSS_IMPORT = /^import\s+['"][^'"]+\.css['"];?\s*$/m;

/** The module's code once comments, imports and re-exports (`export … from '…'`) are taken out. */
function ownCode(text: string): string {
  return text
    .replace(/\/\*[\s\S]*?\*\//g, '')
    .replace(/^\s*\/\/.*$/gm, '')
    .replace(/^\s*import\s[\s\S]*?['"][^'"]+['"];?\s*$/gm, '')
    .replace(/^\s*export\s+(type\s+)?(\*|\{[\s\S]*?\})(\s+as\s+\w+)?\s+from\s+['"][^'"]+['"];?\s*$/gm, '')
    .trim();
}

describe('stylesheets are imported where they are used', () => {
  it('tells a barrel from a component (the check itself works)', () => {
    const barrel = "// The feature.\nimport './x.css';\nexport { A } from './a';\nexport type { B } from './b';\n";
    expect(CSS_IMPORT.test(barrel)).toBe(true);
    expect(ownCode(barrel)).toBe('');
    expect(ownCode("import './x.css';\nexport function A() {\n  return null;\n}\n")).not.toBe('');
    expect(Object.keys(sources).length).toBeGreaterThan(100);
  });

  it('no module that only passes exports through imports a stylesheet', () => {
    const barrels = Object.entries(sources)
      .filter(([, text]) => CSS_IMPORT.test(text) && ownCode(text) === '')
      .map(([file]) => file);
    expect(barrels).toEqual([]);
  });
});
