import { Global, Module } from '@nestjs/common';
import { AuditRecorder } from './audit-recorder.js';
import { AuditController } from './audit.controller.js';
import { AuditService } from './audit.service.js';

/** The audit trail: recording (global, used by the ability guard and the interceptor) and the Audit page. */
@Global()
@Module({
  controllers: [AuditController],
  providers: [AuditRecorder, AuditService],
  exports: [AuditRecorder],
})
export class AuditModule {}
