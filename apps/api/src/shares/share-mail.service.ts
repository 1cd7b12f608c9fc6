// The surgeon's e-mail for each share change: a notice row is written with the change and sent
// through the shared mail queue (mail/mail-queue.ts: locked, sent once, retried with back-off,
// swept every minute). The mail names the practice and what was opened, never the patient: the
// surgeon signs in to see who it is. Dates are written in the sharing practice's order (issue 15 §7).
import { Inject, Injectable } from '@nestjs/common';
import { datePrinter } from '../common/printed-dates.js';
import { ENV, type Env } from '../config/env.js';
import { DB, type Database } from '../db/database.js';
import { JobsService } from '../jobs/jobs.service.js';
import { MailQueue } from '../mail/mail-queue.js';
import { MailService, type OutgoingMail } from '../mail/mail.service.js';
import * as repo from './shares.repository.js';

type NoticeRow = NonNullable<Awaited<ReturnType<typeof repo.lockNotice>>>;

const SCOPE_WORDS = {
  placement: 'record and amend the placement',
  outcomes: 'read the restorations, recall findings, bone levels and radiographs',
} as const;

function noticeMail(row: NoticeRow): OutgoingMail {
  const what = row.scopes.map((s) => SCOPE_WORDS[s]).join(', and ');
  const sites = row.siteIds ? `${row.siteIds.length} chosen implant site(s)` : 'every implant site';
  const message =
    row.kind === 'shared'
      ? {
          subject: `${row.practiceName} shared a patient with you on Torquetrail`,
          text:
            `${row.practiceName} shared a patient with you: you may ${what} of ${sites}` +
            `${row.endsOn ? `, until ${datePrinter(row.dateFormat).date(row.endsOn)} inclusive` : ', until the practice revokes the share'}.\n\n` +
            `Sign in to Torquetrail to see the patient under Patients.`,
        }
      : {
          subject: `${row.practiceName} ended a share on Torquetrail`,
          text: `${row.practiceName} revoked a patient's share with you: the patient is no longer open to you on Torquetrail.`,
        };
  return {
    to: row.to,
    subject: message.subject,
    text: `Dear ${row.surgeonName},\n\n${message.text}\n`,
    headers: { 'X-Torquetrail-Share-Notice': `${row.kind}:${row.id}` },
  };
}

@Injectable()
export class ShareMailService {
  private readonly notices: MailQueue<NoticeRow>;

  constructor(@Inject(ENV) env: Env, @Inject(DB) db: Database, jobs: JobsService, mail: MailService) {
    this.notices = new MailQueue(
      { env, db, jobs, mail },
      {
        name: 'share-notice',
        lock: repo.lockNotice,
        pending: repo.listPendingNotices,
        compose: noticeMail,
        markSent: (tx, row) => repo.markNoticeSent(tx, row.id),
        markFailed: (tx, row, error, finalAttempt) => repo.markNoticeFailed(tx, row.id, error, finalAttempt),
      },
    );
  }

  queue(noticeId: string): Promise<void> {
    return this.notices.queue(noticeId);
  }
}
