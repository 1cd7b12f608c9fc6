import type { RouteContract } from './route-contract.js';
import { ledgerRoutes } from './ledger.js';
import { recallRoutes } from './recalls.js';
import { placementRoutes } from './placements.js';
import { radiographRoutes } from './radiographs.js';
import { auditRoutes } from './audit.js';
import { seatingRoutes } from './seating.js';
import { seatRestorationRoutes } from './seat-restoration.js';
import { impressionRoutes } from './impressions.js';
import { peopleRoutes } from './people.js';
import { outcomeRoutes } from './outcomes.js';
import { shareRoutes } from './shares.js';
import { recordsOutRoutes } from './records-out.js';
import { importRoutes } from './imports.js';
import { insertChangeRoutes } from './insert-changes.js';
import { Me, SignInBody } from './auth.js';
import { HealthReply, LivenessReply } from './health.js';
import { PatientDetail, PatientListQuery, PatientListReply, patientRoutes } from './patients.js';
import { SiteFile } from './sites.js';

/** Every API route, for the OpenAPI document and the test that checks nothing is left out. */
export const apiRoutes: RouteContract[] = [
  {
    method: 'get',
    path: '/health',
    summary:
      'Readiness (same as /health/ready): 200 when database and object storage are up, 503 when either is down; mail is reported',
    signedIn: false,
    reply: HealthReply,
  },
  {
    method: 'get',
    path: '/health/ready',
    summary: 'Readiness for a load balancer: 200 when database and object storage are up, 503 when either is down',
    signedIn: false,
    reply: HealthReply,
  },
  {
    method: 'get',
    path: '/health/live',
    summary: 'Liveness: the process answers (restart it when this fails)',
    signedIn: false,
    reply: LivenessReply,
  },
  {
    method: 'post',
    path: '/auth/sign-in',
    summary: 'Sign in with e-mail and password; sets the HttpOnly session cookie',
    signedIn: false,
    status: 200,
    body: SignInBody,
    reply: Me,
  },
  {
    method: 'post',
    path: '/auth/sign-out',
    summary: 'Sign out: clears the session cookie',
    signedIn: false,
    noContent: true,
  },
  {
    method: 'get',
    path: '/auth/me',
    summary: 'The signed-in user, their role, practice and shares',
    signedIn: true,
    reply: Me,
  },
  {
    method: 'get',
    path: '/patients',
    summary: "Patients of the user's practice and those shared with them",
    signedIn: true,
    query: PatientListQuery,
    reply: PatientListReply,
  },
  {
    method: 'get',
    path: '/patients/:id',
    summary: 'One patient with the implant sites for the Arch',
    signedIn: true,
    reply: PatientDetail,
  },
  {
    method: 'get',
    path: '/sites/:id',
    summary: 'The Site file: header, placement and the Stack',
    signedIn: true,
    reply: SiteFile,
  },
  ...patientRoutes,
  ...ledgerRoutes,
  ...peopleRoutes,
  ...outcomeRoutes,
  ...shareRoutes,
  ...recallRoutes,
  ...radiographRoutes,
  ...seatingRoutes,
  ...seatRestorationRoutes,
  ...impressionRoutes,
  ...placementRoutes,
  ...auditRoutes,
  ...recordsOutRoutes,
  ...importRoutes,
  ...insertChangeRoutes,
];

export type { RouteContract };
