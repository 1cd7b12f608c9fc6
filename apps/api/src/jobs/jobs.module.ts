import { Global, Module } from '@nestjs/common';
import { JobsService } from './jobs.service.js';

/** The job queue, shared by every feature that sends mail or runs scheduled work. */
@Global()
@Module({ providers: [JobsService], exports: [JobsService] })
export class JobsModule {}
