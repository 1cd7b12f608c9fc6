// Implant passport e-mails through the API's job queue, like the lab prescriptions: a request is
// a row in passport_mails; its send job (one per row: the queue's singleton key) locks the row,
// reads the stored PDF, sends through SMTP and marks it sent only after SMTP accepted it. A
// failed attempt is recorded and retried with back-off; a row already sent is never sent again.
// A sweep every minute queues a job for any request still pending without one.
import { Inject, Injectable } from '@nestjs/common';
import { ENV, type Env } from '../config/env.js';
import { DB, type Database } from '../db/database.js';
import { JobsService } from '../jobs/jobs.service.js';
import { type MailOutcome, type MailQueue, registerMailQueue } from '../mail/mail-queue.js';
import { MailService } from '../mail/mail.service.js';
import { StorageService } from '../storage/storage.service.js';
import * as repo from './records-out.repository.js';
import { passportFilename } from './pdf-names.js';

@Injectable()
export class PassportMailService {
  private readonly mailQueue: MailQueue;

  constructor(
    @Inject(ENV) env: Env,
    @Inject(DB) private readonly db: Database,
    jobs: JobsService,
    private readonly mail: MailService,
    private readonly storage: StorageService,
  ) {
    this.mailQueue = registerMailQueue(jobs, env, {
      name: 'passport-mail',
      pending: () => repo.listPendingPassportMails(this.db),
      deliver: (id, finalAttempt) => this.deliver(id, finalAttempt),
    });
  }

  /** Queues the send of a recorded request. */
  queue(mailId: string): Promise<void> {
    return this.mailQueue.queue(mailId);
  }

  sweep(): Promise<void> {
    return this.mailQueue.sweep();
  }

  /** Sends one request at most once: locked for the send, marked sent only after SMTP accepted it. */
  async deliver(mailId: string, finalAttempt = false): Promise<MailOutcome> {
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
