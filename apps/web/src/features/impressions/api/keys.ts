import { patientKeys } from '../../patients';

// Query keys of impressions, under the patients feature's per-patient scope.
export const impressionKeys = {
  all: [...patientKeys.all, 'impressions'] as const,
  ofRestoration: (restorationId: string) => [...impressionKeys.all, restorationId] as const,
  /** The scan-body markers placed on one scan file. */
  markers: (scanFileId: string) => [...impressionKeys.all, 'markers', scanFileId] as const,
  /** The practice's impression rules (not a patient's): a change refreshes every impression's Findings. */
  settings: ['practice', 'impression-settings'] as const,
};
