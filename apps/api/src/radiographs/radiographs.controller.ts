import {
  Body,
  Controller,
  Get,
  HttpCode,
  HttpStatus,
  Param,
  ParseUUIDPipe,
  Post,
  Query,
  Req,
  StreamableFile,
} from '@nestjs/common';
import type { Request } from 'express';
import type { AppAbility } from '@torquetrail/authz';
import {
  EnteredInErrorBody,
  MeasurementAmendmentBody,
  MeasurementBody,
  RadiographListQuery,
  RadiographUploadQuery,
  type Measurement,
  type Radiograph,
  type RadiographDetail,
  type RadiographListReply,
} from '@torquetrail/contracts';
import type { z } from 'zod';
import type { SessionUser } from '../auth/session-user.js';
import { Audit } from '../audit/audit.decorator.js';
import { Allow } from '../authz/check-ability.decorator.js';
import { scopeOf } from '../authz/scope.js';
import { CurrentAbility, CurrentUser } from '../common/current-user.decorator.js';
import { ZodValidationPipe } from '../common/zod-validation.pipe.js';
import { RadiographsService } from './radiographs.service.js';

const uuid = () => new ParseUUIDPipe({ errorHttpStatusCode: HttpStatus.NOT_FOUND });

@Controller()
export class RadiographsController {
  constructor(private readonly radiographs: RadiographsService) {}

  /** The body is the file itself (application/octet-stream), read as a stream, never parsed. */
  @Post('patients/:id/radiographs')
  @Allow('create', 'Radiograph')
  upload(
    @CurrentUser() user: SessionUser,
    @CurrentAbility() ability: AppAbility,
    @Param('id', uuid()) id: string,
    @Query(new ZodValidationPipe(RadiographUploadQuery)) query: z.output<typeof RadiographUploadQuery>,
    @Req() req: Request,
  ): Promise<Radiograph> {
    const length = req.get('content-length');
    return this.radiographs.upload(ability, user, scopeOf(user), id, query, req, length ? Number(length) : undefined);
  }

  @Get('patients/:id/radiographs')
  @Allow('read', 'Radiograph')
  list(
    @CurrentUser() user: SessionUser,
    @CurrentAbility() ability: AppAbility,
    @Param('id', uuid()) id: string,
    @Query(new ZodValidationPipe(RadiographListQuery)) query: z.output<typeof RadiographListQuery>,
  ): Promise<RadiographListReply> {
    return this.radiographs.list(ability, scopeOf(user), id, query.includeEnteredInError);
  }

  @Get('radiographs/:id')
  @Allow('read', 'Radiograph')
  detail(
    @CurrentUser() user: SessionUser,
    @CurrentAbility() ability: AppAbility,
    @Param('id', uuid()) id: string,
  ): Promise<RadiographDetail> {
    return this.radiographs.detail(ability, scopeOf(user), id);
  }

  @Get('radiographs/:id/original')
  @Audit('export')
  @Allow('read', 'Radiograph')
  async original(
    @CurrentUser() user: SessionUser,
    @CurrentAbility() ability: AppAbility,
    @Param('id', uuid()) id: string,
  ): Promise<StreamableFile> {
    const f = await this.radiographs.file(ability, scopeOf(user), id, 'original');
    return new StreamableFile(f.stream, { type: f.type, disposition: `attachment; filename="${f.filename}"` });
  }

  @Get('radiographs/:id/preview')
  @Allow('read', 'Radiograph')
  async preview(
    @CurrentUser() user: SessionUser,
    @CurrentAbility() ability: AppAbility,
    @Param('id', uuid()) id: string,
  ): Promise<StreamableFile> {
    const f = await this.radiographs.file(ability, scopeOf(user), id, 'preview');
    return new StreamableFile(f.stream, { type: f.type, disposition: 'inline' });
  }

  @Get('radiographs/:id/thumbnail')
  @Allow('read', 'Radiograph')
  async thumbnail(
    @CurrentUser() user: SessionUser,
    @CurrentAbility() ability: AppAbility,
    @Param('id', uuid()) id: string,
  ): Promise<StreamableFile> {
    const f = await this.radiographs.file(ability, scopeOf(user), id, 'thumbnail');
    return new StreamableFile(f.stream, { type: f.type, disposition: 'inline' });
  }

  @Post('radiographs/:id/entered-in-error')
  @HttpCode(200)
  @Allow('amend', 'Radiograph')
  enteredInError(
    @CurrentUser() user: SessionUser,
    @CurrentAbility() ability: AppAbility,
    @Param('id', uuid()) id: string,
    @Body(new ZodValidationPipe(EnteredInErrorBody)) body: z.output<typeof EnteredInErrorBody>,
  ): Promise<Radiograph> {
    return this.radiographs.markEnteredInError(ability, user, scopeOf(user), id, body.reason);
  }

  @Post('radiographs/:id/measurements')
  @Allow('create', 'Radiograph')
  measure(
    @CurrentUser() user: SessionUser,
    @CurrentAbility() ability: AppAbility,
    @Param('id', uuid()) id: string,
    @Body(new ZodValidationPipe(MeasurementBody)) body: z.output<typeof MeasurementBody>,
  ): Promise<Measurement> {
    return this.radiographs.measure(ability, user, scopeOf(user), id, body);
  }

  @Post('radiograph-measurements/:id/amendments')
  @Allow('amend', 'Radiograph')
  amend(
    @CurrentUser() user: SessionUser,
    @CurrentAbility() ability: AppAbility,
    @Param('id', uuid()) id: string,
    @Body(new ZodValidationPipe(MeasurementAmendmentBody)) body: z.output<typeof MeasurementAmendmentBody>,
  ): Promise<Measurement> {
    return this.radiographs.amendMeasurement(ability, user, scopeOf(user), id, body);
  }
}
