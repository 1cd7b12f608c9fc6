// The build accepts only ICON_NAMES_ACCEPTED as Blueprint icon names (vite.config.ts), so a name
// the app draws but the list lacks would draw nothing, and only in the build. This keeps the list
// equal to the icon-name strings of the web's sources plus those Blueprint's own components draw,
// and icon-loader.ts's glob patterns equal to the list.
import { IconNames as BlueprintIconNames } from '@blueprintjs/icons';
import { describe, expect, it } from 'vitest';
import { ICON_NAMES_ACCEPTED, ICON_NAMES_BLUEPRINT_DRAWS, IconNames, IconNamesSet } from './icon-names-accepted';

// Vite reads the sources as text (the web's type-check has no Node types).
const sources: Record<string, string> = import.meta.glob(['../**/*.{ts,tsx}', '!../**/*.test.{ts,tsx}'], {
  query: '?raw',
  import: 'default',
  eager: true,
});
const blueprintSources: Record<string, string> = import.meta.glob(
  [
    '../../../../node_modules/@blueprintjs/core/lib/esm/**/*.js',
    '../../../../node_modules/@blueprintjs/datetime/lib/esm/**/*.js',
  ],
  { query: '?raw', import: 'default', eager: true },
);

/** Every Blueprint icon name (the real, full list: the test runs without the build's plugin). */
const ALL = new Set<string>(Object.values(BlueprintIconNames));

/** Every quoted string of a text that is a Blueprint icon name. */
const iconStrings = (text: string): string[] =>
  [...text.matchAll(/['"]([a-z0-9-]+)['"]/g)].map((m) => m[1] ?? '').filter((name) => ALL.has(name));

/** Names Blueprint's components draw by name: `Icon, { … icon: "x" … }`, `icon: a ? "x" : "y"`, `IconNames.X`. */
const drawnByBlueprint = (text: string): string[] => [
  ...[...text.matchAll(/Icon, \{[^}]*\}|icon: [^,}]*/g)].flatMap((m) => iconStrings(m[0])),
  ...[...text.matchAll(/IconNames\.([A-Z0-9_]+)/g)].map(
    (m) => BlueprintIconNames[m[1] as keyof typeof BlueprintIconNames],
  ),
];

/** The names between the braces of an `import.meta.glob('./{a,b}.js', …)` pattern. */
const globNames = (text: string): string[][] =>
  [...text.matchAll(/import\.meta\.glob<IconPaths>\(\s*'\.\/\{([^}]*)\}\.js'/g)].map((m) => (m[1] ?? '').split(','));

describe('the icon names the build accepts', () => {
  // The list's own module is left out: its strings are what is checked.
  const web = [
    ...new Set(
      Object.entries(sources)
        .filter(([file]) => file !== './icon-names-accepted.ts')
        .flatMap(([, text]) => iconStrings(text)),
    ),
  ].sort();
  const blueprint = [...new Set(Object.values(blueprintSources).flatMap(drawnByBlueprint))].sort();

  it('finds icon names in the sources (the scans themselves work)', () => {
    expect(iconStrings(`<Button icon="floppy-disk" /> const x = 'not-an-icon';`)).toEqual(['floppy-disk']);
    expect(drawnByBlueprint('_jsx(Icon, { icon: up ? "chevron-up" : "chevron-down" }) IconNames.SQUARE')).toEqual([
      'chevron-up',
      'chevron-down',
      'square',
    ]);
    expect(web).toContain('log-out');
    expect(Object.keys(blueprintSources).length).toBeGreaterThan(100);
  });

  it('holds every name the web and Blueprint draw, and no other', () => {
    expect([...ICON_NAMES_ACCEPTED]).toEqual([...new Set([...web, ...blueprint])].sort());
    expect([...ICON_NAMES_BLUEPRINT_DRAWS]).toEqual(blueprint);
  });

  it('names only real Blueprint icons, as Blueprint keys them', () => {
    expect(ICON_NAMES_ACCEPTED.filter((name) => !ALL.has(name))).toEqual([]);
    for (const [key, name] of Object.entries(IconNames)) {
      expect(BlueprintIconNames[key as keyof typeof BlueprintIconNames]).toBe(name);
    }
    expect([...IconNamesSet].sort()).toEqual([...ICON_NAMES_ACCEPTED]);
  });

  it('is what icon-loader.ts loads, in both sizes', () => {
    const loaders = `${sources['./icon-loader.ts'] ?? ''}\n${sources['./icon-paths-20.ts'] ?? ''}`;
    expect(globNames(loaders)).toEqual([[...ICON_NAMES_ACCEPTED], [...ICON_NAMES_ACCEPTED]]);
  });
});
