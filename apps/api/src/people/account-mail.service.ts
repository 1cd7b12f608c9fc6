// One-time links by e-mail (invitations, password resets) through the API's job queue, like the
// other mail: a row first, then a send job (one per row and mail round: the singleton key). The
// job locks the row, makes the link's token (256 random bits), sends the mail, and only once SMTP
// accepted it stores the token's sha-256 with the expiry; a failure is recorded and retried with
// exponential back-off. So the token itself is never stored anywhere: not in
// the row, not in the job's data.
import { Inject, Injectable } from '@nestjs/common';
import type { DateFormat } from '@torquetrail/contracts';
import { datePrinter } from '../common/printed-dates.js';
import { ENV, type Env } from '../config/env.js';
import { DB, type Database } from '../db/database.js';
import { JobsService } from '../jobs/jobs.service.js';
import { MailService } from '../mail/mail.service.js';
import * as repo from './account.repository.js';
import { hashLinkToken, INVITATION_VALID_MS, newLinkToken, RESET_VALID_MS } from './link-token.js';

const SEND_QUEUE = 'account-link-mail-send';
const SWEEP_QUEUE = 'account-link-mail-sweep';

interface SendJob {
  kind: repo.LinkKind;
  id: string;
  /** Invitations: the mail round the job was queued for (a re-send starts a new one). */
  round?: number;
}

export type LinkMailOutcome = 'sent' | 'already-sent' | 'gone' | 'failed';

/** When a link stops working, in the practice's order of dates (issue 15 §7). */
const whenUtc = (d: Date, format: DateFormat) => datePrinter(format).instantUtc(d);

@Injectable()
export class AccountMailService {
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
      handle: async (job, { finalAttempt }) => {
        if ((await this.deliver(job, finalAttempt)) === 'failed')
          throw new Error(`${job.kind} mail ${job.id} not sent; will retry`);
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

  async queue(job: SendJob): Promise<void> {
    await this.jobs.send(SEND_QUEUE, job, `${job.kind}:${job.id}:${job.round ?? 0}`);
  }

  /** Queues a send for every link still waiting for its mail (queue down when it was asked for). */
  async sweep(): Promise<void> {
    const pending = await repo.listPendingLinkMails(this.db);
    for (const i of pending.invitations) await this.queue({ kind: 'invitation', id: i.id, round: i.round });
    for (const r of pending.resets) await this.queue({ kind: 'password-reset', id: r.id });
  }

  /** Sends one link at most once per round: locked for the send, live only after SMTP accepted it. */
  deliver(job: SendJob, finalAttempt = false): Promise<LinkMailOutcome> {
    return this.db.transaction(async (tx) => {
      const token = newLinkToken();
      let message: { to: string; subject: string; text: string; validMs: number };
      if (job.kind === 'invitation') {
        const row = await repo.lockInvitationMail(tx, job.id);
        if (!row || !row.open || (job.round !== undefined && job.round !== row.round)) return 'gone';
        if (row.mailStatus === 'sent') return 'already-sent';
        const expires = new Date(Date.now() + INVITATION_VALID_MS);
        const link = `${row.linkOrigin}/welcome#token=${token}`;
        const until = `the link works once, until ${whenUtc(expires, row.dateFormat)}`;
        // A referring surgeon invited by a share: the mail names the practice, never the patient.
        message = row.ownPractice
          ? {
              to: row.email,
              subject: `${row.practiceName} shared a patient with you on Torquetrail`,
              text:
                `${row.inviterName} of ${row.practiceName} shared a patient with you on Torquetrail, ` +
                `where your practice records and follows the implants it places.\n\n` +
                `Choose your name, your practice's name and a password here (${until}):\n${link}\n\n` +
                `Then sign in to see the patient under Patients. If you did not expect this, ` +
                `ignore this e-mail: nothing is opened without the link.`,
              validMs: INVITATION_VALID_MS,
            }
          : {
              to: row.email,
              subject: `Your invitation to ${row.practiceName} on Torquetrail`,
              text:
                `${row.inviterName} invites you to join ${row.practiceName} on Torquetrail.\n\n` +
                `Choose your name and password here (${until}):\n${link}\n\n` +
                `If you did not expect this invitation, ignore this e-mail: nothing happens without the link.`,
              validMs: INVITATION_VALID_MS,
            };
      } else {
        const row = await repo.lockResetMail(tx, job.id, RESET_VALID_MS);
        if (!row || !row.open || !row.fresh) return 'gone';
        if (row.mailStatus === 'sent') return 'already-sent';
        const expires = new Date(Date.now() + RESET_VALID_MS);
        message = {
          to: row.email,
          subject: 'Reset your Torquetrail password',
          text:
            `Someone (we hope you) asked to reset the password of ${row.email} on Torquetrail.\n\n` +
            `Choose a new password here (the link works once, until ${whenUtc(expires, row.dateFormat)}):\n` +
            `${row.linkOrigin}/reset-password#token=${token}\n\n` +
            `If you did not ask for this, ignore this e-mail: your password stays as it is.`,
          validMs: RESET_VALID_MS,
        };
      }
      try {
        await this.mail.send({
          to: message.to,
          subject: message.subject,
          text: message.text,
          headers: { 'X-Torquetrail-Link': `${job.kind}:${job.id}` },
        });
      } catch (error) {
        const reason = error instanceof Error ? error.message : String(error);
        await repo.markLinkMailFailed(tx, job.kind, job.id, reason, finalAttempt);
        return 'failed';
      }
      // Stored after SMTP accepted the mail: should this commit fail, the job runs again with a new token.
      await repo.markLinkMailed(tx, job.kind, job.id, hashLinkToken(token), new Date(Date.now() + message.validMs));
      return 'sent';
    });
  }
}
