// Restoration ledger contracts (catalogue, planner, delivery, torque, complications, Timeline).
import type { RouteContract } from './route-contract.js';

export const ledgerRoutes: RouteContract[] = [];
