// People and sign-in: the practice's users and invitations, passwords, resets and session settings.
import { z } from 'zod';
import { EmailAddress, Id, IsoDateTime, NoteText, PlainText } from './common.js';
import { Email, Phone } from './patients.js';
import { DATE_FORMATS, InvitationStatus, Role } from './enums.js';
import { NewPassword, PASSWORD_MAX_LENGTH, refinePasswordWithEmail } from './password.js';
import type { RouteContract } from './route-contract.js';

/** A one-time link's token: 43 characters of base64url (256 random bits); anything else is forged. */
export const LinkToken = z.string({ error: 'The link is incomplete' }).regex(/^[A-Za-z0-9_-]{43}$/, {
  error: 'This link is not valid: check that it was copied whole',
});

export const Person = z.object({
  id: Id,
  email: z.string(),
  displayName: z.string(),
  role: Role,
  active: z.boolean(),
  createdAt: IsoDateTime,
});
export type Person = z.infer<typeof Person>;

export const Invitation = z.object({
  id: Id,
  email: z.string(),
  role: Role,
  status: InvitationStatus,
  invitedByName: z.string(),
  createdAt: IsoDateTime,
  /** When the link last mailed stops working; null while the mail waits to be sent. */
  expiresAt: IsoDateTime.nullable(),
  mailSentAt: IsoDateTime.nullable(),
  /** The last attempt to mail it failed (it is retried). */
  mailFailed: z.boolean(),
});
export type Invitation = z.infer<typeof Invitation>;

export const PeopleReply = z.object({ people: z.array(Person), invitations: z.array(Invitation) });
export type PeopleReply = z.infer<typeof PeopleReply>;

export const InviteBody = z.object({ email: EmailAddress, role: Role });
export type InviteBody = z.input<typeof InviteBody>;

export const ChangeRoleBody = z.object({ role: Role });
export type ChangeRoleBody = z.infer<typeof ChangeRoleBody>;

/** Automatic sign-out after this many idle minutes (HIPAA 45 CFR 164.312(a)(2)(iii)). */
export const IDLE_SIGN_OUT_MINUTES = { min: 2, max: 120, default: 15 } as const;
export const SessionSettings = z.object({
  idleSignOutMinutes: z
    .number({ error: 'Enter a number of minutes' })
    .int({ error: 'Enter whole minutes' })
    .min(IDLE_SIGN_OUT_MINUTES.min, {
      error: `Use ${IDLE_SIGN_OUT_MINUTES.min} to ${IDLE_SIGN_OUT_MINUTES.max} minutes`,
    })
    .max(IDLE_SIGN_OUT_MINUTES.max, {
      error: `Use ${IDLE_SIGN_OUT_MINUTES.min} to ${IDLE_SIGN_OUT_MINUTES.max} minutes`,
    }),
  /** How everyone in the practice sees and types dates, and how its documents print them. */
  dateFormat: z.enum(DATE_FORMATS, { error: 'Choose how dates are written' }),
});
export type SessionSettings = z.infer<typeof SessionSettings>;

/**
 * How patients and colleagues reach the practice: printed on the implant passport, the retrieval
 * card, the referral summary and the lab prescription. Set by the practice administrator; a
 * field left empty is null (the documents then say it is not recorded).
 */
export const PracticeContactBody = z.object({
  address: NoteText(300).min(1, { error: 'Enter the address, or leave it empty' }).nullable(),
  phone: Phone.nullable(),
  email: Email.nullable(),
});
export type PracticeContactBody = z.infer<typeof PracticeContactBody>;
export const PracticeContact = PracticeContactBody.extend({ name: z.string() });
export type PracticeContact = z.infer<typeof PracticeContact>;

export const LinkTokenBody = z.object({ token: LinkToken });
export type LinkTokenBody = z.infer<typeof LinkTokenBody>;

/** What an invitation link opens: whose invitation it is, before they choose a password. */
export const InvitationPreview = z.object({
  email: z.string(),
  role: Role,
  practiceName: z.string(),
  /** A referring surgeon invited through a share: they name a practice of their own when they accept. */
  ownPractice: z.boolean(),
  expiresAt: IsoDateTime,
});
export type InvitationPreview = z.infer<typeof InvitationPreview>;

const AcceptInvitationFields = z.object({
  token: LinkToken,
  displayName: PlainText(120).min(1, { error: 'Enter your name as colleagues should see it' }),
  password: NewPassword,
  /** Only for an invitation to a practice of one's own (`ownPractice`): its name; ignored otherwise. */
  practiceName: PlainText(160).optional(),
});
export const AcceptInvitationBody = AcceptInvitationFields;
export type AcceptInvitationBody = z.infer<typeof AcceptInvitationBody>;
export const PRACTICE_NAME_NEEDED = 'Enter the name of your practice, as colleagues know it';
/** The web's form: the address is known from the preview, so the e-mail part is checked too. */
export const acceptInvitationForm = (email: string, ownPractice = false) =>
  refinePasswordWithEmail(
    AcceptInvitationFields.refine((b) => !ownPractice || (b.practiceName ?? '') !== '', {
      path: ['practiceName'],
      error: PRACTICE_NAME_NEEDED,
    }),
    (b) => ({ password: b.password, email }),
    'password',
  );

