/** /api/certificates (lab staff): the list, and opening an amendment (ISO/IEC 17025 §7.8.8). */
import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { amendResponseSchema, certificateListSchema, type CertificateRow } from '../../../../shared/schemas/certificates-api.schema';
import { api } from '../../../lib/api-client';

export const certificateKeys = { all: ['certificates'] as const, list: () => [...certificateKeys.all, 'list'] as const };

export async function getCertificates(signal?: AbortSignal): Promise<CertificateRow[]> {
  return (await api.get('/api/certificates', { schema: certificateListSchema, signal })).certificates;
}
export const certificatesQueryOptions = () => queryOptions({ queryKey: certificateKeys.list(), queryFn: ({ signal }) => getCertificates(signal) });
export const useCertificates = () => useQuery(certificatesQueryOptions());

export const amendCertificate = (id: string, reason: string) => api.post(`/api/certificates/${encodeURIComponent(id)}/amend`, { reason }, { schema: amendResponseSchema });

export function useAmendCertificate() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ id, reason }: { id: string; reason: string }) => amendCertificate(id, reason),
    onSettled: () => qc.invalidateQueries({ queryKey: certificateKeys.all }),
  });
}
