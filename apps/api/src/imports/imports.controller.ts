import {
  Controller,
  Get,
  HttpCode,
  HttpStatus,
  Param,
  ParseUUIDPipe,
  Post,
  Query,
  Req,
  UnsupportedMediaTypeException,
} from '@nestjs/common';
import type { Request } from 'express';
import type { AppAbility } from '@torquetrail/authz';
import { ImportQuery, type ImportProgress, type ImportReport, type ImportResult } from '@torquetrail/contracts';
import type { z } from 'zod';
import type { SessionUser } from '../auth/session-user.js';
import { Audit } from '../audit/audit.decorator.js';
import { Allow } from '../authz/check-ability.decorator.js';
import { CurrentAbility, CurrentUser } from '../common/current-user.decorator.js';
import { ZodValidationPipe } from '../common/zod-validation.pipe.js';
import { ImportsService } from './imports.service.js';

/** The declared length of the file, after refusing any body that is not the file itself. */
const declared = (req: Request) => {
  if (!/^application\/octet-stream\s*(;|$)/i.test(req.get('content-type') ?? ''))
    throw new UnsupportedMediaTypeException('Send the CSV file itself as application/octet-stream');
  const length = req.get('content-length');
  return length ? Number(length) : undefined;
};

/** The file is the body (application/octet-stream), read by the service within the size limit. */
@Controller('imports')
export class ImportsController {
  constructor(private readonly imports: ImportsService) {}

  /** Reads patient data from the file without writing any: audited as a read, naming no record. */
  @Post('dry-run')
  @HttpCode(200)
  @Audit('read', 'ImportDryRun')
  @Allow('create', 'LegacyImport')
  dryRun(
    @CurrentUser() user: SessionUser,
    @CurrentAbility() ability: AppAbility,
    @Query(new ZodValidationPipe(ImportQuery)) query: z.output<typeof ImportQuery>,
    @Req() req: Request,
  ): Promise<ImportReport> {
    return this.imports.dryRun(ability, user, query, req, declared(req));
  }

  @Post()
  @Allow('create', 'LegacyImport')
  run(
    @CurrentUser() user: SessionUser,
    @CurrentAbility() ability: AppAbility,
    @Query(new ZodValidationPipe(ImportQuery)) query: z.output<typeof ImportQuery>,
    @Req() req: Request,
  ): Promise<ImportResult> {
    return this.imports.run(ability, user, query, req, declared(req));
  }

  @Get('progress/:runId')
  @Allow('read', 'LegacyImport')
  progress(
    @CurrentUser() user: SessionUser,
    @Param('runId', new ParseUUIDPipe({ errorHttpStatusCode: HttpStatus.NOT_FOUND })) runId: string,
  ): ImportProgress {
    return this.imports.progressOf(user, runId);
  }
}
