import { Global, Module } from '@nestjs/common';
import { AuditRecorder } from './audit-recorder.js';

/** The audit trail: recording (global, used by the ability guard and the interceptor) and the Audit page. */
@Global()
@Module({
  providers: [AuditRecorder],
  exports: [AuditRecorder],
})
export class AuditModule {}
