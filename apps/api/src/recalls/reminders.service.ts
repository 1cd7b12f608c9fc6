// Recall reminder e-mails through the API's job queue (jobs/jobs.service.ts, pg-boss). The daily scan logs each reminder once in reminder_log (the
// idempotency key per patient, recall date and kind is unique) and queues one send job per
// unsent row; the send job locks the row, sends through SMTP and marks it sent only after SMTP
// accepted the message. A failed send is recorded and retried with exponential back-off; a retry
// or a second scan of a key already sent does nothing.
import { Inject, Injectable } from '@nestjs/common';
import { remindersDue } from '@torquetrail/domain';
import { ENV, type Env } from '../config/env.js';
import { reportChange } from '../common/audit-context.js';
import { datePrinter } from '../common/printed-dates.js';
import { auditedTransaction } from '../db/audited-transaction.js';
import { DB, type Database } from '../db/database.js';
import { JobsService } from '../jobs/jobs.service.js';
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
  markWithheld,
} from './reminders.repository.js';

const SEND_QUEUE = 'recall-reminder-send';
const SCAN_QUEUE = 'recall-reminder-scan';

interface SendJob {
  reminderId: string;
}
interface ScanJob {
  today?: string;
}

export type DeliveryOutcome = 'sent' | 'already-sent' | 'gone' | 'no-address' | 'withheld' | 'failed';

@Injectable()
export class RemindersService {
  constructor(
    @Inject(ENV) private readonly env: Env,
    @Inject(DB) private readonly db: Database,
    private readonly mail: MailService,
    private readonly clock: RecallClock,
    private readonly jobs: JobsService,
  ) {
    jobs.register<SendJob>({
      name: SEND_QUEUE,
      policy: 'exclusive',
      retryLimit: env.REMINDER_RETRY_LIMIT,
      retryDelay: env.REMINDER_RETRY_DELAY_S,
      pollingIntervalSeconds: 1,
      handle: async ({ reminderId }, { finalAttempt }) => {
        const outcome = await this.deliver(reminderId, finalAttempt);
        if (outcome === 'failed') throw new Error(`reminder ${reminderId} not accepted by SMTP; will retry`);
      },
    });
    jobs.register<ScanJob>({
      name: SCAN_QUEUE,
      policy: 'standard',
      retryLimit: 3,
      retryDelay: 60,
      cron: env.REMINDER_SCAN_CRON,
      handle: async ({ today }) => {
        await this.scan(today ?? this.clock.today());
      },
    });
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
    const logged = await auditedTransaction(this.db, async (tx) => {
      const count = await logReminders(tx, candidates);
      reportChange({ type: 'Reminder', after: { today, logged: count } });
      return count;
    });
    const unsent = await listUnsent(
      this.db,
      candidates.map((c) => c.idempotencyKey),
    );
    // While the queue is not running yet (PostgreSQL just back) the rows stay pending; the next
    // scan queues them (the singleton key keeps one job per key).
    let queued = 0;
    for (const row of unsent) {
      const id = await this.jobs.send(SEND_QUEUE, { reminderId: row.id } satisfies SendJob, row.idempotencyKey);
      if (id) queued += 1;
    }
    return { today, logged, queued };
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
      // Logged before the patient was archived or withdrew consent: it stops here, at send time.
      if (row.archived || !row.consent) {
        await markWithheld(tx, row.id, row.archived ? 'the patient is archived' : 'no consent to e-mail reminders');
        return 'withheld';
      }
      if (!row.email) {
        await markFailedAttempt(tx, row.id, 'the patient has no e-mail address', true);
        return 'no-address';
      }
      // In the practice's order, in words where it has them; never the stored YYYY-MM-DD beside
      // it, which a month-day-year reader could take the wrong way round (issue 15 §7).
      const words = datePrinter(row.date_format).longDate(row.recall_due_on);
      const overdue = row.kind === 'overdue';
      try {
        const messageId = await this.mail.send({
          to: row.email,
          subject: overdue
            ? `Your implant maintenance visit was due on ${words}`
            : `Your implant maintenance visit is due on ${words}`,
          text: [
            `Dear ${row.given_name} ${row.family_name},`,
            '',
            overdue
              ? `your implant maintenance visit at ${row.practice_name} was due on ${words}. Please call us to book it.`
              : `your next implant maintenance visit at ${row.practice_name} is due on ${words}. Please call us to book it if you have not yet.`,
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
