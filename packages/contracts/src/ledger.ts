// Restoration ledger contracts (catalogue, planner, delivery, torque, complications, Timeline).
import type { RouteContract } from './route-contract.js';
import {
  CatalogueComponent,
  CataloguePlatform,
  CatalogueReply,
  CatalogueSystem,
  ComponentBody,
  ComponentPatch,
  PlatformBody,
  PlatformPatch,
  SystemBody,
  SystemPatch,
  Calibration,
  CalibrationBody,
  CalibrationListReply,
  ComponentVersionsReply,
  Wrench,
  WrenchBody,
  WrenchListReply,
  WrenchPatch,
  WrenchSettings,
} from './ledger-catalogue.js';
import {
  CantileverSettings,
  DeliveryBody,
  LabPrescriptionBody,
  LabPrescriptionSummary,
  PlanAmendmentBody,
  PlanBody,
  RestorableSitesReply,
  RestorationDetail,
  RestorationListReply,
} from './ledger-restorations.js';
import {
  Complication,
  ComplicationAmendmentBody,
  ComplicationBody,
  TimelineQuery,
  TimelineReply,
  TorqueAmendmentBody,
  TorqueBody,
  TorqueEvent,
} from './ledger-torque.js';

export * from './ledger-catalogue.js';
export * from './ledger-restorations.js';
export * from './ledger-torque.js';

const r = (
  method: RouteContract['method'],
  path: string,
  summary: string,
  extra: Partial<RouteContract> = {},
): RouteContract => ({ method, path, summary, signedIn: true, ...extra });

export const ledgerRoutes: RouteContract[] = [
  r(
    'get',
    '/catalogue',
    "The practice's component catalogue: systems, platforms, parts and their torque specifications",
    { reply: CatalogueReply },
  ),
  r('post', '/catalogue/systems', 'Add an implant system (practice admin)', {
    body: SystemBody,
    reply: CatalogueSystem,
  }),
  r('patch', '/catalogue/systems/:id', 'Correct an implant system (practice admin)', {
    body: SystemPatch,
    reply: CatalogueSystem,
  }),
  r('post', '/catalogue/platforms', 'Add a platform to a system (practice admin)', {
    body: PlatformBody,
    reply: CataloguePlatform,
  }),
  r('patch', '/catalogue/platforms/:id', 'Correct a platform (practice admin)', {
    body: PlatformPatch,
    reply: CataloguePlatform,
  }),
  r('post', '/catalogue/components', 'Add a part to a platform (practice admin)', {
    body: ComponentBody,
    reply: CatalogueComponent,
  }),
  r(
    'patch',
    '/catalogue/components/:id',
    'Edit a part: saves a new version; records keep the version they used; platform and kind stay fixed (practice admin)',
    { body: ComponentPatch, reply: CatalogueComponent },
  ),
  r('get', '/catalogue/components/:id/versions', 'Every version of a part, oldest first', {
    reply: ComponentVersionsReply,
  }),
  r('get', '/wrenches', "The practice's torque wrenches with their last calibration", { reply: WrenchListReply }),
  r('post', '/wrenches', 'Add a torque wrench (practice admin)', { body: WrenchBody, reply: Wrench }),
  r('patch', '/wrenches/:id', "Edit a torque wrench's label or type: saves a new version (practice admin)", {
    body: WrenchPatch,
    reply: Wrench,
  }),
  r('put', '/practice/wrench-settings', "Set the practice's wrench calibration interval in months (practice admin)", {
    body: WrenchSettings,
    reply: WrenchSettings,
  }),
  r(
    'get',
    '/practice/cantilever-settings',
    "The practice's cantilever limit (ratio to the A-P spread), for the planner",
    {
      reply: CantileverSettings,
    },
  ),
  r('put', '/practice/cantilever-settings', "Set the practice's cantilever limit (practice admin)", {
    body: CantileverSettings,
    reply: CantileverSettings,
  }),
  r('get', '/wrenches/:id/calibrations', "A torque wrench's calibration history, newest first", {
    reply: CalibrationListReply,
  }),
  r('post', '/wrenches/:id/calibrations', 'Record a calibration of a torque wrench (practice admin)', {
    body: CalibrationBody,
    reply: Calibration,
  }),
  r('get', '/patients/:id/restorable-sites', 'Implant sites of a patient with platform and axis, for the planner', {
    reply: RestorableSitesReply,
  }),
  r('get', '/patients/:id/restorations', 'Every restoration of a patient, amended versions included', {
    reply: RestorationListReply,
  }),
  r('post', '/restorations', 'Save a restoration plan; error Findings block it, warnings need acknowledgement', {
    body: PlanBody,
    reply: RestorationDetail,
  }),
  r('get', '/restorations/:id', 'One restoration with its sites, parts, Findings and lab prescriptions', {
    reply: RestorationDetail,
  }),
  r('post', '/restorations/:id/amendments', 'Amend a planned restoration: a new version superseding this one', {
    body: PlanAmendmentBody,
    reply: RestorationDetail,
  }),
  r(
    'post',
    '/restorations/:id/delivery',
    'Deliver: record each part with its lot, in one transaction; sites become restored',
    { body: DeliveryBody, reply: RestorationDetail, status: 200 },
  ),
  r(
    'post',
    '/restorations/:id/lab-prescriptions',
    'Generate the lab prescription PDF, store it and optionally e-mail it to the lab',
    { body: LabPrescriptionBody, reply: LabPrescriptionSummary },
  ),
  r('get', '/lab-prescriptions/:id/pdf', 'Download a lab prescription', { produces: 'application/pdf' }),
  r('post', '/torque-events', 'Log a torque on a part; the verdict is computed and stored with the rules version', {
    body: TorqueBody,
    reply: TorqueEvent,
  }),
  r('post', '/torque-events/:id/amendments', 'Amend a torque entry: a new version superseding it', {
    body: TorqueAmendmentBody,
    reply: TorqueEvent,
  }),
  r('post', '/complications', 'Record a complication at a site, optionally on a part', {
    body: ComplicationBody,
    reply: Complication,
  }),
  r('post', '/complications/:id/amendments', 'Amend a complication: a new version superseding it', {
    body: ComplicationAmendmentBody,
    reply: Complication,
  }),
  r('get', '/sites/:id/timeline', 'Every event of the site in time order, with the torque history per part', {
    query: TimelineQuery,
    reply: TimelineReply,
  }),
];
