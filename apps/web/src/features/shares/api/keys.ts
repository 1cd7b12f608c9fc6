// Query keys of the shares feature.
export const shareKeys = {
  all: ['shares'] as const,
  practice: () => [...shareKeys.all, 'practice'] as const,
  patient: (patientId: string) => [...shareKeys.all, 'patient', patientId] as const,
};
