import { GoneException, Inject, Injectable, NotFoundException } from '@nestjs/common';
import {
  type AcceptInvitationBody,
  type InvitationPreview,
  PRACTICE_NAME_NEEDED,
  passwordProblem,
  type PasswordResetPreview,
  type PasswordResetRequestReply,
} from '@torquetrail/contracts';
import { hashPassword } from '../auth/password.js';
import { currentAudit } from '../common/audit-context.js';
import { fieldError } from '../common/field-error.js';
import { isUniqueViolation } from '../common/postgres-error.js';
import { auditedTransaction, insertAuditEvent } from '../db/audited-transaction.js';
import { DB, type Database } from '../db/database.js';
import { AccountMailService } from './account-mail.service.js';
import * as accounts from './account.repository.js';
import { hashLinkToken } from './link-token.js';
import * as people from './people.repository.js';

const UNKNOWN_LINK = 'No such link: check that it was copied whole from the e-mail, or ask for a new one';

/** Every reset request answers after at least this long, so the time does not tell whether the address has an account. */
const RESET_REPLY_FLOOR_MS = 400;
const RESET_REPLY: PasswordResetRequestReply = {
  message:
    'If this address belongs to a Torquetrail account, a link to choose a new password is on its way. It works for 30 minutes.',
};

/** The public side of people and sign-in: invitation links and password resets. */
@Injectable()
export class AccountService {
  constructor(
    @Inject(DB) private readonly db: Database,
    private readonly mails: AccountMailService,
  ) {}

  private async openInvitation(db: Database, token: string, lock = false) {
    const row = await people.findInvitationByToken(db, hashLinkToken(token), lock);
    if (!row) throw new NotFoundException(UNKNOWN_LINK);
    if (row.acceptedAt)
      throw new GoneException('This invitation was used already: sign in with your e-mail and password');
    if (row.revokedAt) throw new GoneException('This invitation was withdrawn by the practice');
    if (!row.expiresAt || row.expiresAt <= new Date())
      throw new GoneException(
        row.ownPractice
          ? 'This invitation has expired: ask the practice that shared the patient to share it again'
          : 'This invitation has expired: ask your practice administrator to send it again',
      );
    return { ...row, expiresAt: row.expiresAt };
  }

  async previewInvitation(token: string): Promise<InvitationPreview> {
    const row = await this.openInvitation(this.db, token);
    return {
      email: row.email,
      role: row.role,
      practiceName: row.practiceName,
      ownPractice: row.ownPractice,
      expiresAt: row.expiresAt.toISOString(),
    };
  }

  /**
   * Makes the invitee's account; the link is used up in the same transaction (single use). A
   * referring surgeon invited by a share gets a practice of their own, and the shares that waited
   * for them open at once, each with its row in the sharing practice's audit trail.
   */
  async acceptInvitation(token: string, body: AcceptInvitationBody): Promise<void> {
    await auditedTransaction(this.db, async (tx) => {
      const row = await this.openInvitation(tx, token, true);
      const problem = passwordProblem(body.password, row.email);
      if (problem) throw fieldError({ password: problem });
      const practiceName = body.practiceName?.trim() || null;
      if (row.ownPractice && !practiceName) throw fieldError({ practiceName: PRACTICE_NAME_NEEDED });
      let account: { userId: string; practiceId: string };
      try {
        account = await people.acceptInvitation(tx, row, {
          displayName: body.displayName,
          passwordHash: await hashPassword(body.password),
          practiceName,
        });
      } catch (error) {
        if (isUniqueViolation(error)) throw new GoneException(`${row.email} has an account already: sign in instead`);
        throw error;
      }
      if (!row.ownPractice) return;
      const request = currentAudit();
      for (const share of await people.openInvitedShares(tx, row.email, account.userId))
        await insertAuditEvent(tx, {
          practiceId: share.practiceId,
          userId: account.userId,
          role: row.role,
          action: 'share-change',
          outcome: 'allowed',
          httpStatus: 204,
          route: 'POST /account/invitation/accept',
          recordType: 'Share',
          recordId: share.id,
          patientId: share.patientId,
          query: null,
          before: { surgeonId: null, invitationId: row.id },
          after: { surgeonId: account.userId, practiceId: account.practiceId },
          address: request?.address ?? null,
          userAgent: request?.userAgent ?? null,
          requestId: request?.requestId ?? null,
        });
    });
  }

  /**
   * The same reply, after about the same time, whether or not the address has an active account
   * (the account's mail is queued, not sent, within the request).
   */
  async requestReset(email: string, linkOrigin: string): Promise<PasswordResetRequestReply> {
    const started = Date.now();
    const user = await accounts.findActiveUserByEmail(this.db, email);
    if (user) {
      const id = await accounts.insertReset(this.db, user.id, linkOrigin);
      await this.mails.queue({ kind: 'password-reset', id });
    }
    const wait = RESET_REPLY_FLOOR_MS - (Date.now() - started);
    if (wait > 0) await new Promise((resolve) => setTimeout(resolve, wait));
    return RESET_REPLY;
  }

  private async openReset(db: Database, token: string, lock = false) {
    const row = await accounts.findResetByToken(db, hashLinkToken(token), lock);
    if (!row) throw new NotFoundException(UNKNOWN_LINK);
    if (row.usedAt) throw new GoneException('This reset link was used already: ask for a new one if you need it');
    if (row.supersededAt) throw new GoneException('A newer reset link was sent: use the latest e-mail');
    if (!row.active) throw new GoneException('This account is deactivated: ask your practice administrator');
    if (!row.expiresAt || row.expiresAt <= new Date())
      throw new GoneException('This reset link has expired (links work for 30 minutes): ask for a new one');
    return { ...row, expiresAt: row.expiresAt };
  }

  async previewReset(token: string): Promise<PasswordResetPreview> {
    const row = await this.openReset(this.db, token);
    return { email: row.email, expiresAt: row.expiresAt.toISOString() };
  }

  /** A new password; every session of the account ends and the link is used up. */
  async completeReset(token: string, password: string): Promise<void> {
    await this.db.transaction(async (tx) => {
      const row = await this.openReset(tx, token, true);
      const problem = passwordProblem(password, row.email);
      if (problem) throw fieldError({ password: problem });
      await accounts.completeReset(tx, row, await hashPassword(password));
    });
  }
}
