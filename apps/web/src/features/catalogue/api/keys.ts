// Query keys of the catalogue feature (the practice's implant systems, platforms and parts).
export const catalogueKeys = {
  all: ['catalogue'] as const,
};
