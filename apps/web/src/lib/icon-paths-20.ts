// The 20 px paths of the accepted icons, one chunk each (icon-loader.ts): this map is a chunk of its
// own, so a first view that draws only 16 px icons does not carry it. The pattern equals
// ICON_NAMES_ACCEPTED (icon-names-accepted.test.ts checks).
import type { IconPaths } from '@blueprintjs/icons';

export const paths20: Record<string, () => Promise<IconPaths>> = import.meta.glob<IconPaths>(
  './{add,archive,arrow-down,arrow-up,at,calendar,caret-down,caret-up,changes,chevron-down,chevron-left,chevron-right,chevron-up,circle,clipboard,code,control,cross,cube,cube-add,disable,document,double-caret-vertical,download,duplicate,edit,endorsed,envelope,error,exchange,export,filter,floppy-disk,function,history,id-number,import,inbox,info-sign,label,layers,link,list,lock,log-out,map-marker,media,people,phone,pin,play,pulse,refresh,search,search-template,server,settings,share,sort,square,th,tick,tick-circle,time,timeline-events,timeline-line-chart,unarchive,warning-sign,wrench,zoom-in,zoom-out,zoom-to-fit}.js',
  { import: 'default', base: '../../../../node_modules/@blueprintjs/icons/lib/esm/generated/20px/paths/' },
);
