import { Body, Controller, Get, Param, ParseUUIDPipe, Post, Query, HttpStatus, StreamableFile } from '@nestjs/common';
import type { AppAbility } from '@torquetrail/authz';
import {
  AmendExamBody,
  CreateVisitBody,
  type CreateVisitReply,
  type ExamContext,
  type RecallExam,
  RecallDeskCsvQuery,
  RecallDeskQuery,
  type RecallDeskReply,
  type SiteExamHistory,
} from '@torquetrail/contracts';
import type { z } from 'zod';
import type { SessionUser } from '../auth/session-user.js';
import { Audit } from '../audit/audit.decorator.js';
import { Allow } from '../authz/check-ability.decorator.js';
import { scopeOf } from '../authz/scope.js';
import { CurrentAbility, CurrentUser } from '../common/current-user.decorator.js';
import { ZodValidationPipe } from '../common/zod-validation.pipe.js';
import { DeskService } from './desk.service.js';
import { ExamsService } from './exams.service.js';

const uuid = new ParseUUIDPipe({ errorHttpStatusCode: HttpStatus.NOT_FOUND });

@Controller('recalls')
export class RecallsController {
  constructor(
    private readonly desk: DeskService,
    private readonly exams: ExamsService,
  ) {}

  @Get('desk')
  @Allow('read', 'RecallExam')
  deskPage(
    @CurrentUser() user: SessionUser,
    @CurrentAbility() ability: AppAbility,
    @Query(new ZodValidationPipe(RecallDeskQuery)) query: RecallDeskQuery,
  ): Promise<RecallDeskReply> {
    return this.desk.page(ability, scopeOf(user), query);
  }

  @Get('desk/csv')
  @Audit('export')
  @Allow('read', 'RecallExam')
  async deskCsv(
    @CurrentUser() user: SessionUser,
    @CurrentAbility() ability: AppAbility,
    @Query(new ZodValidationPipe(RecallDeskCsvQuery)) query: RecallDeskCsvQuery,
  ): Promise<StreamableFile> {
    return new StreamableFile(await this.desk.csv(ability, scopeOf(user), query), {
      type: 'text/csv; charset=utf-8',
      disposition: 'attachment; filename="recall-desk.csv"',
    });
  }

  @Get('patients/:id/exam-context')
  @Allow('read', 'RecallExam')
  context(
    @CurrentUser() user: SessionUser,
    @CurrentAbility() ability: AppAbility,
    @Param('id', uuid) id: string,
  ): Promise<ExamContext> {
    return this.exams.context(ability, scopeOf(user), id);
  }

  @Post('visits')
  @Allow('create', 'RecallExam')
  createVisit(
    @CurrentUser() user: SessionUser,
    @CurrentAbility() ability: AppAbility,
    @Body(new ZodValidationPipe(CreateVisitBody)) body: z.infer<typeof CreateVisitBody>,
  ): Promise<CreateVisitReply> {
    return this.exams.createVisit(ability, scopeOf(user), user, body);
  }

  @Post('exams/:id/amend')
  @Allow('amend', 'RecallExam')
  amend(
    @CurrentUser() user: SessionUser,
    @CurrentAbility() ability: AppAbility,
    @Param('id', uuid) id: string,
    @Body(new ZodValidationPipe(AmendExamBody)) body: z.infer<typeof AmendExamBody>,
  ): Promise<RecallExam> {
    return this.exams.amend(ability, scopeOf(user), user, id, body);
  }

  @Get('sites/:id/exams')
  @Allow('read', 'RecallExam')
  history(
    @CurrentUser() user: SessionUser,
    @CurrentAbility() ability: AppAbility,
    @Param('id', uuid) id: string,
  ): Promise<SiteExamHistory> {
    return this.exams.history(ability, scopeOf(user), id);
  }
}
