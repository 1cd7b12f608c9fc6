import { Inject, Injectable } from '@nestjs/common';
import { type AppAbility, subject } from '@torquetrail/authz';
import type { PatientDetail, PatientListReply } from '@torquetrail/contracts';
import { assertCan, type Scope } from '../authz/scope.js';
import { DB, type Database } from '../db/database.js';
import { MaintenanceStatusService } from '../recalls/maintenance-status.service.js';
import { findVisiblePatient, listPatients, listSitesOfPatient } from './patients.repository.js';

@Injectable()
export class PatientsService {
  constructor(
    @Inject(DB) private readonly db: Database,
    private readonly maintenance: MaintenanceStatusService,
  ) {}

  async list(scope: Scope, search?: string): Promise<PatientListReply> {
    return { items: await listPatients(this.db, scope, search) };
  }

  async detail(ability: AppAbility, scope: Scope, id: string): Promise<PatientDetail> {
    const patient = assertCan(ability, 'read', 'Patient', await findVisiblePatient(this.db, scope, id), 'patient');
    const sites = (await listSitesOfPatient(this.db, patient.id)).filter((site) =>
      ability.can('read', subjectOf(site)),
    );
    const exams = ability.can('read', subject('RecallExam', { practiceId: patient.practiceId, patientId: patient.id }))
      ? await this.maintenance.latestBySite(sites.map((s) => s.id))
      : new Map();
    return {
      id: patient.id,
      practiceId: patient.practiceId,
      chartNumber: patient.chartNumber,
      givenName: patient.givenName,
      familyName: patient.familyName,
      birthDate: patient.birthDate,
      practiceName: patient.practiceName,
      implantSiteCount: sites.length,
      riskFactors: {
        smoker: patient.smoker,
        diabetesPoorlyControlled: patient.diabetesPoorlyControlled,
        periodontitisHistory: patient.periodontitisHistory,
      },
      missingTeeth: patient.missingTeeth,
      sites: sites.map((site) => ({
        id: site.id,
        fdi: site.fdi,
        status: site.status,
        maintenanceStatus: exams.get(site.id)?.status ?? ('not-examined' as const),
        lastExamDate: exams.get(site.id)?.examinedOn ?? null,
        systemName: site.systemName,
      })),
    };
  }
}

const subjectOf = (site: { practiceId: string; patientId: string; id: string }) => subject('ImplantSite', { ...site });
