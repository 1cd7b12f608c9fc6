import { Controller, Get, Inject, Res } from '@nestjs/common';
import type { Response } from 'express';
import type { HealthReply, LivenessReply, ServiceState } from '@torquetrail/contracts';
import { Public } from '../common/public.decorator.js';
import { DB, type Database } from '../db/database.js';
import { MailService } from '../mail/mail.service.js';
import { StorageService } from '../storage/storage.service.js';
import { databaseAnswers } from './health.repository.js';

/**
 * Liveness and readiness, the usual split for an orchestrator or load balancer. Readiness needs
 * the database and object storage (no clinical work is possible without them); mail is reported
 * but not required, because every mail waits in the job queue until SMTP answers.
 */
@Controller('health')
export class HealthController {
  constructor(
    @Inject(DB) private readonly db: Database,
    private readonly storage: StorageService,
    private readonly mail: MailService,
  ) {}

  @Public()
  @Get('live')
  live(): LivenessReply {
    return { status: 'up' };
  }

  @Public()
  @Get(['', 'ready'])
  async ready(@Res({ passthrough: true }) res: Response): Promise<HealthReply> {
    const [database, objectStorage, mail] = await Promise.all([
      databaseAnswers(this.db),
      this.storage.isUp(),
      this.mail.isUp(),
    ]);
    const state = (up: boolean): ServiceState => (up ? 'up' : 'down');
    const ready = database && objectStorage;
    res.status(ready ? 200 : 503);
    return {
      status: state(ready),
      services: { database: state(database), objectStorage: state(objectStorage), mail: state(mail) },
    };
  }
}
