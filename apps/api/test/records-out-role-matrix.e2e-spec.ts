// Who may take which record out, across roles and practices (docs/authorization.md): the FHIR
// export is the dentist's and the admin's, the passport and the card the dentist's; another
// practice's patient is a 404, a role without the right 403.
import { afterAll, beforeAll, expect } from 'vitest';
import { all, describeRoleMatrix, type RoleCase } from './support/role-matrix.js';
import { patientId, startTestApp, type TestContext } from './support/test-app.js';

let ctx: TestContext;
beforeAll(async () => {
  ctx = await startTestApp();
});
afterAll(() => ctx.close());

const pdf = (res: { status: number; headers: Record<string, string> }) => {
  if (res.status === 200) expect(res.headers['content-type']).toBe('application/pdf');
};
const larkspur = async () => patientId(ctx.db, 'LL-1001');
const quarry = async () => patientId(ctx.db, 'QH-2001');
const matrix: RoleCase[] = [
  {
    route: 'GET /api/patients/:id/fhir (Larkspur, shared with the surgeon)',
    path: async () => `/api/patients/${await larkspur()}/fhir`,
    expect: all(403, { dentist: 200, practice_admin: 200, otherPracticeDentist: 404 }),
  },
  {
    route: 'GET /api/patients/:id/fhir (Quarry Hill)',
    path: async () => `/api/patients/${await quarry()}/fhir`,
    expect: all(403, { dentist: 404, practice_admin: 404, otherPracticeDentist: 200 }),
  },
  {
    route: 'GET /api/patients/:id/fhir (no such patient)',
    path: () => '/api/patients/00000000-0000-4000-8000-000000000000/fhir',
    expect: all(403, { dentist: 404, practice_admin: 404, otherPracticeDentist: 404 }),
  },
  ...(['passport.pdf', 'retrieval-card.pdf'] as const).flatMap((doc): RoleCase[] => [
    {
      route: `GET /api/patients/:id/${doc} (Larkspur)`,
      path: async () => `/api/patients/${await larkspur()}/${doc}`,
      expect: all(403, { dentist: 200, otherPracticeDentist: 404 }),
      check: pdf,
    },
    {
      route: `GET /api/patients/:id/${doc} (Quarry Hill)`,
      path: async () => `/api/patients/${await quarry()}/${doc}`,
      expect: all(403, { dentist: 404, otherPracticeDentist: 200 }),
      check: pdf,
    },
  ]),
  {
    route: 'GET /api/patients/:id/passport/mails (Quarry Hill)',
    path: async () => `/api/patients/${await quarry()}/passport/mails`,
    expect: all(403, { dentist: 404, otherPracticeDentist: 200 }),
  },
  {
    route: 'POST /api/patients/:id/passport/mails (Quarry Hill, from Larkspur)',
    method: 'post',
    path: async () => `/api/patients/${await quarry()}/passport/mails`,
    body: () => ({}),
    // Quarry Hill's own dentist may ask, but its seeded patients have no e-mail address: 409.
    expect: all(403, { dentist: 404, otherPracticeDentist: 409 }),
  },
];
describeRoleMatrix(() => ctx, matrix, { notFoundMessage: /^No such patient/ });
