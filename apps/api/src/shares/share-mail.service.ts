// The surgeon's e-mail for each share change, through the API's job queue like every other mail:
// a notice row is written with the change, its send job (one per row: the singleton key) locks
// it, sends through SMTP and marks it sent only after SMTP accepted it; a failure is recorded and
// retried with back-off; a sweep every minute queues what is still pending. The mail names the
// practice and what was opened, never the patient: the surgeon signs in to see who it is.
import { Inject, Injectable } from '@nestjs/common';
import { ENV, type Env } from '../config/env.js';
import { DB, type Database } from '../db/database.js';
import { JobsService } from '../jobs/jobs.service.js';
import { type MailOutcome, type MailQueue, registerMailQueue } from '../mail/mail-queue.js';
import { MailService } from '../mail/mail.service.js';
import * as repo from './shares.repository.js';

const SCOPE_WORDS = {
  placement: 'record and amend the placement',
  outcomes: 'read the restorations, recall findings, bone levels and radiographs',
} as const;

@Injectable()
export class ShareMailService {
  private readonly mailQueue: MailQueue;

  constructor(
    @Inject(ENV) env: Env,
    @Inject(DB) private readonly db: Database,
    jobs: JobsService,
    private readonly mail: MailService,
  ) {
    this.mailQueue = registerMailQueue(jobs, env, {
      name: 'share-notice',
      pending: () => repo.listPendingNotices(this.db),
      deliver: (id, finalAttempt) => this.deliver(id, finalAttempt),
    });
  }

  queue(noticeId: string): Promise<void> {
    return this.mailQueue.queue(noticeId);
  }

  sweep(): Promise<void> {
    return this.mailQueue.sweep();
  }

  /** Sends one notice at most once: locked for the send, marked sent only after SMTP accepted it. */
  deliver(noticeId: string, finalAttempt = false): Promise<MailOutcome> {
    return this.db.transaction(async (tx) => {
      const row = await repo.lockNotice(tx, noticeId);
      if (!row) return 'gone';
      if (row.status === 'sent') return 'already-sent';
      const what = row.scopes.map((s) => SCOPE_WORDS[s]).join(', and ');
      const sites = row.siteIds ? `${row.siteIds.length} chosen implant site(s)` : 'every implant site';
      const message =
        row.kind === 'shared'
          ? {
              subject: `${row.practiceName} shared a patient with you on Torquetrail`,
              text:
                `${row.practiceName} shared a patient with you: you may ${what} of ${sites}` +
                `${row.endsOn ? `, until ${row.endsOn} inclusive` : ', until the practice revokes the share'}.\n\n` +
                `Sign in to Torquetrail to see the patient under Patients.`,
            }
          : {
              subject: `${row.practiceName} ended a share on Torquetrail`,
              text: `${row.practiceName} revoked a patient's share with you: the patient is no longer open to you on Torquetrail.`,
            };
      try {
        await this.mail.send({
          to: row.to,
          subject: message.subject,
          text: `Dear ${row.surgeonName},\n\n${message.text}\n`,
          headers: { 'X-Torquetrail-Share-Notice': `${row.kind}:${row.id}` },
        });
      } catch (error) {
        await repo.markNoticeFailed(tx, noticeId, error instanceof Error ? error.message : String(error), finalAttempt);
        return 'failed';
      }
      await repo.markNoticeSent(tx, noticeId);
      return 'sent';
    });
  }
}
