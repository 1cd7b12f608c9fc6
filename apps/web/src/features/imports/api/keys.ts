// Query keys of the legacy import feature.
export const importKeys = {
  all: ['imports'] as const,
  progress: (runId: string) => [...importKeys.all, 'progress', runId] as const,
};
