import { queryOptions, useQuery } from '@tanstack/react-query';
import { standardListSchema } from '../../../../shared/schemas/standards.schema';
import { api } from '../../../lib/api-client';
import { standardKeys } from './keys';

export type StandardFilters = { kind?: string; status?: string; due?: string; q?: string };

/** `GET /api/standards`: the register with due-soon and overdue computed by the server's clock. */
export function getStandards(filters: StandardFilters, signal?: AbortSignal) {
  const params = new URLSearchParams(Object.entries(filters).filter((e): e is [string, string] => !!e[1]));
  const qs = params.toString();
  return api.get(`/api/standards${qs ? `?${qs}` : ''}`, { schema: standardListSchema, signal });
}

export const standardsQueryOptions = (filters: StandardFilters) =>
  queryOptions({ queryKey: standardKeys.list(filters), queryFn: ({ signal }) => getStandards(filters, signal) });

export const useStandards = (filters: StandardFilters) => useQuery(standardsQueryOptions(filters));
