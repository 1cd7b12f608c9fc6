import { BadRequestException, Body, Controller, Get, HttpCode, Inject, Post, Put } from '@nestjs/common';
import {
  RecallPolicyBody,
  type RecallPolicyReply,
  type ReminderLogReply,
  RunRemindersBody,
  type RunRemindersReply,
} from '@torquetrail/contracts';
import type { SessionUser } from '../auth/session-user.js';
import { Audit } from '../audit/audit.decorator.js';
import { Allow } from '../authz/check-ability.decorator.js';
import { CurrentUser } from '../common/current-user.decorator.js';
import { ZodValidationPipe } from '../common/zod-validation.pipe.js';
import { ENV, type Env } from '../config/env.js';
import { reportChange } from '../common/audit-context.js';
import { auditedTransaction } from '../db/audited-transaction.js';
import { DB, type Database } from '../db/database.js';
import { findPolicy, upsertPolicy } from './exams.repository.js';
import { RecallClock } from './recall-clock.js';
import { listReminderLog } from './reminders.repository.js';
import { RemindersService } from './reminders.service.js';

/** The practice's recall policy and the reminder machinery (practice admin). */
@Controller('recalls')
export class RecallAdminController {
  constructor(
    @Inject(DB) private readonly db: Database,
    @Inject(ENV) private readonly env: Env,
    private readonly reminders: RemindersService,
    private readonly clock: RecallClock,
  ) {}

  @Get('policy')
  @Allow('read', 'RecallPolicy')
  policy(@CurrentUser() user: SessionUser): Promise<RecallPolicyReply> {
    return findPolicy(this.db, user.practiceId);
  }

  @Put('policy')
  @Allow('update', 'RecallPolicy')
  async updatePolicy(
    @CurrentUser() user: SessionUser,
    @Body(new ZodValidationPipe(RecallPolicyBody)) body: RecallPolicyBody,
  ): Promise<RecallPolicyReply> {
    await auditedTransaction(this.db, async (tx) => {
      const before = await findPolicy(tx, user.practiceId);
      await upsertPolicy(tx, user.practiceId, user.id, body);
      reportChange({ type: 'RecallPolicy', before, after: body });
    });
    return findPolicy(this.db, user.practiceId);
  }

  @Post('reminders/run')
  @HttpCode(200)
  @Allow('update', 'RecallPolicy')
  // Running the scan logs reminders; it changes no policy.
  @Audit('create', 'Reminder')
  run(
    @CurrentUser() user: SessionUser,
    @Body(new ZodValidationPipe(RunRemindersBody)) body: RunRemindersBody,
  ): Promise<RunRemindersReply> {
    if (body.today && this.env.NODE_ENV === 'production') {
      throw new BadRequestException({
        message: 'today: only the real date is scanned in production',
        fields: { today: 'only the real date is scanned in production' },
      });
    }
    return this.reminders.scan(body.today ?? this.clock.today(), user.practiceId);
  }

  /** Decision: the reminder log is an audit of outgoing patient mail, so it follows AuditEntry (practice admin only). */
  @Get('reminders')
  @Allow('read', 'AuditEntry')
  async log(@CurrentUser() user: SessionUser): Promise<ReminderLogReply> {
    const rows = await listReminderLog(this.db, user.practiceId);
    return {
      items: rows.map((r) => ({ ...r, sentAt: r.sentAt?.toISOString() ?? null, createdAt: r.createdAt.toISOString() })),
    };
  }
}
