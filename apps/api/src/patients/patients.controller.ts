import { Controller, Get, Param, ParseUUIDPipe, Query, HttpStatus } from '@nestjs/common';
import type { AppAbility } from '@torquetrail/authz';
import { type PatientDetail, PatientListQuery, type PatientListReply } from '@torquetrail/contracts';
import type { SessionUser } from '../auth/session-user.js';
import { Allow } from '../authz/check-ability.decorator.js';
import { scopeOf } from '../authz/scope.js';
import { CurrentAbility, CurrentUser } from '../common/current-user.decorator.js';
import { ZodValidationPipe } from '../common/zod-validation.pipe.js';
import { PatientsService } from './patients.service.js';

@Controller('patients')
export class PatientsController {
  constructor(private readonly patients: PatientsService) {}

  @Get()
  @Allow('read', 'Patient')
  list(
    @CurrentUser() user: SessionUser,
    @Query(new ZodValidationPipe(PatientListQuery)) query: PatientListQuery,
  ): Promise<PatientListReply> {
    return this.patients.list(scopeOf(user), query.search);
  }

  @Get(':id')
  @Allow('read', 'Patient')
  detail(
    @CurrentUser() user: SessionUser,
    @CurrentAbility() ability: AppAbility,
    @Param('id', new ParseUUIDPipe({ errorHttpStatusCode: HttpStatus.NOT_FOUND })) id: string,
  ): Promise<PatientDetail> {
    return this.patients.detail(ability, scopeOf(user), id);
  }
}
