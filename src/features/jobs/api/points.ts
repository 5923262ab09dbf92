/** Fetchers and hooks of /api/points and /api/runs (point CRUD, readings, standards, calculation, Monte Carlo). */
import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { UpdatePoint } from '../../../../shared/schemas/jobs.schema';
import { api, ApiError } from '../../../lib/api-client';
import { jobKeys } from './keys';
import type { Point } from './types';

export type TypeAReply = { point: Point; typeA: { n: number; mean: number; s: number; u: number; dof: number; unit: string }; fileName: string | null; sha256: string | null; column: string | null };

export function useInvalidateJob(jobId: string) {
  const qc = useQueryClient();
  return () => qc.invalidateQueries({ queryKey: jobKeys.all }).then(() => qc.invalidateQueries({ queryKey: jobKeys.detail(jobId) }));
}

export function useAddPoint(jobId: string) {
  const done = useInvalidateJob(jobId);
  return useMutation({ mutationFn: (body: { nominalValue: number; nominalUnit?: string }) => api.post<{ point: Point }>(`/api/jobs/${jobId}/points`, body), onSuccess: done });
}

export function useRemovePoint(jobId: string) {
  const done = useInvalidateJob(jobId);
  return useMutation({ mutationFn: (pointId: string) => api.delete(`/api/points/${pointId}`), onSuccess: done });
}

export const savePoint = (pointId: string, body: UpdatePoint) => api.patch<{ point: Point }>(`/api/points/${pointId}`, body);
export const calculatePoint = (pointId: string) => api.post<{ point: Point }>(`/api/points/${pointId}/calculate`);
export const typedReadings = (pointId: string, symbol: string, body: { text: string; unit?: string }) => api.put<TypeAReply>(`/api/points/${pointId}/readings/${symbol}`, body);
export const fromStandard = (pointId: string, symbol: string, body: { standardId: string; valueIndex?: number }) =>
  api.put<{ point: Point; u: number }>(`/api/points/${pointId}/inputs/${symbol}/standard`, body);
export const startMonteCarlo = (pointId: string, body: { trials?: number; seed?: number }) => api.post<{ runId: string; trials: number; seed: number }>(`/api/points/${pointId}/monte-carlo`, body);
export const cancelRun = (runId: string) => api.delete(`/api/runs/${runId}`);

/** Multipart upload (the api client sends JSON only). */
export async function uploadReadings(pointId: string, symbol: string, file: File, opts: { column?: string; unit?: string }): Promise<TypeAReply & { kind: string }> {
  const form = new FormData();
  if (opts.column) form.set('column', opts.column);
  if (opts.unit) form.set('unit', opts.unit);
  form.set('file', file);
  const res = await fetch(`/api/points/${pointId}/readings/${symbol}/upload`, { method: 'POST', body: form, credentials: 'include', headers: { Accept: 'application/json' } });
  const body = await res.json().catch(() => null);
  if (!res.ok) {
    const e = body?.error;
    throw new ApiError(res.status, e?.code ?? `HTTP_${res.status}`, e?.message ?? 'The upload failed.', e?.issues ?? []);
  }
  return body;
}
