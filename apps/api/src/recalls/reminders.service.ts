// Recall reminder e-mails through a job queue on PostgreSQL (pg-boss, schema `pgboss`), started
// and stopped with the API. The daily scan logs each reminder once in reminder_log (the
// idempotency key per patient, recall date and kind is unique) and queues one send job per
// unsent row; the send job locks the row, sends through SMTP and marks it sent only after SMTP
// accepted the message. A failed send is recorded and retried with exponential back-off; a retry
// or a second scan of a key already sent does nothing.
import { Inject, Injectable, Logger, type OnApplicationShutdown, type OnModuleInit } from '@nestjs/common';
import { remindersDue } from '@torquetrail/domain';
import { PgBoss, type Job } from 'pg-boss';
import { ENV, type Env } from '../config/env.js';
import { DB, type Database } from '../db/database.js';
import { MailService } from '../mail/mail.service.js';
import { reminderKey } from './exam-rules.js';
import { RecallClock } from './recall-clock.js';
import {
  listScheduledRecalls,
  listUnsent,
  lockReminder,
  logReminders,
  markFailedAttempt,
  markSent,
} from './reminders.repository.js';

const SEND_QUEUE = 'recall-reminder-send';
const SCAN_QUEUE = 'recall-reminder-scan';

interface SendJob {
  reminderId: string;
}
interface ScanJob {
  today?: string;
}

export type DeliveryOutcome = 'sent' | 'already-sent' | 'gone' | 'no-address' | 'failed';

const longDate = (iso: string) =>
  new Date(`${iso}T00:00:00Z`).toLocaleDateString('en-GB', {
    day: 'numeric',
    month: 'long',
    year: 'numeric',
    timeZone: 'UTC',
  });

@Injectable()
export class RemindersService implements OnModuleInit, OnApplicationShutdown {
  private readonly logger = new Logger('RemindersService');
  private boss: PgBoss | null = null;

  constructor(
    @Inject(ENV) private readonly env: Env,
    @Inject(DB) private readonly db: Database,
    private readonly mail: MailService,
    private readonly clock: RecallClock,
  ) {}

  async onModuleInit(): Promise<void> {
    const boss = new PgBoss({ connectionString: this.env.DATABASE_URL, schema: 'pgboss', max: 3 });
    boss.on('error', (error: unknown) =>
      this.logger.error(`pg-boss: ${error instanceof Error ? error.message : String(error)}`),
    );
    await boss.start();
    this.boss = boss;
    const retry = {
      retryLimit: this.env.REMINDER_RETRY_LIMIT,
      retryDelay: this.env.REMINDER_RETRY_DELAY_S,
      retryBackoff: true,
    };
    // exclusive: at most one queued-or-active send job per reminder key.
    await this.ensureQueue(SEND_QUEUE, { policy: 'exclusive', ...retry });
    await this.ensureQueue(SCAN_QUEUE, { policy: 'standard', retryLimit: 3, retryDelay: 60, retryBackoff: true });
    await boss.work<SendJob>(SEND_QUEUE, { batchSize: 1, pollingIntervalSeconds: 1 }, (jobs) => this.handleSend(jobs));
    await boss.work<ScanJob>(SCAN_QUEUE, { batchSize: 1 }, async (jobs) => {
      for (const job of jobs) await this.scan(job.data?.today ?? this.clock.today());
    });
    await boss.schedule(SCAN_QUEUE, this.env.REMINDER_SCAN_CRON, {}, { tz: 'UTC' });
  }

  private async ensureQueue(
    name: string,
    options: { policy: string; retryLimit: number; retryDelay: number; retryBackoff: boolean },
  ) {
    const boss = this.boss!;
    if (await boss.getQueue(name)) {
      const { policy: _policy, ...rest } = options;
      await boss.updateQueue(name, rest);
    } else {
      await boss.createQueue(name, options);
    }
  }

  async onApplicationShutdown(): Promise<void> {
    const boss = this.boss;
    this.boss = null;
    if (boss) await boss.stop({ graceful: true, timeout: 5000, close: true });
  }

  /**
   * The daily scan for one day (all practices, or one): logs the reminders due and queues a send
   * job for every logged reminder of those keys that SMTP has not accepted yet.
   */
  async scan(today: string, practiceId?: string): Promise<{ today: string; logged: number; queued: number }> {
    const candidates = (await listScheduledRecalls(this.db, practiceId)).flatMap((r) =>
      remindersDue(r.dueOn, today, r).map((kind) => ({
        practiceId: r.practiceId,
        patientId: r.patientId,
        recallDueOn: r.dueOn,
        kind,
        idempotencyKey: reminderKey(r.patientId, r.dueOn, kind),
      })),
    );
    const logged = await logReminders(this.db, candidates);
    const unsent = await listUnsent(
      this.db,
      candidates.map((c) => c.idempotencyKey),
    );
    let queued = 0;
    for (const row of unsent) {
      const id = await this.requireBoss().send(SEND_QUEUE, { reminderId: row.id } satisfies SendJob, {
        singletonKey: row.idempotencyKey,
      });
      if (id) queued += 1;
    }
    return { today, logged, queued };
  }

  private requireBoss(): PgBoss {
    if (!this.boss) throw new Error('the reminder queue is not running');
    return this.boss;
  }

  /** pg-boss hands an array of jobs (batchSize 1 here); a thrown error fails the job and retries it. */
  private async handleSend(jobs: Job<SendJob>[]): Promise<void> {
    for (const job of jobs) {
      const outcome = await this.deliver(job.data.reminderId, job.retryCount >= this.env.REMINDER_RETRY_LIMIT);
      if (outcome === 'failed') throw new Error(`reminder ${job.data.reminderId} not accepted by SMTP; will retry`);
    }
  }

  /**
   * Sends one logged reminder at most once: the row is locked for the send, a row already sent
   * is left alone, and it is marked sent only after SMTP accepted the message.
   */
  async deliver(reminderId: string, finalAttempt = false): Promise<DeliveryOutcome> {
    return this.db.transaction(async (tx) => {
      const row = await lockReminder(tx, reminderId);
      if (!row) return 'gone';
      if (row.status === 'sent') return 'already-sent';
      if (!row.email) {
        await markFailedAttempt(tx, row.id, 'the patient has no e-mail address', true);
        return 'no-address';
      }
      const when = longDate(row.recall_due_on);
      const overdue = row.kind === 'overdue';
      try {
        const messageId = await this.mail.send({
          to: row.email,
          subject: overdue
            ? `Your implant maintenance visit was due on ${when}`
            : `Your implant maintenance visit is due on ${when}`,
          text: [
            `Dear ${row.given_name} ${row.family_name},`,
            '',
            overdue
              ? `your implant maintenance visit at ${row.practice_name} was due on ${when} (${row.recall_due_on}). Please call us to book it.`
              : `your next implant maintenance visit at ${row.practice_name} is due on ${when} (${row.recall_due_on}). Please call us to book it if you have not yet.`,
            '',
            'Regular maintenance helps keep your implants healthy.',
            '',
            row.practice_name,
          ].join('\n'),
          headers: { 'X-Torquetrail-Reminder-Key': row.idempotency_key, 'X-Torquetrail-Reminder-Id': row.id },
        });
        await markSent(tx, row.id, messageId);
        return 'sent';
      } catch (error) {
        await markFailedAttempt(tx, row.id, error instanceof Error ? error.message : String(error), finalAttempt);
        return 'failed';
      }
    });
  }
}
