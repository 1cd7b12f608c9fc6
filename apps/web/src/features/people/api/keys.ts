// Query keys of the people feature.
export const peopleKeys = {
  all: ['people'] as const,
  list: () => [...peopleKeys.all, 'list'] as const,
  sessionSettings: () => [...peopleKeys.all, 'session-settings'] as const,
  practiceContact: () => [...peopleKeys.all, 'practice-contact'] as const,
};
