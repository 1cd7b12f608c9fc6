import { patientKeys } from '../../patients';

// Query keys of impressions, under the patients feature's per-patient scope.
export const impressionKeys = {
  all: [...patientKeys.all, 'impressions'] as const,
  ofRestoration: (restorationId: string) => [...impressionKeys.all, restorationId] as const,
  /** The practice's impression rules (not a patient's): a change refreshes every impression's Findings. */
  settings: ['practice', 'impression-settings'] as const,
};
