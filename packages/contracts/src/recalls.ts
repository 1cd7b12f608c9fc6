// Maintenance recall contracts (Recall desk, exams, policy, reminders).
import type { RouteContract } from './route-contract.js';

export const recallRoutes: RouteContract[] = [];
