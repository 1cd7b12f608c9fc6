import { Controller, Get, HttpStatus, Param, ParseUUIDPipe, Query, StreamableFile } from '@nestjs/common';
import { Readable } from 'node:stream';
import type { AppAbility } from '@torquetrail/authz';
import {
  AuditCsvQuery,
  type AuditPage,
  AuditQuery,
  PatientAuditQuery,
  type PracticeAuditPage,
} from '@torquetrail/contracts';
import type { SessionUser } from '../auth/session-user.js';
import { Allow } from '../authz/check-ability.decorator.js';
import { scopeOf } from '../authz/scope.js';
import { CurrentAbility, CurrentUser } from '../common/current-user.decorator.js';
import { ZodValidationPipe } from '../common/zod-validation.pipe.js';
import { Audit } from './audit.decorator.js';
import { AuditService } from './audit.service.js';

@Controller()
export class AuditController {
  constructor(private readonly audit: AuditService) {}

  @Get('audit')
  @Allow('read', 'AuditEntry')
  page(
    @CurrentUser() user: SessionUser,
    @Query(new ZodValidationPipe(AuditQuery)) query: AuditQuery,
  ): Promise<PracticeAuditPage> {
    return this.audit.practicePage(scopeOf(user), query);
  }

  /** Streamed: the rows are read in batches while the client downloads. */
  @Get('audit/csv')
  @Allow('read', 'AuditEntry')
  @Audit('export')
  csv(
    @CurrentUser() user: SessionUser,
    @Query(new ZodValidationPipe(AuditCsvQuery)) query: AuditCsvQuery,
  ): StreamableFile {
    return new StreamableFile(Readable.from(this.audit.csv(scopeOf(user), query)), {
      type: 'text/csv; charset=utf-8',
      disposition: 'attachment; filename="audit-trail.csv"',
    });
  }

  @Get('patients/:id/audit')
  @Allow('read', 'PatientAudit')
  patient(
    @CurrentUser() user: SessionUser,
    @CurrentAbility() ability: AppAbility,
    @Param('id', new ParseUUIDPipe({ errorHttpStatusCode: HttpStatus.NOT_FOUND })) id: string,
    @Query(new ZodValidationPipe(PatientAuditQuery)) query: PatientAuditQuery,
  ): Promise<AuditPage> {
    return this.audit.patientPage(ability, scopeOf(user), id, query);
  }
}
