// Query keys of the patients feature. Everything read per patient (here and in other features,
// e.g. the planner's restorations) is keyed under `patientKeys.all`, so that a change touching a
// patient's records as a whole (a recall exam) can refresh all of it with one invalidation.
export const patientKeys = {
  all: ['patients'] as const,
  list: (search: string) => [...patientKeys.all, 'list', { search }] as const,
  detail: (patientId: string) => [...patientKeys.all, 'detail', patientId] as const,
};
