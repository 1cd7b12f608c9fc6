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
