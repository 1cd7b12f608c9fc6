import { randomUUID } from 'node:crypto';
import { Inject, Injectable, NotFoundException } from '@nestjs/common';
import { type AppAbility, readableFields } from '@torquetrail/authz';
import type { LabPrescriptionSummary } from '@torquetrail/contracts';
import type { SessionUser } from '../auth/session-user.js';
import { assertCan, type Scope } from '../authz/scope.js';
import { fieldError } from '../common/field-error.js';
import { reportChange } from '../common/audit-context.js';
import { auditedTransaction } from '../db/audited-transaction.js';
import { DB, type Database } from '../db/database.js';
import { findPrintingPractice } from '../db/practice-contact.js';
import { ImpressionsService } from '../impressions/impressions.service.js';
import { RestorationsService } from '../restorations/restorations.service.js';
import { StorageService } from '../storage/storage.service.js';
import { LabMailService } from './lab-mail.service.js';
import { renderLabPrescription } from './lab-prescription.pdf.js';
import * as repo from './lab-prescriptions.repository.js';

import { pdfFilename } from './pdf-filename.js';

const initials = (given: string, family: string) =>
  `${given.trim()[0] ?? ''}. ${family.trim()[0] ?? ''}.`.toUpperCase();

@Injectable()
export class LabPrescriptionsService {
  constructor(
    @Inject(DB) private readonly db: Database,
    private readonly storage: StorageService,
    private readonly labMail: LabMailService,
    private readonly restorations: RestorationsService,
    private readonly impressions: ImpressionsService,
  ) {}

  /**
   * The plan version's lab prescription: the latest one when it exists (pressing again makes no
   * second PDF), a new one for the first press or when `revise` asks for a new version. The PDF
   * is stored in S3 before its row is written; when the row cannot be written the object is
   * removed again, so no file is left without its row. With `emailToLab`, a mail request is
   * recorded and sent by the job queue (retried while SMTP is away), never inside this request.
   */
  async generate(
    ability: AppAbility,
    user: SessionUser,
    scope: Scope,
    restorationId: string,
    body: { emailToLab: boolean; revise: boolean },
  ): Promise<LabPrescriptionSummary> {
    const r = assertCan(
      ability,
      'create',
      'Restoration',
      await this.restorations.findVisible(scope, restorationId),
      'restoration',
    );
    if (body.emailToLab && !r.labEmail) throw fieldError({ emailToLab: 'The plan has no lab e-mail address' });
    const latest = body.revise ? null : await repo.findLatestForRestoration(this.db, r.id);
    const id = latest?.id ?? (await this.render(user, scope, r, body.revise));
    if (body.emailToLab && r.labEmail) {
      await this.labMail.request({
        practiceId: r.practiceId,
        labPrescriptionId: id,
        sentTo: r.labEmail,
        requestedBy: user.id,
      });
    }
    const summary = (await this.restorations.labPrescriptionsOf([r.id])).find((l) => l.id === id);
    if (!summary) throw new Error(`lab prescription ${id} not found after it was written`);
    const { restorationId: _r, ...reply } = summary;
    return reply;
  }

  /**
   * Writes a new prescription. Two first presses at once both render, but only the first row is
   * written: the second finds it under the plan's lock, removes its own file and answers with it.
   */
  private async render(
    user: SessionUser,
    scope: Scope,
    r: NonNullable<Awaited<ReturnType<RestorationsService['findVisible']>>>,
    revise: boolean,
  ): Promise<string> {
    const [{ patient, sites }, impression, practice, number] = await Promise.all([
      this.restorations.labSheet(scope, r),
      this.impressions.labSheet(r.id),
      findPrintingPractice(this.db, r.practiceId),
      repo.nextPrescriptionNumber(this.db, r.practiceId),
    ]);
    const id = randomUUID();
    const pdf = await renderLabPrescription({
      practice,
      number,
      chartNumber: patient.chartNumber,
      initials: initials(patient.givenName, patient.familyName),
      dentistName: r.plannedByName ?? user.displayName,
      kind: r.kind,
      retention: r.retention,
      material: r.material,
      shade: r.shade,
      copingsSplinted: r.copingsSplinted,
      impressionTakenOn: r.impressionTakenOn,
      dueOn: r.dueOn,
      labName: r.labName,
      notes: r.notes,
      issuedOn: new Date().toISOString().slice(0, 10),
      sites,
      impression,
    });
    const objectKey = `practices/${r.practiceId}/lab-prescriptions/${id}.pdf`;
    await this.storage.put(objectKey, pdf, 'application/pdf');
    try {
      const written = await auditedTransaction(this.db, async (tx) => {
        await repo.lockPrescriptionsOf(tx, r.id);
        const earlier = revise ? null : await repo.findLatestForRestoration(tx, r.id);
        if (earlier) return earlier.id;
        await repo.insertLabPrescription(tx, {
          id,
          number,
          practiceId: r.practiceId,
          patientId: r.patientId,
          restorationId: r.id,
          objectKey,
          sizeBytes: pdf.length,
          createdBy: user.id,
        });
        reportChange({ type: 'LabPrescription', id, patientId: r.patientId, after: { restorationId: r.id, number } });
        return id;
      });
      if (written !== id) await this.storage.delete(objectKey).catch(() => undefined);
      return written;
    } catch (error) {
      // Best effort: when S3 is away too, the object stays, keyed by an id no row will ever hold.
      await this.storage.delete(objectKey).catch(() => undefined);
      throw error;
    }
  }

  async download(ability: AppAbility, scope: Scope, id: string): Promise<{ pdf: Buffer; filename: string }> {
    const found = assertCan(
      ability,
      'read',
      'Restoration',
      await repo.findVisibleLabPrescription(this.db, scope, id),
      'lab prescription',
    );
    // It names the lab and its address: only where the field rules open the restoration's
    // prescriptions (never through a share).
    const fields = readableFields(ability, 'Restoration', found);
    if (fields && !fields.includes('labPrescriptions')) throw new NotFoundException('No such lab prescription');
    return { pdf: await this.storage.get(found.objectKey), filename: pdfFilename(found.chartNumber) };
  }
}
