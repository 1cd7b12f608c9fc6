import { z } from 'zod';
import { Id, IsoDateTime } from './common.js';
import { DateFormat, Role, ShareScope } from './enums.js';

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
  /** The order the practice writes and types dates in (lib/dates.ts on the web). */
  dateFormat: DateFormat,
  /** Patients of other practices shared with this user (surgeons). */
  sharedPatientIds: z.array(Id),
  /** The live shares behind them: scope and sites (null: every implant site of the patient). */
  shares: z.array(z.object({ patientId: Id, scopes: z.array(ShareScope), siteIds: z.array(Id).nullable() })),
  session: z.object({
    /** Sign out after this many seconds without use (the practice's setting). */
    idleSignOutS: z.number().int().positive(),
    /** Warn this many seconds before the idle sign-out. */
    warnBeforeS: z.number().int().positive(),
    /** When the session ends whatever happens: sign in again then (OWASP ASVS 3.3.2). */
    reauthenticateAt: IsoDateTime,
  }),
});
export type Me = z.infer<typeof Me>;
