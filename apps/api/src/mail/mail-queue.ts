// Every e-mail the API sends on a user's request goes the same way: a row is written with the
// request, its send job (one per row: the queue's singleton key) locks the row, sends through
// SMTP and marks it sent only after SMTP accepted it; a failed attempt is recorded and retried
// with exponential back-off (the reminders' settings: every mail waits for SMTP alike); a sweep
// every minute queues a job for any row still pending without one (the queue was not running
// when it was made, or a job was lost with the database). A feature supplies its rows and its
// delivery; this module owns the two queues.
import type { Env } from '../config/env.js';
import type { JobsService } from '../jobs/jobs.service.js';

/** What one delivery attempt came to; 'failed' is retried. */
export type MailOutcome = 'sent' | 'already-sent' | 'gone' | 'failed';

interface SendJob {
  mailId: string;
}

export interface MailQueueSpec {
  /** The queues are `<name>-send` and `<name>-sweep`. */
  name: string;
  /** The rows still waiting to be sent. */
  pending: () => Promise<{ id: string }[]>;
  /** Sends one row at most once (locked for the send). */
  deliver: (mailId: string, finalAttempt: boolean) => Promise<MailOutcome>;
}

export interface MailQueue {
  /** Queues the send of one row (nothing when its job is already queued). */
  queue(mailId: string): Promise<void>;
  /** Queues every pending row. */
  sweep(): Promise<void>;
}

/** Registers the send and sweep queues of one kind of mail (call while the app is built). */
export function registerMailQueue(jobs: JobsService, env: Env, spec: MailQueueSpec): MailQueue {
  const sendQueue = `${spec.name}-send`;
  const mailQueue: MailQueue = {
    queue: async (mailId) => {
      await jobs.send(sendQueue, { mailId } satisfies SendJob, mailId);
    },
    sweep: async () => {
      for (const { id } of await spec.pending()) await mailQueue.queue(id);
    },
  };
  jobs.register<SendJob>({
    name: sendQueue,
    policy: 'exclusive',
    retryLimit: env.REMINDER_RETRY_LIMIT,
    retryDelay: env.REMINDER_RETRY_DELAY_S,
    pollingIntervalSeconds: 1,
    handle: async ({ mailId }, { finalAttempt }) => {
      if ((await spec.deliver(mailId, finalAttempt)) === 'failed')
        throw new Error(`${spec.name} ${mailId} not sent; will retry`);
    },
  });
  jobs.register<object>({
    name: `${spec.name}-sweep`,
    policy: 'standard',
    retryLimit: 0,
    retryDelay: 60,
    cron: '* * * * *',
    handle: () => mailQueue.sweep(),
  });
  return mailQueue;
}
