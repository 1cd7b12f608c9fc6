// The one job queue of the API: pg-boss on PostgreSQL (schema `pgboss`). Features register their
// queues (reminders, lab mails) while the app is built; the queue starts in the background once
// the app is up and keeps trying while PostgreSQL is away, so the API starts and answers 503
// meanwhile instead of refusing to start. Every queue's state lives in the database, so several
// API instances share it: a job runs on one of them, a schedule fires once.
import { Inject, Injectable, Logger, type OnApplicationBootstrap, type OnApplicationShutdown } from '@nestjs/common';
import { PgBoss, type Job, type JobResult } from 'pg-boss';
import { ENV, type Env } from '../config/env.js';
import { withDeadline } from '../common/with-deadline.js';

export interface QueueSpec<T extends object> {
  name: string;
  /** `exclusive`: at most one queued-or-active job per singleton key (one send per mail). */
  policy: 'standard' | 'exclusive';
  retryLimit: number;
  /** Seconds before the first retry; doubled at each retry (exponential back-off). */
  retryDelay: number;
  pollingIntervalSeconds?: number;
  /** A cron expression (UTC): the queue also gets an empty job on this schedule. */
  cron?: string;
  /** Throwing fails the job, which pg-boss retries until its limit. */
  handle: (data: T, attempt: { retryCount: number; finalAttempt: boolean }) => Promise<void>;
}

const FIRST_RETRY_MS = 500;
/**
 * Jobs a worker takes per fetch, handled one after another. pg-boss waits a polling interval
 * after every fetch unless it came back full (`burstWhenBatchFull`, which needs batches of two or
 * more): with one job per fetch a backlog drained at one job per interval, so a job queued behind
 * a few dozen others (previews of rows since gone, mails already sent) waited that many seconds.
 * Two keeps a worker from holding more than one job another instance could be doing.
 */
const JOBS_PER_FETCH = 2;
const LONGEST_RETRY_MS = 15_000;
/** Longest wait for the queue to stop at shutdown: its 5 s grace for running jobs, and some. */
const STOP_DEADLINE_MS = 10_000;

@Injectable()
export class JobsService implements OnApplicationBootstrap, OnApplicationShutdown {
  private readonly logger = new Logger('Jobs');
  private readonly specs: QueueSpec<object>[] = [];
  private boss: PgBoss | null = null;
  private stopping = false;
  private starting: Promise<void> | null = null;
  private wake: (() => void) | null = null;

  constructor(@Inject(ENV) private readonly env: Env) {}

  /** Called by a feature's service while the app is built (before it starts listening). */
  register<T extends object>(spec: QueueSpec<T>): void {
    this.specs.push(spec as QueueSpec<object>);
  }

  /**
   * The first attempt is awaited (with PostgreSQL up the queue runs before the app listens, as
   * before); when it fails the app starts anyway and the queue keeps trying in the background.
   */
  async onApplicationBootstrap(): Promise<void> {
    if (!(await this.tryStart())) this.starting = this.retryInBackground();
  }

  /** True once the queue runs; until then, sends wait in their tables (see each feature's sweep). */
  get running(): boolean {
    return this.boss !== null;
  }

  /** Resolves when the queue runs (tests, and callers that must wait for it). */
  async whenRunning(timeoutMs: number): Promise<void> {
    const end = Date.now() + timeoutMs;
    while (!this.boss) {
      if (this.stopping || Date.now() > end) throw new Error('the job queue is not running');
      await new Promise((r) => setTimeout(r, 100));
    }
  }

  /** Queues a job; null when the queue is not running yet or a job with the key is already queued. */
  async send(queue: string, data: object, singletonKey?: string): Promise<string | null> {
    if (!this.boss) return null;
    return this.boss.send(queue, data, singletonKey ? { singletonKey } : {});
  }

  private async retryInBackground(): Promise<void> {
    for (let wait = FIRST_RETRY_MS; !this.stopping; wait = Math.min(wait * 2, LONGEST_RETRY_MS)) {
      await new Promise<void>((resolve) => {
        const timer = setTimeout(resolve, wait);
        this.wake = () => {
          clearTimeout(timer);
          resolve();
        };
      });
      this.wake = null;
      if (this.stopping || (await this.tryStart())) return;
    }
  }

  private async tryStart(): Promise<boolean> {
    const boss = new PgBoss({ connectionString: this.env.DATABASE_URL, schema: 'pgboss', max: 3 });
    // Without a listener an 'error' (PostgreSQL restarting) would end the process; pg-boss's
    // workers keep polling and resume when the database answers again.
    boss.on('error', (error: unknown) =>
      this.logger.warn(`pg-boss: ${error instanceof Error ? error.message : String(error)}`),
    );
    try {
      await boss.start();
      for (const spec of this.specs) await this.startQueue(boss, spec);
    } catch (error) {
      this.logger.warn(
        `job queue not started, trying again shortly: ${error instanceof Error ? error.message : String(error)}`,
      );
      await boss.stop({ graceful: false, close: true }).catch(() => undefined);
      return false;
    }
    if (this.stopping) {
      await boss.stop({ graceful: false, close: true });
      return true;
    }
    this.boss = boss;
    this.logger.log(`job queue running (${this.specs.map((s) => s.name).join(', ')})`);
    return true;
  }

  private async startQueue(boss: PgBoss, spec: QueueSpec<object>): Promise<void> {
    const options = { retryLimit: spec.retryLimit, retryDelay: spec.retryDelay, retryBackoff: true };
    if (await boss.getQueue(spec.name)) await boss.updateQueue(spec.name, options);
    else await boss.createQueue(spec.name, { policy: spec.policy, ...options });
    await boss.work(
      spec.name,
      {
        batchSize: JOBS_PER_FETCH,
        burstWhenBatchFull: true,
        perJobResults: true,
        pollingIntervalSeconds: spec.pollingIntervalSeconds ?? 2,
      },
      // One at a time; each job settles on its own, so one failing retries only itself.
      async (jobs: Job[]): Promise<JobResult[]> => {
        const results: JobResult[] = [];
        for (const job of jobs) {
          try {
            await spec.handle(job.data ?? {}, {
              retryCount: job.retryCount,
              finalAttempt: job.retryCount >= spec.retryLimit,
            });
            results.push({ id: job.id, status: 'completed' });
          } catch (error) {
            results.push({
              id: job.id,
              status: 'failed',
              output: { message: error instanceof Error ? error.message : String(error) },
            });
          }
        }
        return results;
      },
    );
    if (spec.cron) await boss.schedule(spec.name, spec.cron, {}, { tz: 'UTC' });
  }

  async onApplicationShutdown(): Promise<void> {
    this.stopping = true;
    this.wake?.();
    // Bounded: after a database outage a worker's claim can wait on a connection that never
    // answers, and pg-boss's stop then waits for it past its own grace period.
    if ((await withDeadline(this.stopQueue(), STOP_DEADLINE_MS)) === 'timed-out')
      this.logger.warn(`job queue not stopped within ${STOP_DEADLINE_MS / 1000} s; closing anyway`);
  }

  private async stopQueue(): Promise<void> {
    await this.starting;
    const boss = this.boss;
    this.boss = null;
    if (boss) await boss.stop({ graceful: true, timeout: 5000, close: true });
  }
}
