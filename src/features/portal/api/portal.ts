/** /api/portal: the signed-in customer's own certificates. */
import { queryOptions, useQuery } from '@tanstack/react-query';
import { certificateListSchema, type CertificateRow } from '../../../../shared/schemas/certificates-api.schema';
import { api } from '../../../lib/api-client';

export const portalKeys = { all: ['portal'] as const, list: () => [...portalKeys.all, 'certificates'] as const };

export async function getMyCertificates(signal?: AbortSignal): Promise<CertificateRow[]> {
  return (await api.get('/api/portal/certificates', { schema: certificateListSchema, signal })).certificates;
}
export const myCertificatesQueryOptions = () => queryOptions({ queryKey: portalKeys.list(), queryFn: ({ signal }) => getMyCertificates(signal) });
export const useMyCertificates = () => useQuery(myCertificatesQueryOptions());
