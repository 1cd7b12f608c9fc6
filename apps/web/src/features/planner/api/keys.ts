import { patientKeys } from '../../patients';

// Query keys of the planner, under the patients feature's per-patient scope.
export const restorationKeys = {
  restorableSites: (patientId: string) => [...patientKeys.all, 'restorable-sites', patientId] as const,
  list: (patientId: string) => [...patientKeys.all, 'restorations', patientId] as const,
};
