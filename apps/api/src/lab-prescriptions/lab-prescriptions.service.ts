import { randomUUID } from 'node:crypto';
import { Inject, Injectable, ServiceUnavailableException } from '@nestjs/common';
import type { AppAbility } from '@torquetrail/authz';
import type { LabPrescriptionSummary } from '@torquetrail/contracts';
import type { SessionUser } from '../auth/session-user.js';
import { assertCan, type Scope } from '../authz/scope.js';
import { fieldError } from '../common/field-error.js';
import { DB, type Database } from '../db/database.js';
import { MailService } from '../mail/mail.service.js';
import { RestorationsService } from '../restorations/restorations.service.js';
import { StorageService } from '../storage/storage.service.js';
import { renderLabPrescription } from './lab-prescription.pdf.js';
import * as repo from './lab-prescriptions.repository.js';

/** A file name safe in a Content-Disposition header and a mail attachment, whatever the chart number holds. */
export const pdfFilename = (chartNumber: string) =>
  `lab-prescription-${chartNumber.replace(/[^A-Za-z0-9_-]+/g, '_').slice(0, 40)}.pdf`;

const initials = (given: string, family: string) =>
  `${given.trim()[0] ?? ''}. ${family.trim()[0] ?? ''}.`.toUpperCase();

@Injectable()
export class LabPrescriptionsService {
  constructor(
    @Inject(DB) private readonly db: Database,
    private readonly storage: StorageService,
    private readonly mail: MailService,
    private readonly restorations: RestorationsService,
  ) {}

  /**
   * Renders the PDF, stores it in S3, then records it; the e-mail goes out afterwards. No
   * transaction is open while S3 or SMTP is called: the row is written only once the object exists.
   */
  async generate(
    ability: AppAbility,
    user: SessionUser,
    scope: Scope,
    restorationId: string,
    emailToLab: boolean,
  ): Promise<LabPrescriptionSummary> {
    const r = assertCan(
      ability,
      'create',
      'Restoration',
      await this.restorations.findVisible(scope, restorationId),
      'restoration',
    );
    if (emailToLab && !r.labEmail) throw fieldError({ emailToLab: 'The plan has no lab e-mail address' });
    const { patient, sites } = await this.restorations.labSheet(scope, r);
    const id = randomUUID();
    const pdf = await renderLabPrescription({
      practiceName: patient.practiceName,
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
    });
    const objectKey = `practices/${r.practiceId}/lab-prescriptions/${id}.pdf`;
    await this.storage.put(objectKey, pdf, 'application/pdf');
    const row = await repo.insertLabPrescription(this.db, {
      id,
      practiceId: r.practiceId,
      patientId: r.patientId,
      restorationId: r.id,
      objectKey,
      sizeBytes: pdf.length,
      createdBy: user.id,
    });
    let emailedAt: Date | null = null;
    if (emailToLab && r.labEmail) {
      try {
        await this.mail.send({
          to: r.labEmail,
          subject: `Lab prescription ${patient.chartNumber} from ${patient.practiceName}`,
          text: `Please find the lab prescription for ${patient.chartNumber} attached.${r.dueOn ? ` Due ${r.dueOn}.` : ''}\n\n${patient.practiceName}`,
          attachments: [{ filename: pdfFilename(patient.chartNumber), content: pdf, contentType: 'application/pdf' }],
          headers: { 'X-Torquetrail-Lab-Prescription': id },
        });
      } catch {
        throw new ServiceUnavailableException(
          'The lab prescription was saved, but the e-mail to the lab could not be sent; try again later',
        );
      }
      emailedAt = new Date();
      await repo.markEmailed(this.db, id, r.labEmail, emailedAt);
    }
    return {
      id,
      sizeBytes: pdf.length,
      emailedTo: emailedAt ? r.labEmail : null,
      emailedAt: emailedAt?.toISOString() ?? null,
      createdAt: row.createdAt.toISOString(),
    };
  }

  async download(ability: AppAbility, scope: Scope, id: string): Promise<{ pdf: Buffer; filename: string }> {
    const found = assertCan(
      ability,
      'read',
      'Restoration',
      await repo.findVisibleLabPrescription(this.db, scope, id),
      'lab prescription',
    );
    return { pdf: await this.storage.get(found.objectKey), filename: pdfFilename(found.chartNumber) };
  }
}
