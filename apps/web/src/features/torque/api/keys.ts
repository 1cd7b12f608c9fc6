// Query keys of the torque feature (the practice's wrenches).
export const wrenchKeys = {
  all: ['wrenches'] as const,
};
