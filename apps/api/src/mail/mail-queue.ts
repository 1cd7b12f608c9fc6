// Every e-mail the practice sends on request goes the same way: the request is a row; its send job
// (the row id as the queue's singleton key) locks the row, composes the message, sends it through
// SMTP and marks the row sent only after SMTP accepted it. A failed attempt (SMTP or S3 away) is
// recorded and retried with back-off under the reminders' retry settings; a row already sent is
// never sent again. A sweep every minute queues a job for any request still pending without one
// (the queue was not running when it was made, or a job was lost with the database).
import type { Env } from '../config/env.js';
import type { Database, Tx } from '../db/database.js';
import type { JobsService } from '../jobs/jobs.service.js';
import type { MailService, OutgoingMail } from './mail.service.js';

export type MailOutcome = 'sent' | 'already-sent' | 'gone' | 'failed';

/** What one kind of mail supplies: how to find, compose and mark its request rows. */
export interface MailQueueSpec<Row extends { status: string }> {
  /** Names the two job queues: `<name>-send` and `<name>-sweep`. */
  name: string;
  /** The request row, locked for the send; undefined when it is gone. */
  lock: (tx: Tx, id: string) => Promise<Row | undefined>;
  /** The ids of the requests still waiting to be sent. */
  pending: (db: Database) => Promise<{ id: string }[]>;
  /** The message; a throw (e.g. the stored PDF unreadable) is a failed attempt, retried. */
  compose: (row: Row, tx: Tx) => Promise<OutgoingMail> | OutgoingMail;
  markSent: (tx: Tx, row: Row, messageId: string) => Promise<void>;
  markFailed: (tx: Tx, row: Row, error: string, finalAttempt: boolean) => Promise<void>;
}

/** Named `mailId` for every kind, as the lab and passport mails named it before this module. */
interface SendJob {
  mailId: string;
}

export class MailQueue<Row extends { status: string }> {
  private readonly sendQueue: string;

  constructor(
    private readonly deps: { env: Env; db: Database; jobs: JobsService; mail: MailService },
    private readonly spec: MailQueueSpec<Row>,
  ) {
    this.sendQueue = `${spec.name}-send`;
    deps.jobs.register<SendJob>({
      name: this.sendQueue,
      policy: 'exclusive',
      retryLimit: deps.env.REMINDER_RETRY_LIMIT,
      retryDelay: deps.env.REMINDER_RETRY_DELAY_S,
      pollingIntervalSeconds: 1,
      handle: async ({ mailId }, { finalAttempt }) => {
        if ((await this.deliver(mailId, finalAttempt)) === 'failed')
          throw new Error(`${spec.name} ${mailId} not sent; will retry`);
      },
    });
    deps.jobs.register<object>({
      name: `${spec.name}-sweep`,
      policy: 'standard',
      retryLimit: 0,
      retryDelay: 60,
      cron: '* * * * *',
      handle: () => this.sweep(),
    });
  }

  /** Queues the send of a recorded request (after its transaction committed). */
  async queue(id: string): Promise<void> {
    await this.deps.jobs.send(this.sendQueue, { mailId: id } satisfies SendJob, id);
  }

  /** Queues a send job for every pending request (the singleton key skips those already queued). */
  async sweep(): Promise<void> {
    for (const { id } of await this.spec.pending(this.deps.db)) await this.queue(id);
  }

  /** Sends one request at most once: locked for the send, marked sent only after SMTP accepted it. */
  deliver(id: string, finalAttempt = false): Promise<MailOutcome> {
    return this.deps.db.transaction(async (tx) => {
      const row = await this.spec.lock(tx, id);
      if (!row) return 'gone';
      if (row.status === 'sent') return 'already-sent';
      let messageId: string;
      try {
        messageId = await this.deps.mail.send(await this.spec.compose(row, tx));
      } catch (error) {
        await this.spec.markFailed(tx, row, error instanceof Error ? error.message : String(error), finalAttempt);
        return 'failed';
      }
      await this.spec.markSent(tx, row, messageId);
      return 'sent';
    });
  }
}
