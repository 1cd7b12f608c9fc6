import { ConflictException, Inject, Injectable } from '@nestjs/common';
import type { AppAbility } from '@torquetrail/authz';
import type { CreateShareBody, RevokeShareBody, Share, ShareListReply } from '@torquetrail/contracts';
import type { z } from 'zod';
import type { SessionUser } from '../auth/session-user.js';
import { assertCan, type Scope } from '../authz/scope.js';
import { reportChange } from '../common/audit-context.js';
import { fieldError } from '../common/field-error.js';
import { auditedTransaction } from '../db/audited-transaction.js';
import { DB, type Database } from '../db/database.js';
import { ShareMailService } from './share-mail.service.js';
import * as repo from './shares.repository.js';

type NewShare = z.output<typeof CreateShareBody>;

const todayUtc = () => new Date().toISOString().slice(0, 10);

/** Shares of the practice's patients with referring surgeons of other practices (dentist, admin reads). */
@Injectable()
export class SharesService {
  constructor(
    @Inject(DB) private readonly db: Database,
    private readonly mails: ShareMailService,
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
   * surgeon is told by e-mail (a notice row in the same transaction, sent by the job queue).
   */
  async create(ability: AppAbility, user: SessionUser, scope: Scope, patientId: string, body: NewShare) {
    const patient = await this.ownPatient(ability, scope, patientId, 'create');
    const to = await repo.findActiveUserByEmail(this.db, body.surgeonEmail);
    if (!to)
      throw fieldError({
        surgeonEmail: 'No one with this e-mail uses Torquetrail: check the address with the surgeon',
      });
    if (to.id === user.id) throw fieldError({ surgeonEmail: 'This is your own address: share with the surgeon' });
    if (to.practiceId === patient.practiceId)
      throw fieldError({
        surgeonEmail: 'This person works in your practice and already sees its patients as their role allows',
      });
    if (to.role !== 'surgeon')
      throw fieldError({ surgeonEmail: 'This person is not a referring surgeon: only surgeons can be shared with' });
    if (body.endsOn !== null && body.endsOn < todayUtc())
      throw fieldError({ endsOn: 'The end date has passed: choose today or a later day, or leave it empty' });
    if (body.siteIds !== null) {
      const found = await repo.findSitesOfPatient(this.db, patient.id, body.siteIds);
      if (found.length !== new Set(body.siteIds).size)
        throw fieldError({ siteIds: 'Choose implant sites of this patient' });
    }
    const id = await auditedTransaction(this.db, async (tx) => {
      const shareId = await repo.insertShare(tx, {
        practiceId: patient.practiceId,
        patientId: patient.id,
        sharedWithUserId: to.id,
        sharedByUserId: user.id,
        scopes: [...new Set(body.scopes)],
        siteIds: body.siteIds && [...new Set(body.siteIds)],
        endsOn: body.endsOn,
        reason: body.reason,
      });
      const noticeId = await repo.insertNotice(tx, shareId, 'shared');
      reportChange({
        type: 'Share',
        id: shareId,
        patientId: patient.id,
        after: {
          surgeonId: to.id,
          scopes: body.scopes,
          siteIds: body.siteIds,
          endsOn: body.endsOn,
          reason: body.reason,
        },
      });
      return { shareId, noticeId };
    });
    await this.mails.queue(id.noticeId);
    return this.one(patient.practiceId, id.shareId);
  }

  /** Revokes a share at once: the surgeon's next request no longer opens the patient. */
  async revoke(ability: AppAbility, user: SessionUser, id: string, body: RevokeShareBody): Promise<Share> {
    const row = assertCan(ability, 'update', 'Share', await repo.findShare(this.db, user.practiceId, id), 'share');
    if (row.revokedAt) throw new ConflictException('This share was revoked already');
    const noticeId = await auditedTransaction(this.db, async (tx) => {
      if (!(await repo.revokeShare(tx, id, user.id, body.reason)))
        throw new ConflictException('This share was revoked already');
      reportChange({
        type: 'Share',
        id,
        patientId: row.patientId,
        before: { revokedAt: null },
        after: { revokedBy: user.id, reason: body.reason },
      });
      return repo.insertNotice(tx, id, 'revoked');
    });
    await this.mails.queue(noticeId);
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
      status: row.revokedAt ? 'revoked' : row.live ? 'active' : 'ended',
      sharedByName: row.sharedByName,
      since: row.since.toISOString(),
      revokedAt: row.revokedAt?.toISOString() ?? null,
      revokedByName: row.revokedByName,
      revokeReason: row.revokeReason,
    }));
  }
}
