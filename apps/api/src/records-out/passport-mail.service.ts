// Implant passport e-mails: a request is a row in passport_mails, sent through the shared mail
// queue (mail/mail-queue.ts: locked, sent once, retried with back-off, swept every minute).
import { Inject, Injectable } from '@nestjs/common';
import { ENV, type Env } from '../config/env.js';
import { DB, type Database } from '../db/database.js';
import { JobsService } from '../jobs/jobs.service.js';
import { MailQueue } from '../mail/mail-queue.js';
import { MailService } from '../mail/mail.service.js';
import { StorageService } from '../storage/storage.service.js';
import * as repo from './records-out.repository.js';
import { passportFilename } from './pdf-names.js';

type PassportMailRow = NonNullable<Awaited<ReturnType<typeof repo.lockPassportMail>>>;

@Injectable()
export class PassportMailService {
  private readonly mails: MailQueue<PassportMailRow>;

  constructor(
    @Inject(ENV) env: Env,
    @Inject(DB) db: Database,
    jobs: JobsService,
    mail: MailService,
    private readonly storage: StorageService,
  ) {
    this.mails = new MailQueue(
      { env, db, jobs, mail },
      {
        name: 'passport-mail',
        lock: repo.lockPassportMail,
        pending: repo.listPendingPassportMails,
        compose: async (row) => ({
          to: row.sentTo,
          subject: `Your implant passport from ${row.practiceName}`,
          text: `Dear ${row.givenName},\n\nas you asked, your implant passport is attached. Please keep it with your papers and show it to any dentist who treats you.\n\n${row.practiceName}`,
          attachments: [
            {
              filename: passportFilename(row.chartNumber),
              content: await this.storage.get(row.objectKey),
              contentType: 'application/pdf',
            },
          ],
          headers: { 'X-Torquetrail-Passport-Mail': row.id },
        }),
        markSent: (tx, row, messageId) => repo.markPassportMailSent(tx, row.id, messageId),
        markFailed: (tx, row, error, finalAttempt) => repo.markPassportMailFailed(tx, row.id, error, finalAttempt),
      },
    );
  }

  /** Queues the send of a recorded request. */
  queue(mailId: string): Promise<void> {
    return this.mails.queue(mailId);
  }
}
