// Fetchers, query options and hooks of the recall routes (one contract each, from @torquetrail/contracts).
import {
  CreateVisitReply,
  RecallExam,
  ExamContext,
  RecallDeskReply,
  RecallPolicyReply,
  ReminderLogReply,
  RunRemindersReply,
  SiteExamHistory,
  type AmendExamBody,
  type CreateVisitBody,
  type RecallPolicyBody,
} from '@torquetrail/contracts';
import { keepPreviousData, queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { apiRequest } from '../../../lib/api-client';
import { patientKeys } from '../../patients';
import { siteKeys } from '../../site-file';
import { type DeskParams, recallKeys } from './keys';

export function deskSearch(params: DeskParams, withPaging = true): string {
  const q = new URLSearchParams();
  for (const [k, v] of Object.entries(params)) {
    if (v === undefined || v === '' || (!withPaging && (k === 'page' || k === 'pageSize'))) continue;
    q.set(k, String(v));
  }
  const text = q.toString();
  return text ? `?${text}` : '';
}

const deskQueryOptions = (params: DeskParams) =>
  queryOptions({
    queryKey: recallKeys.desk(params),
    queryFn: ({ signal }) => apiRequest(`/api/recalls/desk${deskSearch(params)}`, { schema: RecallDeskReply, signal }),
    placeholderData: keepPreviousData,
  });
export const useRecallDesk = (params: DeskParams) => useQuery(deskQueryOptions(params));

const examContextQueryOptions = (patientId: string) =>
  queryOptions({
    queryKey: recallKeys.examContext(patientId),
    queryFn: ({ signal }) =>
      apiRequest(`/api/recalls/patients/${encodeURIComponent(patientId)}/exam-context`, {
        schema: ExamContext,
        signal,
      }),
  });
export const useExamContext = (patientId: string) => useQuery(examContextQueryOptions(patientId));

const siteExamsQueryOptions = (siteId: string) =>
  queryOptions({
    queryKey: recallKeys.siteExams(siteId),
    queryFn: ({ signal }) =>
      apiRequest(`/api/recalls/sites/${encodeURIComponent(siteId)}/exams`, { schema: SiteExamHistory, signal }),
  });
export const useSiteExams = (siteId: string) => useQuery(siteExamsQueryOptions(siteId));

export function useCreateVisit() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (body: CreateVisitBody) =>
      apiRequest('/api/recalls/visits', { method: 'POST', body, schema: CreateVisitReply }),
    onSuccess: () => {
      void client.invalidateQueries({ queryKey: recallKeys.all });
      void client.invalidateQueries({ queryKey: patientKeys.all });
      void client.invalidateQueries({ queryKey: siteKeys.all });
    },
  });
}

const policyQueryOptions = () =>
  queryOptions({
    queryKey: recallKeys.policy(),
    queryFn: ({ signal }) => apiRequest('/api/recalls/policy', { schema: RecallPolicyReply, signal }),
  });
export const useRecallPolicy = () => useQuery(policyQueryOptions());

export function useUpdatePolicy() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (body: RecallPolicyBody) =>
      apiRequest('/api/recalls/policy', { method: 'PUT', body, schema: RecallPolicyReply }),
    onSuccess: (data) => client.setQueryData(recallKeys.policy(), data),
  });
}

const reminderLogQueryOptions = () =>
  queryOptions({
    queryKey: recallKeys.reminders(),
    queryFn: ({ signal }) => apiRequest('/api/recalls/reminders', { schema: ReminderLogReply, signal }),
  });
export const useReminderLog = () => useQuery(reminderLogQueryOptions());

export function useRunReminders() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: () => apiRequest('/api/recalls/reminders/run', { method: 'POST', body: {}, schema: RunRemindersReply }),
    // The queue sends within seconds; refresh the log a little later as well.
    onSuccess: () => {
      void client.invalidateQueries({ queryKey: recallKeys.reminders() });
      setTimeout(() => void client.invalidateQueries({ queryKey: recallKeys.reminders() }), 3000);
    },
  });
}

export function useAmendExam() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: ({ examId, body }: { examId: string; body: AmendExamBody }) =>
      apiRequest(`/api/recalls/exams/${encodeURIComponent(examId)}/amend`, {
        method: 'POST',
        body,
        schema: RecallExam,
      }),
    onSuccess: () => {
      void client.invalidateQueries({ queryKey: recallKeys.all });
      void client.invalidateQueries({ queryKey: patientKeys.all });
      void client.invalidateQueries({ queryKey: siteKeys.all });
    },
  });
}