export const PasswordResetRequestBody = z.object({ email: EmailAddress });
export type PasswordResetRequestBody = z.input<typeof PasswordResetRequestBody>;
export const PasswordResetRequestReply = z.object({ message: z.string() });
export type PasswordResetRequestReply = z.infer<typeof PasswordResetRequestReply>;

export const PasswordResetPreview = z.object({ email: z.string(), expiresAt: IsoDateTime });
export type PasswordResetPreview = z.infer<typeof PasswordResetPreview>;

const CompleteResetFields = z.object({ token: LinkToken, password: NewPassword });
export const CompletePasswordResetBody = CompleteResetFields;
export type CompletePasswordResetBody = z.infer<typeof CompletePasswordResetBody>;
export const completePasswordResetForm = (email: string) =>
  refinePasswordWithEmail(CompleteResetFields, (b) => ({ password: b.password, email }), 'password');

const ChangePasswordFields = z.object({
  currentPassword: z.string().min(1, { error: 'Enter your current password' }).max(PASSWORD_MAX_LENGTH),
  newPassword: NewPassword,
});
export const ChangePasswordBody = ChangePasswordFields;
export type ChangePasswordBody = z.infer<typeof ChangePasswordBody>;
export const changePasswordForm = (email: string) =>
  refinePasswordWithEmail(ChangePasswordFields, (b) => ({ password: b.newPassword, email }), 'newPassword');

export const peopleRoutes: RouteContract[] = [
  {
    method: 'get',
    path: '/people',
    summary: "The practice's users (role, active or not) and its invitations",
    signedIn: true,
    reply: PeopleReply,
  },
  {
    method: 'post',
    path: '/people/invitations',
    summary: 'Invite someone by e-mail with a role: a one-time link valid 72 hours is mailed to them',
    signedIn: true,
    body: InviteBody,
    reply: Invitation,
  },
  {
    method: 'post',
    path: '/people/invitations/:id/resend',
    summary: 'Mail a new link for a pending or expired invitation (the previous link stops working)',
    signedIn: true,
    status: 200,
    reply: Invitation,
  },
  {
    method: 'post',
    path: '/people/invitations/:id/revoke',
    summary: 'Withdraw an invitation: its link stops working',
    signedIn: true,
    status: 200,
    reply: Invitation,
  },
  {
    method: 'put',
    path: '/people/:id/role',
    summary: "Change a user's role (409 for the last active practice administrator)",
    signedIn: true,
    body: ChangeRoleBody,
    reply: Person,
  },
  {
    method: 'post',
    path: '/people/:id/deactivation',
    summary: 'Deactivate a user: every session of theirs ends at once (409 for the last active administrator)',
    signedIn: true,
    status: 200,
    reply: Person,
  },
  {
    method: 'get',
    path: '/practice/session-settings',
    summary: "The practice's automatic sign-out period",
    signedIn: true,
    reply: SessionSettings,
  },
  {
    method: 'put',
    path: '/practice/session-settings',
    summary: "Set the practice's automatic sign-out period (practice administrator)",
    signedIn: true,
    body: SessionSettings,
    reply: SessionSettings,
  },
  {
    method: 'get',
    path: '/practice/contact',
    summary: "The practice's name, address, phone and e-mail, as its documents print them",
    signedIn: true,
    reply: PracticeContact,
  },
  {
    method: 'put',
    path: '/practice/contact',
    summary: "Set the practice's address, phone and e-mail (practice administrator; audited)",
    signedIn: true,
    body: PracticeContactBody,
    reply: PracticeContact,
  },
  {
    method: 'post',
    path: '/account/invitation',
    summary: 'What an invitation link opens (410 when used, withdrawn or expired; 404 when unknown)',
    signedIn: false,
    status: 200,
    body: LinkTokenBody,
    reply: InvitationPreview,
  },
  {
    method: 'post',
    path: '/account/invitation/accept',
    summary: 'Accept an invitation: set your name and password; the link is used up',
    signedIn: false,
    body: AcceptInvitationBody,
    noContent: true,
  },
  {
    method: 'post',
    path: '/account/password-reset',
    summary: 'Ask for a password reset link by e-mail; the same reply whether the address has an account or not',
    signedIn: false,
    status: 200,
    body: PasswordResetRequestBody,
    reply: PasswordResetRequestReply,
  },
  {
    method: 'post',
    path: '/account/password-reset/look-up',
    summary: 'What a reset link opens (410 when used or expired; 404 when unknown)',
    signedIn: false,
    status: 200,
    body: LinkTokenBody,
    reply: PasswordResetPreview,
  },
  {
    method: 'post',
    path: '/account/password-reset/complete',
    summary: 'Set a new password with a reset link; every session of the account ends',
    signedIn: false,
    body: CompletePasswordResetBody,
    noContent: true,
  },
  {
    method: 'put',
    path: '/auth/password',
    summary: "Change one's own password (the current one required); other sessions end",
    signedIn: true,
    body: ChangePasswordBody,
    noContent: true,
  },
];
