import type { ArchiveFilter } from '@torquetrail/contracts';

// Query keys of the patients feature. Everything read per patient (here and in other features,
// e.g. the planner's restorations) is keyed under `patientKeys.all`, so that a change touching a
// patient's records as a whole (a recall exam) can refresh all of it with one invalidation.
export const patientKeys = {
  all: ['patients'] as const,
  list: (search: string, archived: ArchiveFilter = 'active') =>
    [...patientKeys.all, 'list', { search, archived }] as const,
  detail: (patientId: string) => [...patientKeys.all, 'detail', patientId] as const,
  versions: (patientId: string) => [...patientKeys.all, 'versions', patientId] as const,
  duplicates: (familyName: string, birthDate: string, excludeId?: string) =>
    [...patientKeys.all, 'duplicates', { familyName, birthDate, excludeId }] as const,
  settings: () => [...patientKeys.all, 'settings'] as const,
};
