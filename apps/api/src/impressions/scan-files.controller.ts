import { Controller, Get, HttpStatus, Param, ParseUUIDPipe, Post, Query, Req, StreamableFile } from '@nestjs/common';
import type { Request } from 'express';
import type { AppAbility } from '@torquetrail/authz';
import { ScanFileUploadQuery, type ScanFile } from '@torquetrail/contracts';
import type { z } from 'zod';
import type { SessionUser } from '../auth/session-user.js';
import { Audit } from '../audit/audit.decorator.js';
import { Public } from '../common/public.decorator.js';
import { Allow } from '../authz/check-ability.decorator.js';
import { scopeOf } from '../authz/scope.js';
import { CurrentAbility, CurrentUser } from '../common/current-user.decorator.js';
import { ZodValidationPipe } from '../common/zod-validation.pipe.js';
import { ScanFilesService } from './scan-files.service.js';

const uuid = () => new ParseUUIDPipe({ errorHttpStatusCode: HttpStatus.NOT_FOUND });

@Controller()
export class ScanFilesController {
  constructor(private readonly scanFiles: ScanFilesService) {}

  /** The body is the file itself (application/octet-stream), read as a stream, never parsed. */
  @Post('impressions/:id/scan-files')
  @Allow('create', 'Impression')
  upload(
    @CurrentUser() user: SessionUser,
    @CurrentAbility() ability: AppAbility,
    @Param('id', uuid()) id: string,
    @Query(new ZodValidationPipe(ScanFileUploadQuery)) query: z.output<typeof ScanFileUploadQuery>,
    @Req() req: Request,
  ): Promise<ScanFile> {
    const length = req.get('content-length');
    return this.scanFiles.upload(ability, user, scopeOf(user), id, query, req, length ? Number(length) : undefined);
  }

  @Get('scan-files/:id/file')
  @Audit('export')
  @Allow('read', 'Impression')
  async file(
    @CurrentUser() user: SessionUser,
    @CurrentAbility() ability: AppAbility,
    @Param('id', uuid()) id: string,
  ): Promise<StreamableFile> {
    const f = await this.scanFiles.file(ability, scopeOf(user), id);
    return new StreamableFile(f.stream, { type: f.type, disposition: `attachment; filename="${f.filename}"` });
  }

  /**
   * A scan file through the time-limited link mailed to the lab (no session: the signed token is
   * the permission). Its audit row is written by the service, which knows whose file it was.
   */
  @Get('lab-files/:token')
  @Public()
  async labFile(@Param('token') token: string, @Req() req: Request): Promise<StreamableFile> {
    const f = await this.scanFiles.fileByLink(token.slice(0, 400), {
      address: req.ip ?? null,
      userAgent: req.get('user-agent')?.slice(0, 400) ?? null,
      requestId: typeof req.id === 'string' ? req.id : null,
    });
    const safeName = f.filename.replace(/[^\w.-]+/g, '_');
    return new StreamableFile(f.stream, { type: f.type, disposition: `attachment; filename="${safeName}"` });
  }
}
