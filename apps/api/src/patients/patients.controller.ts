import { Body, Controller, Get, HttpCode, HttpStatus, Param, ParseUUIDPipe, Patch, Post, Query } from '@nestjs/common';
import type { AppAbility } from '@torquetrail/authz';
import {
  ArchivePatientBody,
  CreatePatientBody,
  DuplicateCheckQuery,
  type DuplicateCheckReply,
  type NewPatientRecord,
  type PatientDetail,
  PatientListQuery,
  type PatientListReply,
  type PatientVersionsReply,
  UpdatePatientBody,
} from '@torquetrail/contracts';
import type { SessionUser } from '../auth/session-user.js';
import { Allow } from '../authz/check-ability.decorator.js';
import { scopeOf } from '../authz/scope.js';
import { CurrentAbility, CurrentUser } from '../common/current-user.decorator.js';
import { ZodValidationPipe } from '../common/zod-validation.pipe.js';
import { PatientRecordsService } from './patient-records.service.js';
import { PatientsService } from './patients.service.js';

const PatientId = new ParseUUIDPipe({ errorHttpStatusCode: HttpStatus.NOT_FOUND });

@Controller('patients')
export class PatientsController {
  constructor(
    private readonly patients: PatientsService,
    private readonly records: PatientRecordsService,
  ) {}

  @Get()
  @Allow('read', 'Patient')
  list(
    @CurrentUser() user: SessionUser,
    @Query(new ZodValidationPipe(PatientListQuery)) query: PatientListQuery,
  ): Promise<PatientListReply> {
    return this.patients.list(user, scopeOf(user), query);
  }

  /** Before saving a new patient (or a new name or birth date): the likely duplicates. */
  @Get('duplicates')
  @Allow('create', 'Patient')
  duplicates(
    @CurrentUser() user: SessionUser,
    @Query(new ZodValidationPipe(DuplicateCheckQuery)) query: DuplicateCheckQuery,
  ): Promise<DuplicateCheckReply> {
    return this.records.duplicates(user, query);
  }

  @Post()
  @Allow('create', 'Patient')
  create(
    @CurrentUser() user: SessionUser,
    @CurrentAbility() ability: AppAbility,
    @Body(new ZodValidationPipe(CreatePatientBody)) body: NewPatientRecord,
  ): Promise<PatientDetail> {
    return this.records.create(ability, user, scopeOf(user), body);
  }

  @Get(':id')
  @Allow('read', 'Patient')
  detail(
    @CurrentUser() user: SessionUser,
    @CurrentAbility() ability: AppAbility,
    @Param('id', PatientId) id: string,
  ): Promise<PatientDetail> {
    return this.patients.detail(ability, scopeOf(user), id);
  }

  @Patch(':id')
  @Allow('update', 'Patient')
  update(
    @CurrentUser() user: SessionUser,
    @CurrentAbility() ability: AppAbility,
    @Param('id', PatientId) id: string,
    @Body(new ZodValidationPipe(UpdatePatientBody)) body: UpdatePatientBody,
  ): Promise<PatientDetail> {
    return this.records.update(ability, user, scopeOf(user), id, body);
  }

  @Post(':id/archive')
  @HttpCode(200)
  @Allow('archive', 'Patient')
  archive(
    @CurrentUser() user: SessionUser,
    @CurrentAbility() ability: AppAbility,
    @Param('id', PatientId) id: string,
    @Body(new ZodValidationPipe(ArchivePatientBody)) body: ArchivePatientBody,
  ): Promise<PatientDetail> {
    return this.records.setArchived(ability, user, scopeOf(user), id, true, body);
  }

  @Post(':id/unarchive')
  @HttpCode(200)
  @Allow('archive', 'Patient')
  unarchive(
    @CurrentUser() user: SessionUser,
    @CurrentAbility() ability: AppAbility,
    @Param('id', PatientId) id: string,
    @Body(new ZodValidationPipe(ArchivePatientBody)) body: ArchivePatientBody,
  ): Promise<PatientDetail> {
    return this.records.setArchived(ability, user, scopeOf(user), id, false, body);
  }

  @Get(':id/versions')
  @Allow('read', 'PatientVersion')
  versions(
    @CurrentUser() user: SessionUser,
    @CurrentAbility() ability: AppAbility,
    @Param('id', PatientId) id: string,
  ): Promise<PatientVersionsReply> {
    return this.records.versions(ability, scopeOf(user), id);
  }
}
