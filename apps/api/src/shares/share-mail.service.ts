// The surgeon's e-mail for each share change, through the API's job queue like every other mail:
// a notice row is written with the change, its send job (one per row: the singleton key) locks
// it, sends through SMTP and marks it sent only after SMTP accepted it; a failure is recorded and
// retried with back-off; a sweep every minute queues what is still pending. The mail names the
// practice and what was opened, never the patient: the surgeon signs in to see who it is.
import { Inject, Injectable } from '@nestjs/common';
import { ENV, type Env } from '../config/env.js';
import { DB, type Database } from '../db/database.js';
import { JobsService } from '../jobs/jobs.service.js';
import { MailService } from '../mail/mail.service.js';
import * as repo from './shares.repository.js';

const SEND_QUEUE = 'share-notice-send';
const SWEEP_QUEUE = 'share-notice-sweep';

interface SendJob {
  noticeId: string;
}

export type ShareNoticeOutcome = 'sent' | 'already-sent' | 'gone' | 'failed';

const SCOPE_WORDS = {
  placement: 'record and amend the placement',
  outcomes: 'read the restorations, recall findings, bone levels and radiographs',
} as const;

@Injectable()
export class ShareMailService {
  constructor(
    @Inject(ENV) env: Env,
    @Inject(DB) private readonly db: Database,
    private readonly jobs: JobsService,
    private readonly mail: MailService,
  ) {
    jobs.register<SendJob>({
      name: SEND_QUEUE,
      policy: 'exclusive',
      retryLimit: env.REMINDER_RETRY_LIMIT,
      retryDelay: env.REMINDER_RETRY_DELAY_S,
      pollingIntervalSeconds: 1,
      handle: async ({ noticeId }, { finalAttempt }) => {
        if ((await this.deliver(noticeId, finalAttempt)) === 'failed')
          throw new Error(`share notice ${noticeId} not sent; will retry`);
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

  async queue(noticeId: string): Promise<void> {
    await this.jobs.send(SEND_QUEUE, { noticeId } satisfies SendJob, noticeId);
  }

  async sweep(): Promise<void> {
    for (const { id } of await repo.listPendingNotices(this.db)) await this.queue(id);
  }

  /** Sends one notice at most once: locked for the send, marked sent only after SMTP accepted it. */
  deliver(noticeId: string, finalAttempt = false): Promise<ShareNoticeOutcome> {
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
