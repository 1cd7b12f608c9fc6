// Query keys of the catalogue feature (the practice's implant systems, platforms and parts).
export const catalogueKeys = {
  all: ['catalogue'] as const,
  /** Under `all`: an edit of the catalogue refreshes a part's history too. */
  versions: (id: string) => ['catalogue', 'versions', id] as const,
  /** The practice's cantilever limit (the planner's live Findings use it). */
  cantileverSettings: () => ['catalogue', 'cantilever-settings'] as const,
};
