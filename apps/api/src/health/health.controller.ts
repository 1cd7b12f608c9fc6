import { Controller, Get, Inject } from '@nestjs/common';
import { sql } from 'drizzle-orm';
import type { HealthReply, ServiceState } from '@torquetrail/contracts';
import { Public } from '../common/public.decorator.js';
import { DB, type Database } from '../db/database.js';
import { MailService } from '../mail/mail.service.js';
import { StorageService } from '../storage/storage.service.js';

@Controller('health')
export class HealthController {
  constructor(
    @Inject(DB) private readonly db: Database,
    private readonly storage: StorageService,
    private readonly mail: MailService,
  ) {}

  /** Reports each backing service as up or down; never throws, so it answers even when they are down. */
  @Public()
  @Get()
  async check(): Promise<HealthReply> {
    const [database, objectStorage, mail] = await Promise.all([
      this.db.execute(sql`select 1`).then(() => true, () => false),
      this.storage.isUp(),
      this.mail.isUp(),
    ]);
    const state = (up: boolean): ServiceState => (up ? 'up' : 'down');
    return {
      status: state(database && objectStorage && mail),
      services: { database: state(database), objectStorage: state(objectStorage), mail: state(mail) },
    };
  }
}
