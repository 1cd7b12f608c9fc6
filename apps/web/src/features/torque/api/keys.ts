// Query keys of the torque feature: the practice's wrenches, and the screws of a restoration.
export const wrenchKeys = {
  all: ['wrenches'] as const,
};
export const screwKeys = {
  of: (restorationId: string) => ['restoration-screws', restorationId] as const,
};
