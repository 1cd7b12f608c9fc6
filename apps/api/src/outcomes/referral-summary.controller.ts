import { Body, Controller, Get, HttpStatus, Param, ParseUUIDPipe, Post, StreamableFile } from '@nestjs/common';
import type { AppAbility } from '@torquetrail/authz';
import { type ReferralSummaryMail, ReferralSummaryMailBody, type ReferralSummaryState } from '@torquetrail/contracts';
import type { SessionUser } from '../auth/session-user.js';
import { Audit } from '../audit/audit.decorator.js';
import { Allow } from '../authz/check-ability.decorator.js';
import { outcomePatients } from '../authz/outcome-patients.js';
import { CurrentAbility, CurrentUser } from '../common/current-user.decorator.js';
import { ZodValidationPipe } from '../common/zod-validation.pipe.js';
import { ReferralSummaryService } from './referral-summary.service.js';

const uuid = () => new ParseUUIDPipe({ errorHttpStatusCode: HttpStatus.NOT_FOUND });

@Controller('patients/:id/referral-summary')
export class ReferralSummaryController {
  constructor(private readonly referrals: ReferralSummaryService) {}

  @Get()
  @Allow('read', 'ReferralSummary')
  state(
    @CurrentUser() user: SessionUser,
    @CurrentAbility() ability: AppAbility,
    @Param('id', uuid()) id: string,
  ): Promise<ReferralSummaryState> {
    return this.referrals.state(ability, outcomePatients(user), id);
  }

  @Get('pdf')
  @Audit('export')
  @Allow('read', 'ReferralSummary')
  async pdf(
    @CurrentUser() user: SessionUser,
    @CurrentAbility() ability: AppAbility,
    @Param('id', uuid()) id: string,
  ): Promise<StreamableFile> {
    const { pdf, filename } = await this.referrals.download(ability, outcomePatients(user), id);
    return new StreamableFile(pdf, {
      type: 'application/pdf',
      disposition: `attachment; filename="${filename}"`,
      length: pdf.length,
    });
  }

  @Post('mails')
  @Allow('create', 'ReferralSummary')
  send(
    @CurrentUser() user: SessionUser,
    @CurrentAbility() ability: AppAbility,
    @Param('id', uuid()) id: string,
    @Body(new ZodValidationPipe(ReferralSummaryMailBody)) body: ReferralSummaryMailBody,
  ): Promise<ReferralSummaryMail> {
    return this.referrals.requestMail(ability, user, outcomePatients(user), id, body);
  }
}
