import { z } from 'zod';
import { FdiPosition, Id, IsoDate, PlainText } from './common.js';
import { MaintenanceStatus, SiteStatus } from './enums.js';

export const PatientListQuery = z.object({
  search: PlainText(100).optional(),
});
export type PatientListQuery = z.infer<typeof PatientListQuery>;

export const PatientListItem = z.object({
  id: Id,
  chartNumber: z.string(),
  givenName: z.string(),
  familyName: z.string(),
  birthDate: IsoDate,
  implantSiteCount: z.number().int(),
  practiceName: z.string(),
});
export type PatientListItem = z.infer<typeof PatientListItem>;
export const PatientListReply = z.object({ items: z.array(PatientListItem) });
export type PatientListReply = z.infer<typeof PatientListReply>;

/** One implant site as drawn on the Arch. */
export const ArchSite = z.object({
  id: Id,
  fdi: FdiPosition,
  status: SiteStatus,
  maintenanceStatus: MaintenanceStatus,
  lastExamDate: IsoDate.nullable(),
  systemName: z.string().nullable(),
});
export type ArchSite = z.infer<typeof ArchSite>;

export const PatientDetail = PatientListItem.extend({
  /** The patient's practice: row-level checks in the web (e.g. a shared surgeon may not plan sites). */
  practiceId: Id,
  riskFactors: z.object({
    smoker: z.boolean(),
    diabetesPoorlyControlled: z.boolean(),
    periodontitisHistory: z.boolean(),
  }),
  /** Teeth recorded as missing (not implant sites), drawn as faint outlines. */
  missingTeeth: z.array(FdiPosition),
  sites: z.array(ArchSite),
});
export type PatientDetail = z.infer<typeof PatientDetail>;
