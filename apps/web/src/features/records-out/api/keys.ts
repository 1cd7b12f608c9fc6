// Query keys of the records-out feature.
export const recordsOutKeys = {
  all: ['records-out'] as const,
  mails: (patientId: string) => [...recordsOutKeys.all, 'mails', patientId] as const,
};
