import { HttpException, Inject, Injectable, Logger, type ExecutionContext } from '@nestjs/common';
import { HTTP_CODE_METADATA } from '@nestjs/common/constants.js';
import { Reflector } from '@nestjs/core';
import type { Request } from 'express';
import { ABILITY_CHECK, type AbilityCheck } from '../authz/check-ability.decorator.js';
import { asAmendmentConflict } from '../common/amendment-conflict.js';
import { auditValues, type AuditContext, type AuditPlan } from '../common/audit-context.js';
import type { AuthedRequest } from '../common/current-user.decorator.js';
import { unavailableDependency } from '../common/unavailable.js';
import { recordAuditEvent } from '../db/audited-transaction.js';
import { DB, type Database } from '../db/database.js';
import { AUDIT_OVERRIDE, type AuditOverride } from './audit.decorator.js';
import { auditPlanFor } from './audit-plan.js';

const USER_AGENT_MAX = 400;

/** The status an error will be answered with (the same mapping as HttpExceptionFilter). */
function statusOf(thrown: unknown): number {
  const error = asAmendmentConflict(thrown);
  if (error instanceof HttpException) return error.getStatus();
  return unavailableDependency(error) ? 503 : 500;
}

/**
 * Opens a request's audit context from its route's declarations and writes the rows the
 * interceptor and the ability guard ask for. Writes through the app's own role, which may only
 * insert (drizzle/0014_app-role.sql).
 */
@Injectable()
export class AuditRecorder {
  private readonly logger = new Logger('Audit');
  private readonly plans = new WeakMap<object, Map<string, AuditPlan | null>>();

  constructor(
    private readonly reflector: Reflector,
    @Inject(DB) private readonly db: Database,
  ) {}

  /** The request's audit context, or null when its route is not audited. */
  open(context: ExecutionContext): AuditContext | null {
    const req = context.switchToHttp().getRequest<Request & Partial<AuthedRequest>>();
    const plan = this.planOf(context, req);
    if (!plan) return null;
    const query = req.query && Object.keys(req.query).length > 0 ? (req.query as Record<string, unknown>) : null;
    return {
      plan,
      actor: req.user ? { userId: req.user.id, role: req.user.role, practiceId: req.user.practiceId } : null,
      // req.ip follows TRUST_PROXY: X-Forwarded-For only from a trusted proxy.
      address: req.ip ?? null,
      userAgent: req.get('user-agent')?.slice(0, USER_AGENT_MAX) ?? null,
      requestId: typeof req.id === 'string' ? req.id : null,
      query: plan.action === 'read' || plan.action === 'export' ? query : null,
      opened: [],
      change: null,
      written: false,
    };
  }

  /**
   * The route's audit plan, worked out on its first request and kept: it follows only from the
   * handler's declarations, its method and its path, none of which changes while the app runs.
   */
  private planOf(context: ExecutionContext, req: Request): AuditPlan | null {
    const handler = context.getHandler();
    const method = req.method;
    const path = (req.route as { path?: string } | undefined)?.path ?? req.path;
    // Keyed by method and path too: a handler may answer more than one (and an unmatched path is its own).
    const key = `${method} ${path}`;
    let plans = this.plans.get(handler);
    if (!plans) this.plans.set(handler, (plans = new Map()));
    if (plans.has(key)) return plans.get(key) ?? null;
    const targets = [handler, context.getClass()];
    const plan = auditPlanFor({
      method,
      path,
      check: this.reflector.getAllAndOverride<AbilityCheck | undefined>(ABILITY_CHECK, targets),
      override: this.reflector.getAllAndOverride<AuditOverride | undefined>(AUDIT_OVERRIDE, targets),
      httpCode: this.reflector.get<number | undefined>(HTTP_CODE_METADATA, handler),
    });
    // Only a route Express matched is kept: `req.path` of an unmatched request is whatever was asked.
    if (req.route) plans.set(key, plan);
    return plan;
  }

  /**
   * After the handler succeeded: a read or export writes its row now, before the reply leaves. A
   * write has written its row in its transaction; one whose service did not use
   * auditedTransaction still gets its row here (outside the transaction), and a warning says so.
   */
  async succeeded(context: AuditContext): Promise<void> {
    // A sign-out without a session names no one: nothing to record.
    if (context.written || (!context.actor && context.plan.action !== 'sign-in')) return;
    if (context.plan.inTransaction) {
      this.logger.warn(`${context.plan.route} ran no auditedTransaction: its audit row is written on its own`);
    }
    await recordAuditEvent(this.db, auditValues(context, 'allowed', context.plan.successStatus));
    context.written = true;
  }

  /** A refused or failed request: one row with the outcome, written outside the rolled-back work. */
  async refused(context: AuditContext, thrown: unknown): Promise<void> {
    const status = statusOf(thrown);
    // No session, no one to name: 401s of signed-in routes are the JWT guard's and stay in the logs.
    if (!context.actor && context.plan.action !== 'sign-in') return;
    try {
      await recordAuditEvent(this.db, auditValues(context, status >= 500 ? 'failed' : 'refused', status));
    } catch (error) {
      // The request already failed; its own error is the one to answer with.
      this.logger.warn(`could not record a refused ${context.plan.route}: ${(error as Error).message}`);
    }
  }
}
