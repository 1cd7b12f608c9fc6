import { type CallHandler, type ExecutionContext, Injectable, type NestInterceptor } from '@nestjs/common';
import { catchError, from, mergeMap, Observable, throwError } from 'rxjs';
import { runInAudit } from '../common/audit-context.js';
import { AuditRecorder } from './audit-recorder.js';

/**
 * Global: every audited route (audit/audit-plan.ts) runs its handler inside an audit context, so
 * row checks and services can note what the request opened and changed; a read's row is written
 * before its reply leaves, a write's inside its transaction, a refusal's after the rollback.
 */
@Injectable()
export class AuditInterceptor implements NestInterceptor {
  constructor(private readonly recorder: AuditRecorder) {}

  intercept(context: ExecutionContext, next: CallHandler): Observable<unknown> {
    const audit = this.recorder.open(context);
    if (!audit) return next.handle();
    return new Observable((subscriber) =>
      runInAudit(audit, () =>
        next
          .handle()
          .pipe(
            mergeMap((value) => from(this.recorder.succeeded(audit).then(() => value))),
            catchError((error: unknown) =>
              from(this.recorder.refused(audit, error)).pipe(mergeMap(() => throwError(() => error))),
            ),
          )
          .subscribe(subscriber),
      ),
    );
  }
}
