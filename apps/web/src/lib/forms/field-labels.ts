import { FIELD_ITEM_NOUNS, FIELD_LABELS } from '../labels';

/**
 * A field of the API's 400 `fields`, in words: `exams.0.sites.2.probingDepthMm` → "Probing depth
 * (mm), exam 1, site 3". Every form names server problems through this one mapping.
 */
export function fieldLabel(path: string): string {
  const segments = path.split('.');
  const items: string[] = [];
  let field: string | undefined;
  segments.forEach((segment, i) => {
    if (/^\d+$/.test(segment)) {
      const list = segments[i - 1] ?? '';
      items.push(`${FIELD_ITEM_NOUNS[list] ?? 'item'} ${Number(segment) + 1}`);
    } else {
      field = segment;
    }
  });
  const last = segments.at(-1) ?? '';
  // A path ending in an index names the item itself ("site 3"), not its list.
  const name = /^\d+$/.test(last) ? undefined : FIELD_LABELS[field ?? ''];
  const words = [name ?? (items.length === 0 ? 'This entry' : undefined), ...items].filter(Boolean);
  const text = words.join(', ');
  return text.charAt(0).toUpperCase() + text.slice(1);
}
