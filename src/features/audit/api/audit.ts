import { queryOptions, useMutation, useQuery } from '@tanstack/react-query';
import { auditFacetsSchema, auditPageSchema, auditVerifySchema } from '../../../../shared/schemas/audit.schema';
import { api } from '../../../lib/api-client';

export type AuditFilters = { entity?: string; actorId?: string; from?: string; to?: string; page: number; pageSize: number };

export const auditKeys = { all: ['audit'] as const, page: (f: AuditFilters) => [...auditKeys.all, 'page', f] as const, facets: () => [...auditKeys.all, 'facets'] as const };

export const auditQueryString = (f: Partial<AuditFilters>) =>
  new URLSearchParams(Object.entries(f).filter((e) => e[1] !== undefined && e[1] !== '').map(([k, v]) => [k, String(v)])).toString();

/** `GET /api/audit`: newest first, paged. */
export const auditPageQueryOptions = (f: AuditFilters) =>
  queryOptions({ queryKey: auditKeys.page(f), queryFn: ({ signal }) => api.get(`/api/audit?${auditQueryString(f)}`, { schema: auditPageSchema, signal }) });
export const useAuditPage = (f: AuditFilters) => useQuery(auditPageQueryOptions(f));

export const useAuditFacets = () => useQuery({ queryKey: auditKeys.facets(), queryFn: ({ signal }) => api.get('/api/audit/facets', { schema: auditFacetsSchema, signal }) });

/** `POST /api/audit/verify`: recompute the hash chain. */
export const useVerifyChain = () => useMutation({ mutationFn: () => api.post('/api/audit/verify', undefined, { schema: auditVerifySchema }) });

export const auditCsvUrl = (f: Partial<AuditFilters>) => {
  const rest = { ...f };
  delete rest.page;
  delete rest.pageSize;
  const qs = auditQueryString(rest);
  return `/api/audit/export.csv${qs ? `?${qs}` : ''}`;
};
