// How a route's declarations become its audit row's action (issue 11): no route repeats it.
import { describe, expect, it } from 'vitest';
import { auditPlanFor, type RouteDeclarations } from './audit-plan.js';

const route = (over: Partial<RouteDeclarations>): RouteDeclarations => ({
  method: 'GET',
  path: '/api/things/:id',
  check: undefined,
  override: undefined,
  httpCode: undefined,
  ...over,
});

describe('audit plan of a route', () => {
  it('a GET on patient data is a read; a GET on the catalogue or of who-am-I is not audited', () => {
    expect(auditPlanFor(route({ check: { action: 'read', subject: 'ImplantSite' } }))).toMatchObject({
      action: 'read',
      recordType: 'ImplantSite',
      route: 'GET /things/:id',
      successStatus: 200,
      inTransaction: false,
    });
    expect(auditPlanFor(route({ check: { action: 'read', subject: 'Catalogue' } }))).toBeNull();
    expect(auditPlanFor(route({ check: { signedInOnly: true } }))).toBeNull();
    expect(auditPlanFor(route({}))).toBeNull();
  });

  it('every write is audited, its action following its subject, in its transaction', () => {
    const write = (
      action: 'create' | 'update' | 'amend',
      subject: 'Patient' | 'Catalogue' | 'User' | 'Share' | 'RecallPolicy',
    ) => auditPlanFor(route({ method: 'POST', check: { action, subject } }));
    expect(write('create', 'Patient')).toMatchObject({ action: 'create', successStatus: 201, inTransaction: true });
    expect(write('update', 'Patient')?.action).toBe('amend');
    expect(write('amend', 'Patient')?.action).toBe('amend');
    expect(write('update', 'Catalogue')?.action).toBe('catalogue-change');
    expect(write('create', 'User')?.action).toBe('invite');
    expect(write('update', 'User')?.action).toBe('role-change');
    expect(write('update', 'Share')?.action).toBe('share-change');
    expect(write('update', 'RecallPolicy')?.action).toBe('policy-change');
  });

  it('@Audit overrides where the two differ: downloads, sign-in on a public route', () => {
    expect(
      auditPlanFor(route({ check: { action: 'read', subject: 'Radiograph' }, override: { action: 'export' } })),
    ).toMatchObject({ action: 'export', recordType: 'Radiograph', inTransaction: false });
    expect(
      auditPlanFor(
        route({ method: 'POST', path: '/api/auth/sign-in', override: { action: 'sign-in' }, httpCode: 200 }),
      ),
    ).toMatchObject({ action: 'sign-in', successStatus: 200, inTransaction: false, route: 'POST /auth/sign-in' });
  });
});
