// Query keys of everything read per implant site: the Site file itself, and the Timeline and the
// placement options that other features fetch for it. They share `siteKeys.all`, so a change that
// touches sites as a whole (a recall exam) refreshes all of them with one invalidation.
export const siteKeys = {
  all: ['sites'] as const,
  detail: (siteId: string) => [...siteKeys.all, 'detail', siteId] as const,
  timeline: (siteId: string) => [...siteKeys.all, 'timeline', siteId] as const,
  placementOptions: (siteId: string) => [...siteKeys.all, 'placement-options', siteId] as const,
};
