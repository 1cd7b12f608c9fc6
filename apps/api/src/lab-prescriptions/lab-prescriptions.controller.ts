import { Body, Controller, Get, Param, ParseUUIDPipe, Post, StreamableFile, HttpStatus } from '@nestjs/common';
import type { AppAbility } from '@torquetrail/authz';
import { LabPrescriptionBody, type LabPrescriptionSummary } from '@torquetrail/contracts';
import type { z } from 'zod';
import type { SessionUser } from '../auth/session-user.js';
import { Audit } from '../audit/audit.decorator.js';
import { Allow } from '../authz/check-ability.decorator.js';
import { scopeOf } from '../authz/scope.js';
import { CurrentAbility, CurrentUser } from '../common/current-user.decorator.js';
import { ZodValidationPipe } from '../common/zod-validation.pipe.js';
import { LabPrescriptionsService } from './lab-prescriptions.service.js';

const uuid = () => new ParseUUIDPipe({ errorHttpStatusCode: HttpStatus.NOT_FOUND });

@Controller()
export class LabPrescriptionsController {
  constructor(private readonly labs: LabPrescriptionsService) {}

  @Post('restorations/:id/lab-prescriptions')
  @Allow('create', 'Restoration')
  generate(
    @CurrentUser() user: SessionUser,
    @CurrentAbility() ability: AppAbility,
    @Param('id', uuid()) id: string,
    @Body(new ZodValidationPipe(LabPrescriptionBody)) body: z.output<typeof LabPrescriptionBody>,
  ): Promise<LabPrescriptionSummary> {
    return this.labs.generate(ability, user, scopeOf(user), id, body);
  }

  @Get('lab-prescriptions/:id/pdf')
  @Audit('export')
  @Allow('read', 'Restoration')
  async download(
    @CurrentUser() user: SessionUser,
    @CurrentAbility() ability: AppAbility,
    @Param('id', uuid()) id: string,
  ): Promise<StreamableFile> {
    const { pdf, filename } = await this.labs.download(ability, scopeOf(user), id);
    return new StreamableFile(pdf, {
      type: 'application/pdf',
      disposition: `attachment; filename="${filename}"`,
      length: pdf.length,
    });
  }
}
