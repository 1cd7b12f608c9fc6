import { Module } from '@nestjs/common';
import { LotLookupController } from './lot-lookup.controller.js';
import { LotLookupService } from './lot-lookup.service.js';
import { OutcomesController } from './outcomes.controller.js';
import { OutcomesService } from './outcomes.service.js';
import { ReferralSummaryController } from './referral-summary.controller.js';
import { ReferralSummaryService } from './referral-summary.service.js';

// The surgeon's issue: the lot look-up, how the implants do, and the referral summary.
@Module({
  controllers: [LotLookupController, OutcomesController, ReferralSummaryController],
  providers: [LotLookupService, OutcomesService, ReferralSummaryService],
})
export class OutcomesModule {}
