/** /api/mail: the outbox log with resend (quality managers, admins) and the local mailbox (admins). */
import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { mailboxSchema, outboxListSchema, type OutboxRow } from '../../../../shared/schemas/certificates-api.schema';
import { api } from '../../../lib/api-client';

export const mailKeys = { all: ['mail'] as const, outbox: () => [...mailKeys.all, 'outbox'] as const, mailbox: () => [...mailKeys.all, 'mailbox'] as const };

export async function getOutbox(signal?: AbortSignal): Promise<OutboxRow[]> {
  return (await api.get('/api/mail/outbox', { schema: outboxListSchema, signal })).messages;
}
export const outboxQueryOptions = () => queryOptions({ queryKey: mailKeys.outbox(), queryFn: ({ signal }) => getOutbox(signal), refetchInterval: 5_000 });
export const useOutbox = () => useQuery(outboxQueryOptions());

export const getMailbox = (signal?: AbortSignal) => api.get('/api/mail/mailbox', { schema: mailboxSchema, signal });
export const mailboxQueryOptions = () => queryOptions({ queryKey: mailKeys.mailbox(), queryFn: ({ signal }) => getMailbox(signal), refetchInterval: 5_000 });
export const useMailbox = (enabled: boolean) => useQuery({ ...mailboxQueryOptions(), enabled });

export function useResend() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: (id: string) => api.post(`/api/mail/outbox/${encodeURIComponent(id)}/resend`), onSettled: () => qc.invalidateQueries({ queryKey: mailKeys.all }) });
}
