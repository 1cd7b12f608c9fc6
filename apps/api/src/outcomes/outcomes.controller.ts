import { Controller, Get, Query } from '@nestjs/common';
import { OutcomesQuery, type OutcomesReply } from '@torquetrail/contracts';
import type { SessionUser } from '../auth/session-user.js';
import { Allow } from '../authz/check-ability.decorator.js';
import { outcomePatients } from '../authz/outcome-patients.js';
import { CurrentUser } from '../common/current-user.decorator.js';
import { ZodValidationPipe } from '../common/zod-validation.pipe.js';
import { OutcomesService } from './outcomes.service.js';

@Controller('outcomes')
export class OutcomesController {
  constructor(private readonly outcomes: OutcomesService) {}

  @Get()
  @Allow('read', 'Outcomes')
  report(
    @CurrentUser() user: SessionUser,
    @Query(new ZodValidationPipe(OutcomesQuery)) query: OutcomesQuery,
  ): Promise<OutcomesReply> {
    return this.outcomes.report(outcomePatients(user), query);
  }
}
