import { Global, Inject, Logger, Module, type OnApplicationShutdown } from '@nestjs/common';
import type pg from 'pg';
import { ENV, type Env } from '../config/env.js';
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
  constructor(@Inject(PG_POOL) private readonly pool: pg.Pool) {}

  async onApplicationShutdown(): Promise<void> {
    await this.pool.end();
  }
}
