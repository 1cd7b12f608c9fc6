import { Body, Controller, Get, Put } from '@nestjs/common';
import { PatientSettingsBody, type PatientSettingsReply } from '@torquetrail/contracts';
import type { SessionUser } from '../auth/session-user.js';
import { Allow } from '../authz/check-ability.decorator.js';
import { CurrentUser } from '../common/current-user.decorator.js';
import { ZodValidationPipe } from '../common/zod-validation.pipe.js';
import { PatientRecordsService } from './patient-records.service.js';

/** The practice's settings for patients' records: the chart-number prefix (practice admin). */
@Controller('practice/patient-settings')
export class PatientSettingsController {
  constructor(private readonly records: PatientRecordsService) {}

  @Get()
  @Allow('read', 'Practice')
  settings(@CurrentUser() user: SessionUser): Promise<PatientSettingsReply> {
    return this.records.settings(user.practiceId);
  }

  @Put()
  @Allow('update', 'Practice')
  update(
    @CurrentUser() user: SessionUser,
    @Body(new ZodValidationPipe(PatientSettingsBody)) body: PatientSettingsBody,
  ): Promise<PatientSettingsReply> {
    return this.records.updateSettings(user, body);
  }
}
