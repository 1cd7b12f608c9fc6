import { patientKeys } from '../../patients';

// Query keys of radiographs, under the patients feature's per-patient scope (a recall exam, which
// refreshes everything under it, also refreshes the bone-level chart's ICOI findings).
export const radiographKeys = {
  all: [...patientKeys.all, 'radiographs'] as const,
  list: (patientId: string, includeEnteredInError = false) =>
    [...radiographKeys.all, 'list', patientId, { includeEnteredInError }] as const,
  detail: (radiographId: string) => [...radiographKeys.all, 'detail', radiographId] as const,
  boneLevels: (siteId: string) => [...radiographKeys.all, 'bone-levels', siteId] as const,
};
