import {
  Calibration,
  type CalibrationBody,
  Wrench,
  type WrenchBody,
  WrenchListReply,
  type WrenchPatch,
  WrenchSettings,
} from '@torquetrail/contracts';
import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { apiRequest } from '../../../lib/api-client';
import { wrenchKeys } from './keys';

const wrenchesQueryOptions = () =>
  queryOptions({
    queryKey: wrenchKeys.all,
    queryFn: ({ signal }) => apiRequest('/api/wrenches', { schema: WrenchListReply, signal }),
  });

export function useWrenches(enabled = true) {
  return useQuery({ ...wrenchesQueryOptions(), enabled });
}

/** Admin: add a wrench or edit its label or type (a new version); refreshes the wrench list only. */
export function useSaveWrench() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ id, body }: { id?: string; body: WrenchBody | WrenchPatch }) =>
      apiRequest(id ? `/api/wrenches/${id}` : '/api/wrenches', { method: id ? 'PATCH' : 'POST', body, schema: Wrench }),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: wrenchKeys.all }),
  });
}

/** Admin: add a calibration to a wrench's history (never overwrites an earlier one). */
export function useRecordCalibration() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ id, body }: { id: string; body: CalibrationBody }) =>
      apiRequest(`/api/wrenches/${id}/calibrations`, { method: 'POST', body, schema: Calibration }),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: wrenchKeys.all }),
  });
}

/** Admin: the practice's calibration interval; every wrench's due date and overdue flag follow it. */
export function useSaveWrenchSettings() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: WrenchSettings) =>
      apiRequest('/api/practice/wrench-settings', { method: 'PUT', body, schema: WrenchSettings }),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: wrenchKeys.all }),
  });
}
