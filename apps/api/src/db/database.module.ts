import { Global, Inject, Logger, Module, type OnApplicationShutdown } from '@nestjs/common';
import type pg from 'pg';
import { ENV, type Env } from '../config/env.js';
import { withDeadline } from '../common/with-deadline.js';
import { createDatabase, createPool, DB, PG_POOL } from './database.js';

@Global()
@Module({
  providers: [
    {
      provide: PG_POOL,
      inject: [ENV],
      useFactory: (env: Env) => {
        const logger = new Logger('Database');
        return createPool(env.DATABASE_URL, (error) => logger.warn(`idle connection lost: ${error.message}`));
      },
    },
    { provide: DB, inject: [PG_POOL], useFactory: (pool: pg.Pool) => createDatabase(pool) },
  ],
  exports: [DB, PG_POOL],
})
export class DatabaseModule implements OnApplicationShutdown {
  private readonly logger = new Logger('Database');

  constructor(@Inject(PG_POOL) private readonly pool: pg.Pool) {}

  /** Bounded: a connection still checked out on a socket an outage broke would hold `end` for ever. */
  async onApplicationShutdown(): Promise<void> {
    if ((await withDeadline(this.pool.end(), POOL_END_DEADLINE_MS)) === 'timed-out')
      this.logger.warn(
        `connection pool not closed within ${POOL_END_DEADLINE_MS / 1000} s (${this.pool.totalCount - this.pool.idleCount} in use); closing anyway`,
      );
  }
}

const POOL_END_DEADLINE_MS = 10_000;
