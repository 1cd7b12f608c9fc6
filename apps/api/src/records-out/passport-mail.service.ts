// Implant passport e-mails through the API's job queue, like the lab prescriptions: a request is
// a row in passport_mails; its send job (one per row: the queue's singleton key) locks the row,
// reads the stored PDF, sends through SMTP and marks it sent only after SMTP accepted it. A
// failed attempt is recorded and retried with back-off; a row already sent is never sent again.
// A sweep every minute queues a job for any request still pending without one.
import { Inject, Injectable } from '@nestjs/common';
import { ENV, type Env } from '../config/env.js';
import { DB, type Database } from '../db/database.js';
import { JobsService } from '../jobs/jobs.service.js';
import { MailService } from '../mail/mail.service.js';
import { StorageService } from '../storage/storage.service.js';
import * as repo from './records-out.repository.js';
import { passportFilename } from './pdf-names.js';

const SEND_QUEUE = 'passport-mail-send';
const SWEEP_QUEUE = 'passport-mail-sweep';

interface SendJob {
  mailId: string;
}

export type PassportMailOutcome = 'sent' | 'already-sent' | 'gone' | 'failed';

@Injectable()
export class PassportMailService {
  constructor(
    @Inject(ENV) env: Env,
    @Inject(DB) private readonly db: Database,
    private readonly jobs: JobsService,
    private readonly mail: MailService,
    private readonly storage: StorageService,
  ) {
    jobs.register<SendJob>({
      name: SEND_QUEUE,
      policy: 'exclusive',
      retryLimit: env.REMINDER_RETRY_LIMIT,
      retryDelay: env.REMINDER_RETRY_DELAY_S,
      pollingIntervalSeconds: 1,
      handle: async ({ mailId }, { finalAttempt }) => {
        if ((await this.deliver(mailId, finalAttempt)) === 'failed')
          throw new Error(`passport mail ${mailId} not sent; will retry`);
      },
    });
    jobs.register<object>({
      name: SWEEP_QUEUE,
      policy: 'standard',
      retryLimit: 0,
      retryDelay: 60,
      cron: '* * * * *',
      handle: () => this.sweep(),
    });
  }

  /** Queues the send of a recorded request. */
  async queue(mailId: string): Promise<void> {
    await this.jobs.send(SEND_QUEUE, { mailId } satisfies SendJob, mailId);
  }

  async sweep(): Promise<void> {
    for (const { id } of await repo.listPendingPassportMails(this.db)) await this.queue(id);
  }

  /** Sends one request at most once: locked for the send, marked sent only after SMTP accepted it. */
  async deliver(mailId: string, finalAttempt = false): Promise<PassportMailOutcome> {
    return this.db.transaction(async (tx) => {
      const row = await repo.lockPassportMail(tx, mailId);
      if (!row) return 'gone';
      if (row.status === 'sent') return 'already-sent';
      try {
        const pdf = await this.storage.get(row.objectKey);
        const messageId = await this.mail.send({
          to: row.sentTo,
          subject: `Your implant passport from ${row.practiceName}`,
          text: `Dear ${row.givenName},\n\nas you asked, your implant passport is attached. Please keep it with your papers and show it to any dentist who treats you.\n\n${row.practiceName}`,
          attachments: [{ filename: passportFilename(row.chartNumber), content: pdf, contentType: 'application/pdf' }],
          headers: { 'X-Torquetrail-Passport-Mail': row.id },
        });
        await repo.markPassportMailSent(tx, row.id, messageId);
        return 'sent';
      } catch (error) {
        await repo.markPassportMailFailed(
          tx,
          row.id,
          error instanceof Error ? error.message : String(error),
          finalAttempt,
        );
        return 'failed';
      }
    });
  }
}
