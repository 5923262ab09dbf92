/**
 * The signatory's endpoints under /api/review: the queue, one job's review page, reject, and
 * approve (signed with the password; issues the certificate). Grouped in one file: they share
 * their keys and every mutation refreshes the same two queries.
 */
import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { reviewDetailSchema, reviewQueueSchema, certificateRowSchema, type ReviewDetail, type ReviewQueueRow, type CertificateRow } from '../../../../shared/schemas/certificates-api.schema';
import { z } from 'zod';
import { api } from '../../../lib/api-client';

export const reviewKeys = {
  all: ['review'] as const,
  queue: () => [...reviewKeys.all, 'queue'] as const,
  job: (id: string) => [...reviewKeys.all, 'job', id] as const,
};

export async function getReviewQueue(signal?: AbortSignal): Promise<ReviewQueueRow[]> {
  return (await api.get('/api/review/queue', { schema: reviewQueueSchema, signal })).jobs;
}
export const reviewQueueQueryOptions = () => queryOptions({ queryKey: reviewKeys.queue(), queryFn: ({ signal }) => getReviewQueue(signal) });
export const useReviewQueue = () => useQuery(reviewQueueQueryOptions());

export async function getReview(jobId: string, signal?: AbortSignal): Promise<ReviewDetail> {
  return api.get(`/api/review/jobs/${encodeURIComponent(jobId)}`, { schema: reviewDetailSchema, signal });
}
export const reviewQueryOptions = (jobId: string) => queryOptions({ queryKey: reviewKeys.job(jobId), queryFn: ({ signal }) => getReview(jobId, signal) });
export const useReview = (jobId: string) => useQuery(reviewQueryOptions(jobId));

export const rejectJob = (jobId: string, comment: string) => api.post(`/api/review/jobs/${encodeURIComponent(jobId)}/reject`, { comment });
export async function approveJob(jobId: string, password: string): Promise<CertificateRow> {
  return (await api.post(`/api/review/jobs/${encodeURIComponent(jobId)}/approve`, { password }, { schema: z.object({ certificate: certificateRowSchema }) })).certificate;
}

function useReviewMutation<A, R>(jobId: string, fn: (a: A) => Promise<R>) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: fn,
    onSettled: async () => {
      await qc.invalidateQueries({ queryKey: reviewKeys.all });
      await qc.invalidateQueries({ queryKey: ['certificates'] });
    },
    meta: { jobId },
  });
}

export const useRejectJob = (jobId: string) => useReviewMutation(jobId, (comment: string) => rejectJob(jobId, comment));
export const useApproveJob = (jobId: string) => useReviewMutation(jobId, (password: string) => approveJob(jobId, password));
