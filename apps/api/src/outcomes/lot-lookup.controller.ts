import { Controller, Get, Header, Query } from '@nestjs/common';
import { LotLookupQuery, type LotLookupReply } from '@torquetrail/contracts';
import type { SessionUser } from '../auth/session-user.js';
import { Audit } from '../audit/audit.decorator.js';
import { Allow } from '../authz/check-ability.decorator.js';
import { scopeOf } from '../authz/scope.js';
import { CurrentUser } from '../common/current-user.decorator.js';
import { ZodValidationPipe } from '../common/zod-validation.pipe.js';
import { LotLookupService } from './lot-lookup.service.js';

@Controller('lot-lookup')
export class LotLookupController {
  constructor(private readonly lots: LotLookupService) {}

  @Get()
  @Allow('read', 'LotTrace')
  find(
    @CurrentUser() user: SessionUser,
    @Query(new ZodValidationPipe(LotLookupQuery)) query: LotLookupQuery,
  ): Promise<LotLookupReply> {
    return this.lots.find(scopeOf(user), query);
  }

  @Get('csv')
  @Audit('export')
  @Allow('read', 'LotTrace')
  @Header('Content-Type', 'text/csv; charset=utf-8')
  @Header('Content-Disposition', 'attachment; filename="lot-look-up.csv"')
  csv(
    @CurrentUser() user: SessionUser,
    @Query(new ZodValidationPipe(LotLookupQuery)) query: LotLookupQuery,
  ): Promise<string> {
    return this.lots.csv(scopeOf(user), query);
  }
}
