// Blueprint's icons, loaded one by one as a screen first shows them. Blueprint's default loader
// fetches the paths of every icon of a size at once (about 100 KB gzip) on the first icon of any
// page. The icons Torquetrail names (every icon-name string in apps/web/src, and a few Blueprint
// draws itself) are each a chunk of their own here, a few hundred bytes, so a page loads only the
// icons it draws. Any other icon still loads, through Blueprint's own loader (all paths of its size).
import { type IconName, type IconPaths, Icons, IconSize } from '@blueprintjs/icons';

type PathsModules = Record<string, () => Promise<IconPaths>>;

// One pattern per size: import.meta.glob takes literals only. Keep the two lists the same. The
// patterns are relative to `base`, so the keys the first load carries are short (`./add.js`).
const paths16: PathsModules = import.meta.glob<IconPaths>(
  './{add,archive,arrow-down,arrow-up,at,calendar,caret-down,caret-right,caret-up,changes,chevron-down,chevron-left,chevron-right,chevron-up,circle,clipboard,code,control,cross,cube,cube-add,disable,document,double-caret-vertical,download,duplicate,edit,endorsed,envelope,error,export,filter,floppy-disk,function,history,id-number,import,inbox,info-sign,layers,lock,log-out,media,minus,more,people,phone,pin,play,pulse,refresh,saved,search,search-template,server,settings,share,small-cross,sort,th,tick,tick-circle,time,timeline-events,timeline-line-chart,unarchive,warning-sign,wrench,zoom-in,zoom-out,zoom-to-fit}.js',
  { import: 'default', base: '../../../../node_modules/@blueprintjs/icons/lib/esm/generated/16px/paths/' },
);
const paths20: PathsModules = import.meta.glob<IconPaths>(
  './{add,archive,arrow-down,arrow-up,at,calendar,caret-down,caret-right,caret-up,changes,chevron-down,chevron-left,chevron-right,chevron-up,circle,clipboard,code,control,cross,cube,cube-add,disable,document,double-caret-vertical,download,duplicate,edit,endorsed,envelope,error,export,filter,floppy-disk,function,history,id-number,import,inbox,info-sign,layers,lock,log-out,media,minus,more,people,phone,pin,play,pulse,refresh,saved,search,search-template,server,settings,share,small-cross,sort,th,tick,tick-circle,time,timeline-events,timeline-line-chart,unarchive,warning-sign,wrench,zoom-in,zoom-out,zoom-to-fit}.js',
  { import: 'default', base: '../../../../node_modules/@blueprintjs/icons/lib/esm/generated/20px/paths/' },
);

async function loadIconPaths(name: IconName, size: IconSize): Promise<IconPaths> {
  const px = size === IconSize.STANDARD ? 16 : 20;
  const load = (px === 16 ? paths16 : paths20)[`./${name}.js`];
  if (load) return load();
  await Icons.load(name, size, { loader: 'split-by-size' });
  const paths = Icons.getPaths(name, size);
  if (!paths) throw new Error(`no ${px}px paths for the icon '${name}'`);
  return paths;
}

/** Makes Blueprint load each named icon's paths on its own (call once, before the first render). */
export function loadIconsOneByOne(): void {
  Icons.setLoaderOptions({ loader: loadIconPaths });
}
