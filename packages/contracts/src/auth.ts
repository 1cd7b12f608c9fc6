import { z } from 'zod';
import { Id } from './common.js';
import { Role } from './enums.js';

export const SignInBody = z.object({
  email: z.email({ error: 'Enter a valid e-mail address' }).max(254),
  password: z.string().min(1, { error: 'Enter your password' }).max(200),
});
export type SignInBody = z.infer<typeof SignInBody>;

/** The signed-in user as the web needs it to build the same CASL ability as the API. */
export const Me = z.object({
  id: Id,
  email: z.string(),
  displayName: z.string(),
  role: Role,
  practiceId: Id,
  practiceName: z.string(),
  /** Patients of other practices shared with this user (surgeons). */
  sharedPatientIds: z.array(Id),
});
export type Me = z.infer<typeof Me>;
