import type { InsertPart } from '@torquetrail/contracts';

/** An insert's strength as the practice's catalogue states it: its label, and its force when stated. */
export function strengthText(p: Pick<InsertPart, 'name' | 'retentionLabel' | 'retentionN'>): string {
  const label = p.retentionLabel ?? 'strength not stated';
  return `${p.name} (${label}${p.retentionN !== null ? `, ${p.retentionN} N` : ''})`;
}
