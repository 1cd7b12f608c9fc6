import { patientKeys } from '../../patients';

// Query keys of radiographs, under the patients feature's per-patient scope.
export const radiographKeys = {
  list: (patientId: string) => [...patientKeys.all, 'radiographs', patientId] as const,
  detail: (radiographId: string) => [...patientKeys.all, 'radiograph', radiographId] as const,
};
