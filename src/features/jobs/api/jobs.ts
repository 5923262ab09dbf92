/**
 * Fetchers, query options and hooks of /api/jobs (list, options, detail, checks, create, update, submit).
 * The customer list comes from the customers feature (`useCustomers`): one query per key, one shape.
 */
import { keepPreviousData, queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { jobListSchema, type CreateJob, type UpdateJob } from '../../../../shared/schemas/jobs.schema';
import { api } from '../../../lib/api-client';
import { jobKeys } from './keys';
import type { Checks, Job, JobDetail, JobOptions, Standard } from './types';

export type JobFilters = { status?: string; q?: string; customerId?: string; page?: number };

function qs(f: Record<string, unknown>) {
  const p = new URLSearchParams();
  for (const [k, v] of Object.entries(f)) if (v !== undefined && v !== '' && v !== null) p.set(k, String(v));
  const s = p.toString();
  return s ? `?${s}` : '';
}

export const jobsQueryOptions = (f: JobFilters) =>
  queryOptions({ queryKey: jobKeys.list(f), queryFn: ({ signal }) => api.get(`/api/jobs${qs(f)}`, { signal, schema: jobListSchema }), placeholderData: keepPreviousData });
export const useJobs = (f: JobFilters) => useQuery(jobsQueryOptions(f));

export const jobOptionsQueryOptions = () => queryOptions({ queryKey: jobKeys.options(), queryFn: ({ signal }) => api.get<JobOptions>('/api/jobs/options', { signal }) });
export const useJobOptions = () => useQuery(jobOptionsQueryOptions());

export const jobQueryOptions = (id: string) => queryOptions({ queryKey: jobKeys.detail(id), queryFn: ({ signal }) => api.get<JobDetail>(`/api/jobs/${id}`, { signal }) });
export const useJob = (id: string) => useQuery(jobQueryOptions(id));

export const checksQueryOptions = (id: string) => queryOptions({ queryKey: jobKeys.checks(id), queryFn: ({ signal }) => api.get<Checks>(`/api/jobs/${id}/checks`, { signal }) });
/** `enabled`: false for a job whose checks would say nothing (a closed job), or while its status is not known. */
export const useChecks = (id: string, enabled = true) => useQuery({ ...checksQueryOptions(id), enabled });

export const standardsQueryOptions = () => queryOptions({ queryKey: jobKeys.standards(), queryFn: ({ signal }) => api.get<{ standards: Standard[] }>('/api/jobs/reference-standards', { signal }), staleTime: 60_000 });
/** The whole register, for the budget editor's pickers; `enabled`: false where nothing is picked. */
export const useStandards = (enabled = true) => useQuery({ ...standardsQueryOptions(), enabled });

export function useCreateJob() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: (body: CreateJob) => api.post<{ job: Job }>('/api/jobs', body), onSuccess: () => qc.invalidateQueries({ queryKey: jobKeys.all }) });
}

export function useUpdateJob(id: string) {
  const qc = useQueryClient();
  return useMutation({ mutationFn: (body: UpdateJob) => api.patch<{ job: Job }>(`/api/jobs/${id}`, body), onSuccess: () => qc.invalidateQueries({ queryKey: jobKeys.all }) });
}

export function useSubmitJob(id: string) {
  const qc = useQueryClient();
  return useMutation({ mutationFn: () => api.post<{ job: Job }>(`/api/jobs/${id}/submit`), onSettled: () => qc.invalidateQueries({ queryKey: jobKeys.all }) });
}
