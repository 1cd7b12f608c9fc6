import { ConflictException, Inject, Injectable } from '@nestjs/common';
import type { AppAbility } from '@torquetrail/authz';
import type { CreateShareBody, RevokeShareBody, Share, ShareListReply, ShareStatus } from '@torquetrail/contracts';
import type { z } from 'zod';
import type { SessionUser } from '../auth/session-user.js';
import { assertCan, type Scope } from '../authz/scope.js';
import { reportChange } from '../common/audit-context.js';
import { fieldError } from '../common/field-error.js';
import { isUniqueViolation } from '../common/postgres-error.js';
import { auditedTransaction } from '../db/audited-transaction.js';
import { DB, type Database, type Tx } from '../db/database.js';
import { AccountMailService } from '../people/account-mail.service.js';
import { ShareMailService } from './share-mail.service.js';
import * as repo from './shares.repository.js';

type NewShare = z.output<typeof CreateShareBody>;

/** An invited surgeon's share waits while the invitation's link works, and ends with it. */
function shareStatus(row: repo.ShareRow): ShareStatus {
  if (row.revokedAt) return 'revoked';
  if (!row.live) return 'ended';
  if (row.surgeonId) return 'active';
  return row.invitationOpen ? 'invited' : 'ended';
}

const todayUtc = () => new Date().toISOString().slice(0, 10);

/** Shares of the practice's patients with referring surgeons of other practices (dentist, admin reads). */
@Injectable()
export class SharesService {
  constructor(
    @Inject(DB) private readonly db: Database,
    private readonly mails: ShareMailService,
    private readonly accountMails: AccountMailService,
  ) {}

  async listPractice(user: SessionUser): Promise<ShareListReply> {
    return { items: await this.toShares(await repo.listPracticeShares(this.db, user.practiceId)) };
  }

  async listPatient(ability: AppAbility, scope: Scope, patientId: string): Promise<ShareListReply> {
    const patient = await this.ownPatient(ability, scope, patientId, 'read');
    return { items: await this.toShares(await repo.listPatientShares(this.db, patient.practiceId, patient.id)) };
  }

  /**
   * Shares a patient with a referring surgeon of another practice, found by the exact e-mail. The
   * surgeon is told by e-mail (a notice row in the same transaction, sent by the job queue). An
   * address with no account is invited instead: the share waits ("invited") until they sign up
   * with a practice of their own, and ends with the invitation.
   */
  async create(
    ability: AppAbility,
    user: SessionUser,
    scope: Scope,
    patientId: string,
    body: NewShare,
    linkOrigin: string,
  ) {
    const patient = await this.ownPatient(ability, scope, patientId, 'create');
    const to = await repo.findUserByEmail(this.db, body.surgeonEmail);
    if (to && !to.active)
      throw fieldError({
        surgeonEmail: 'This account is deactivated: ask the surgeon for the address they use now',
      });
    if (to?.id === user.id) throw fieldError({ surgeonEmail: 'This is your own address: share with the surgeon' });
    if (to && to.practiceId === patient.practiceId)
      throw fieldError({
        surgeonEmail: 'This person works in your practice and already sees its patients as their role allows',
      });
    if (to && to.role !== 'surgeon')
      throw fieldError({ surgeonEmail: 'This person is not a referring surgeon: only surgeons can be shared with' });
    if (body.endsOn !== null && body.endsOn < todayUtc())
      throw fieldError({ endsOn: 'The end date has passed: choose today or a later day, or leave it empty' });
    if (body.siteIds !== null) {
      const found = await repo.findSitesOfPatient(this.db, patient.id, body.siteIds);
      if (found.length !== new Set(body.siteIds).size)
        throw fieldError({ siteIds: 'Choose implant sites of this patient' });
    }
    const id = await auditedTransaction(this.db, async (tx) => {
      const invitation = to
        ? null
        : await this.invitationFor(tx, user, patient.practiceId, body.surgeonEmail, linkOrigin);
      const shareId = await repo.insertShare(tx, {
        practiceId: patient.practiceId,
        patientId: patient.id,
        sharedWithUserId: to?.id ?? null,
        invitationId: invitation?.id ?? null,
        sharedByUserId: user.id,
        scopes: [...new Set(body.scopes)],
        siteIds: body.siteIds && [...new Set(body.siteIds)],
        endsOn: body.endsOn,
        reason: body.reason,
      });
      // The invitation's own mail tells a new surgeon; a notice would have no one to go to.
      const noticeId = to ? await repo.insertNotice(tx, shareId, 'shared') : null;
      reportChange({
        type: 'Share',
        id: shareId,
        patientId: patient.id,
        after: {
          surgeonId: to?.id ?? null,
          invitationId: invitation?.id ?? null,
          scopes: body.scopes,
          siteIds: body.siteIds,
          endsOn: body.endsOn,
          reason: body.reason,
        },
      });
      return { shareId, noticeId, invitation };
    });
    if (id.noticeId) await this.mails.queue(id.noticeId);
    if (id.invitation?.mailNeeded)
      await this.accountMails.queue({ kind: 'invitation', id: id.invitation.id, round: 1 });
    return this.one(patient.practiceId, id.shareId);
  }

