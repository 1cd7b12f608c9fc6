import { Body, Controller, Get, HttpStatus, Param, ParseUUIDPipe, Post, StreamableFile } from '@nestjs/common';
import type { AppAbility } from '@torquetrail/authz';
import { PassportMailBody, type PassportMail, type RecordsOutStatus } from '@torquetrail/contracts';
import type { SessionUser } from '../auth/session-user.js';
import { Audit } from '../audit/audit.decorator.js';
import { Allow } from '../authz/check-ability.decorator.js';
import { scopeOf } from '../authz/scope.js';
import { CurrentAbility, CurrentUser } from '../common/current-user.decorator.js';
import { ZodValidationPipe } from '../common/zod-validation.pipe.js';
import { RecordsOutService } from './records-out.service.js';

const PatientId = new ParseUUIDPipe({ errorHttpStatusCode: HttpStatus.NOT_FOUND });

const pdfFile = ({ pdf, filename }: { pdf: Buffer; filename: string }) =>
  new StreamableFile(pdf, {
    type: 'application/pdf',
    disposition: `attachment; filename="${filename}"`,
    length: pdf.length,
  });

@Controller('patients/:id')
export class RecordsOutController {
  constructor(private readonly records: RecordsOutService) {}

  @Get('fhir')
  @Audit('export')
  @Allow('read', 'PatientExport')
  async fhir(
    @CurrentUser() user: SessionUser,
    @CurrentAbility() ability: AppAbility,
    @Param('id', PatientId) id: string,
  ): Promise<StreamableFile> {
    const { json, filename } = await this.records.fhir(ability, scopeOf(user), id);
    const body = Buffer.from(json, 'utf8');
    return new StreamableFile(body, {
      type: 'application/fhir+json; charset=utf-8',
      disposition: `attachment; filename="${filename}"`,
      length: body.length,
    });
  }

  @Get('passport.pdf')
  @Audit('export')
  @Allow('read', 'ImplantPassport')
  async passport(
    @CurrentUser() user: SessionUser,
    @CurrentAbility() ability: AppAbility,
    @Param('id', PatientId) id: string,
  ): Promise<StreamableFile> {
    return pdfFile(await this.records.passport(ability, user, scopeOf(user), id));
  }

  @Get('retrieval-card.pdf')
  @Audit('export')
  @Allow('read', 'ImplantPassport')
  async retrievalCard(
    @CurrentUser() user: SessionUser,
    @CurrentAbility() ability: AppAbility,
    @Param('id', PatientId) id: string,
  ): Promise<StreamableFile> {
    return pdfFile(await this.records.retrievalCard(ability, user, scopeOf(user), id));
  }

  @Get('passport/mails')
  @Allow('read', 'ImplantPassport')
  mailStatus(
    @CurrentUser() user: SessionUser,
    @CurrentAbility() ability: AppAbility,
    @Param('id', PatientId) id: string,
  ): Promise<RecordsOutStatus> {
    return this.records.mailStatus(ability, scopeOf(user), id);
  }

  @Post('passport/mails')
  @Allow('create', 'ImplantPassport')
  requestMail(
    @CurrentUser() user: SessionUser,
    @CurrentAbility() ability: AppAbility,
    @Param('id', PatientId) id: string,
    @Body(new ZodValidationPipe(PassportMailBody)) _body: PassportMailBody,
  ): Promise<PassportMail> {
    return this.records.requestMail(ability, user, scopeOf(user), id);
  }
}
