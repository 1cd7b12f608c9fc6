import { Inject, Injectable } from '@nestjs/common';
import { type AppAbility, SHARE_SCOPES, type ShareScope, subject } from '@torquetrail/authz';
import type { SessionUser } from '../auth/session-user.js';
import type { PatientDetail, PatientListQuery, PatientListReply } from '@torquetrail/contracts';
import { assertCan, type Scope } from '../authz/scope.js';
import { DB, type Database } from '../db/database.js';
import { MaintenanceStatusService } from '../recalls/maintenance-status.service.js';
import { seatingTorqueMissing } from '@torquetrail/domain';
import { findVisiblePatient, listPatients, listSitesOfPatient, seatingOfPatientParts } from './patients.repository.js';

@Injectable()
export class PatientsService {
  constructor(
    @Inject(DB) private readonly db: Database,
    private readonly maintenance: MaintenanceStatusService,
  ) {}

  /** The list; a patient of another practice names the scopes of the user's live shares of them. */
  async list(user: SessionUser, scope: Scope, query: PatientListQuery): Promise<PatientListReply> {
    const rows = await listPatients(this.db, scope, query.search, query.archived);
    const scopes = new Map<string, Set<ShareScope>>();
    for (const share of user.shares)
      scopes.set(share.patientId, new Set([...(scopes.get(share.patientId) ?? []), ...share.scopes]));
    return {
      items: rows.map(({ practiceId, ...r }) => ({
        ...r,
        shareScopes:
          practiceId === user.practiceId ? null : SHARE_SCOPES.filter((s) => scopes.get(r.id)?.has(s) ?? false),
        archivedAt: r.archivedAt?.toISOString() ?? null,
      })),
    };
  }

  async detail(ability: AppAbility, scope: Scope, id: string): Promise<PatientDetail> {
    const patient = assertCan(ability, 'read', 'Patient', await findVisiblePatient(this.db, scope, id), 'patient');
    const sites = (await listSitesOfPatient(this.db, patient.id)).filter((site) =>
      ability.can('read', subjectOf(site)),
    );
    // Per site: a share limited to chosen sites, or without outcomes, opens no other site's exams.
    const examined = sites.filter((s) =>
      ability.can('read', subject('RecallExam', { practiceId: s.practiceId, patientId: s.patientId, siteId: s.id })),
    );
    // Per site too: torque is read where the role may read both the parts and their torque.
    const torqued = sites.filter((s) =>
      (['ComponentInstance', 'TorqueEvent'] as const).every((type) =>
        ability.can('read', subject(type, { practiceId: s.practiceId, patientId: s.patientId, siteId: s.id })),
      ),
    );
    const [exams, seating] = await Promise.all([
      this.maintenance.latestBySite(examined.map((s) => s.id)),
      torqued.length > 0 ? seatingOfPatientParts(this.db, patient.id) : null,
    ]);
    const missing = new Map<string, number>();
    for (const part of seating?.parts ?? [])
      if (
        seatingTorqueMissing(
          part.torqueSpecNcm,
          seating!.torque.filter((t) => t.instanceId === part.instanceId),
        )
      )
        missing.set(part.siteId, (missing.get(part.siteId) ?? 0) + 1);
    return {
      id: patient.id,
      practiceId: patient.practiceId,
      chartNumber: patient.chartNumber,
      givenName: patient.givenName,
      familyName: patient.familyName,
      birthDate: patient.birthDate,
      practiceName: patient.practiceName,
      sex: patient.sex,
      implantSiteCount: sites.length,
      riskFactors: {
        smoker: patient.smoker,
        diabetesPoorlyControlled: patient.diabetesPoorlyControlled,
        periodontitisHistory: patient.periodontitisHistory,
      },
      riskFactorsRecordedOn: patient.riskFactorsRecordedOn,
      // A surgeon sees a shared patient's implant record, not how to reach the patient.
      contact:
        patient.practiceId === scope.practiceId
          ? {
              email: patient.email,
              phone: patient.phone,
              preferredLanguage: patient.preferredLanguage,
              emailReminderConsent: patient.emailReminderConsent,
              emailReminderConsentOn: patient.emailReminderConsentOn,
            }
          : null,
      chartNumberChangeable: patient.chartNumberChangedAt === null,
      archivedAt: patient.archivedAt?.toISOString() ?? null,
      archive: patient.archivedAt
        ? {
            at: patient.archivedAt.toISOString(),
            byName: patient.archivedByName ?? 'unknown',
            reason: patient.archiveReason ?? '',
          }
        : null,
      missingTeeth: patient.missingTeeth,
      sites: sites.map((site) => ({
        id: site.id,
        fdi: site.fdi,
        status: site.status,
        maintenanceStatus: exams.get(site.id)?.status ?? ('not-examined' as const),
        lastExamDate: exams.get(site.id)?.examinedOn ?? null,
        systemName: site.systemName,
        partsMissingSeatingTorque: torqued.includes(site) ? (missing.get(site.id) ?? 0) : undefined,
      })),
    };
  }
}

const subjectOf = (site: { practiceId: string; patientId: string; id: string }) => subject('ImplantSite', { ...site });
