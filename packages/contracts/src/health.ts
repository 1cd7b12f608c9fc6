import { z } from 'zod';
import { ServiceState } from './enums.js';

export const HealthReply = z.object({
  status: ServiceState,
  services: z.object({
    database: ServiceState,
    objectStorage: ServiceState,
    mail: ServiceState,
  }),
});
export type HealthReply = z.infer<typeof HealthReply>;

/** Liveness: the process answers. Says nothing about the services behind it. */
export const LivenessReply = z.object({ status: z.literal('up') });
export type LivenessReply = z.infer<typeof LivenessReply>;
