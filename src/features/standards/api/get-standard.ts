import { queryOptions, useQuery } from '@tanstack/react-query';
import { standardResponseSchema, type StandardDetail } from '../../../../shared/schemas/standards.schema';
import { api } from '../../../lib/api-client';
import { standardKeys } from './keys';

/** `GET /api/standards/:id`. */
export async function getStandard(id: string, signal?: AbortSignal): Promise<StandardDetail> {
  return (await api.get(`/api/standards/${id}`, { schema: standardResponseSchema, signal })).standard;
}

export const standardQueryOptions = (id: string) => queryOptions({ queryKey: standardKeys.detail(id), queryFn: ({ signal }) => getStandard(id, signal) });

export const useStandard = (id: string) => useQuery({ ...standardQueryOptions(id), enabled: id !== '' });
