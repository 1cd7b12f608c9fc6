import type { LotLookupQuery, OutcomeGrouping } from '@torquetrail/contracts';

// Query keys of the outcomes feature (how the implants do, lot look-up, referral summary).
export const outcomesKeys = {
  all: ['outcomes'] as const,
  report: (groupBy: OutcomeGrouping, page: number) => [...outcomesKeys.all, 'report', groupBy, page] as const,
  lots: (query: LotLookupQuery) => [...outcomesKeys.all, 'lots', query] as const,
  referral: (patientId: string) => [...outcomesKeys.all, 'referral', patientId] as const,
};