  /**
   * The invitation a share with a new address waits on: the practice's open one for the address
   * (a second share joins it; no second mail), or a new one. An expired one is withdrawn first, so
   * its shares stay ended. A colleague's pending invitation to the practice itself is refused.
   */
  private async invitationFor(tx: Tx, user: SessionUser, practiceId: string, email: string, linkOrigin: string) {
    const open = await repo.lockOpenInvitation(tx, practiceId, email);
    if (open && !open.ownPractice)
      throw fieldError({
        surgeonEmail:
          'This address is invited to join your practice: a colleague sees its patients as their role allows',
      });
    if (open && !open.expired) return { id: open.id, mailNeeded: false };
    if (open) await repo.withdrawInvitation(tx, open.id, user.id);
    try {
      const id = await repo.insertSurgeonInvitation(tx, { practiceId, email, invitedBy: user.id, linkOrigin });
      return { id, mailNeeded: true };
    } catch (error) {
      // Two shares with the same new address at the same moment: the other one invited them.
      if (isUniqueViolation(error, 'invitations_open_email_unique'))
        throw new ConflictException('This address was invited a moment ago: share again to join that invitation');
      throw error;
    }
  }

  /** Revokes a share at once: the surgeon's next request no longer opens the patient. */
  async revoke(ability: AppAbility, user: SessionUser, id: string, body: RevokeShareBody): Promise<Share> {
    const row = assertCan(ability, 'update', 'Share', await repo.findShare(this.db, user.practiceId, id), 'share');
    if (row.revokedAt) throw new ConflictException('This share was revoked already');
    const noticeId = await auditedTransaction(this.db, async (tx) => {
      if (!(await repo.revokeShare(tx, id, user.id, body.reason)))
        throw new ConflictException('This share was revoked already');
      // A surgeon still invited: the link stops working once no share waits on it; no one to tell.
      if (!row.surgeonId) {
        if (row.invitationId && !(await repo.invitationHasOtherShares(tx, row.invitationId, id)))
          await repo.withdrawInvitation(tx, row.invitationId, user.id);
      }
      reportChange({
        type: 'Share',
        id,
        patientId: row.patientId,
        before: { revokedAt: null },
        after: { revokedBy: user.id, reason: body.reason },
      });
      return row.surgeonId ? repo.insertNotice(tx, id, 'revoked') : null;
    });
    if (noticeId) await this.mails.queue(noticeId);
    return this.one(row.practiceId, id);
  }

  /** A patient of the user's own practice: shares are the sharing practice's to make and read. */
  private async ownPatient(ability: AppAbility, scope: Scope, patientId: string, action: 'read' | 'create') {
    const patient = assertCan(
      ability,
      'read',
      'Patient',
      await repo.findVisiblePatient(this.db, scope, patientId),
      'patient',
    );
    assertCan(ability, action, 'Share', { practiceId: patient.practiceId, patientId: patient.id }, 'patient');
    return patient;
  }

  private async one(practiceId: string, id: string): Promise<Share> {
    const [share] = await this.toShares([await repo.findShare(this.db, practiceId, id)]);
    return share;
  }

  private async toShares(rows: repo.ShareRow[]): Promise<Share[]> {
    const ids = [...new Set(rows.flatMap((row) => row.siteIds ?? []))];
    const fdis = new Map((await repo.findSiteFdis(this.db, ids)).map((site) => [site.id, site.fdi]));
    return rows.map((row) => ({
      id: row.id,
      patientId: row.patientId,
      patientName: `${row.givenName} ${row.familyName}`,
      chartNumber: row.chartNumber,
      surgeon: {
        id: row.surgeonId,
        displayName: row.surgeonName,
        email: row.surgeonEmail,
        practiceName: row.surgeonPracticeName,
      },
      scopes: row.scopes,
      sites: row.siteIds && row.siteIds.flatMap((id) => (fdis.has(id) ? [{ id, fdi: fdis.get(id)! }] : [])),
      endsOn: row.endsOn,
      reason: row.reason,
      invitationExpiresAt: row.surgeonId ? null : (row.invitationExpiresAt?.toISOString() ?? null),
      status: shareStatus(row),
      sharedByName: row.sharedByName,
      since: row.since.toISOString(),
      revokedAt: row.revokedAt?.toISOString() ?? null,
      revokedByName: row.revokedByName,
      revokeReason: row.revokeReason,
    }));
  }
}
