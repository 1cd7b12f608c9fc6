// Blueprint's icons, loaded one by one as a screen first shows them. Blueprint's default loader
// fetches the paths of every icon of a size at once (about 100 KB gzip) on the first icon of any
// page. The icons Torquetrail accepts (icon-names-accepted.ts: every icon-name string in
// apps/web/src, and the few Blueprint draws itself) are each a chunk of their own here, a few
// hundred bytes, so a page loads only the icons it draws. The build accepts no other name
// (vite.config.ts), so there is nothing to fall back on; in `vite` (dev) an unlisted name fails
// to load here, which shows it before a build would.
import { type IconName, type IconPaths, Icons, IconSize } from '@blueprintjs/icons';

type PathsModules = Record<string, () => Promise<IconPaths>>;

// One pattern per size: import.meta.glob takes literals only. Both equal ICON_NAMES_ACCEPTED
// (icon-names-accepted.test.ts checks). The patterns are relative to `base`, so the keys the first
// load carries are short (`./add.js`). The 20 px map (large icons: empty states, dialogs) is a
// chunk of its own, icon-paths-20.ts, fetched with the first large icon: a first view draws 16 px ones.
const paths16: PathsModules = import.meta.glob<IconPaths>(
  './{add,archive,arrow-down,arrow-up,at,calendar,caret-down,caret-up,changes,chevron-down,chevron-left,chevron-right,chevron-up,circle,clipboard,code,control,cross,cube,cube-add,disable,document,double-caret-vertical,download,duplicate,edit,endorsed,envelope,error,exchange,export,filter,floppy-disk,function,history,id-number,import,inbox,info-sign,label,layers,link,list,lock,log-out,map-marker,media,people,phone,pin,play,pulse,refresh,search,search-template,server,settings,share,sort,square,th,tick,tick-circle,time,timeline-events,timeline-line-chart,unarchive,warning-sign,wrench,zoom-in,zoom-out,zoom-to-fit}.js',
  { import: 'default', base: '../../../../node_modules/@blueprintjs/icons/lib/esm/generated/16px/paths/' },
);

async function loadIconPaths(name: IconName, size: IconSize): Promise<IconPaths> {
  const paths = size === IconSize.STANDARD ? paths16 : (await import('./icon-paths-20')).paths20;
  const load = paths[`./${name}.js`];
  if (!load) throw new Error(`the icon '${name}' is not in ICON_NAMES_ACCEPTED (lib/icon-names-accepted.ts)`);
  return load();
}

/** Makes Blueprint load each named icon's paths on its own (call once, before the first render). */
export function loadIconsOneByOne(): void {
  Icons.setLoaderOptions({ loader: loadIconPaths });
}
