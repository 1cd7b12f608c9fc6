// The Blueprint icon names this app accepts: stands in for `@blueprintjs/icons`' own iconNames
// module in the build (`REPLACED_MODULES` in vite.config.ts). Blueprint's module
// builds a map of all ~700 names from an enum of every name (about 9 kB gzip, with change-case);
// its icon loader reads the map only to refuse unknown names, and it sat in the first load of every
// page. Here only the names the app draws: every icon-name string in apps/web/src, and the few
// Blueprint's own components draw by name. `icon-names-accepted.test.ts` keeps the list exact (no
// missing, no unused name) and icon-loader.ts's two glob patterns equal to it.

/** The accepted names, sorted. A name outside it draws nothing in the build ("Unknown icon"). */
export const ICON_NAMES_ACCEPTED = [
  'add',
  'archive',
  'arrow-down',
  'arrow-up',
  'at',
  'calendar',
  'caret-down',
  'caret-up',
  'changes',
  'chevron-down',
  'chevron-left',
  'chevron-right',
  'chevron-up',
  'circle',
  'clipboard',
  'code',
  'control',
  'cross',
  'cube',
  'cube-add',
  'disable',
  'document',
  'double-caret-vertical',
  'download',
  'duplicate',
  'edit',
  'endorsed',
  'envelope',
  'error',
  'exchange',
  'export',
  'filter',
  'floppy-disk',
  'function',
  'history',
  'id-number',
  'import',
  'inbox',
  'info-sign',
  'label',
  'layers',
  'link',
  'list',
  'lock',
  'log-out',
  'map-marker',
  'media',
  'people',
  'phone',
  'pin',
  'play',
  'pulse',
  'refresh',
  'search',
  'search-template',
  'server',
  'settings',
  'share',
  'sort',
  'square',
  'th',
  'tick',
  'tick-circle',
  'time',
  'timeline-events',
  'timeline-line-chart',
  'unarchive',
  'warning-sign',
  'wrench',
  'zoom-in',
  'zoom-out',
  'zoom-to-fit',
] as const;

/** Names Blueprint's own components (core, datetime) draw by name, not as an icon component. */
export const ICON_NAMES_BLUEPRINT_DRAWS = ['chevron-down', 'chevron-left', 'chevron-up', 'square'] as const;

const pascal = (name: string): string => name.replace(/(?:^|-)([a-z0-9])/g, (_, c: string) => c.toUpperCase());
const legacy = (name: string): string => name.toUpperCase().replaceAll('-', '_');

/** Blueprint's `IconNames` for the accepted names: both its key styles (`ChevronUp`, `CHEVRON_UP`). */
export const IconNames: Readonly<Record<string, string>> = Object.fromEntries(
  ICON_NAMES_ACCEPTED.flatMap((name) => [
    [pascal(name), name],
    [legacy(name), name],
  ]),
);

/** What Blueprint's `Icons.isValidIconName` looks names up in. */
export const IconNamesSet: ReadonlySet<string> = new Set<string>(ICON_NAMES_ACCEPTED);
