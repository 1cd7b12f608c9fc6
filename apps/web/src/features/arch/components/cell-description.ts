import type { ArchSite, SiteStatus } from '@torquetrail/contracts';
import { formatTooth } from '@torquetrail/domain';
import { formatLongDate } from '../../../lib/dates';
import { MAINTENANCE_STATUS_LABEL, SITE_STATUS_PHRASE } from '../../../lib/labels';
import type { ToothSystem } from '../../../lib/tooth-system';

/** What is at one tooth position, as the Arch draws it. */
export type CellContent = { type: 'natural' } | { type: 'missing' } | { type: 'site'; site: ArchSite };

/**
 * The accessible name of a cell, numbers in the chosen system, e.g.
 * "36, implant, peri-implant health, last exam 12 March 2026", "24, implant planned, not yet
 * examined", "21, natural tooth", "46, missing tooth".
 */
export function describeCell(fdi: number, system: ToothSystem, content: CellContent): string {
  const number = formatTooth(fdi, system);
  if (content.type === 'natural') return `${number}, natural tooth`;
  if (content.type === 'missing') return `${number}, missing tooth`;
  const { site } = content;
  const parts = [number, SITE_STATUS_PHRASE[site.status], MAINTENANCE_STATUS_LABEL[site.maintenanceStatus]];
  if (site.lastExamDate) parts.push(`last exam ${formatLongDate(site.lastExamDate)}`);
  if (site.partsMissingSeatingTorque) parts.push(seatingMissingPhrase(site.partsMissingSeatingTorque));
  return parts.join(', ');
}

const SUPERSEDED: ReadonlySet<SiteStatus> = new Set<SiteStatus>(['failed', 'removed']);

/**
 * What each position holds. Where a position has several sites (an implant removed and placed
 * again), the current one is drawn; the sites table beneath lists them all.
 */
export function cellContents(
  positions: readonly number[],
  sites: readonly ArchSite[],
  missingTeeth: readonly number[],
): Map<number, CellContent> {
  const contents = new Map<number, CellContent>();
  for (const fdi of positions) {
    const here = sites.filter((site) => site.fdi === fdi);
    const current = here.find((site) => !SUPERSEDED.has(site.status)) ?? here[0];
    if (current) contents.set(fdi, { type: 'site', site: current });
    else contents.set(fdi, { type: missingTeeth.includes(fdi) ? 'missing' : 'natural' });
  }
  return contents;
}

/** "seating torque missing on 2 parts": a part with a torque specification never seated by a logged torque. */
export const seatingMissingPhrase = (count: number) =>
  `seating torque missing on ${count === 1 ? 'one part' : `${count} parts`}`;
