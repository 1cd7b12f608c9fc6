import type { RecallDeskQuery } from '@torquetrail/contracts';

export type DeskParams = Partial<
  Pick<RecallDeskQuery, 'filter' | 'sort' | 'dir' | 'search' | 'archived' | 'page' | 'pageSize'>
>;

// Query keys of the recalls feature.
export const recallKeys = {
  all: ['recalls'] as const,
  desk: (params: DeskParams) => [...recallKeys.all, 'desk', params] as const,
  examContexts: () => [...recallKeys.all, 'exam-context'] as const,
  examContext: (patientId: string) => [...recallKeys.examContexts(), patientId] as const,
  siteExams: (siteId: string) => [...recallKeys.all, 'site-exams', siteId] as const,
  policy: () => [...recallKeys.all, 'policy'] as const,
  insertReview: () => [...recallKeys.all, 'insert-review'] as const,
  reminders: () => [...recallKeys.all, 'reminders'] as const,
};
