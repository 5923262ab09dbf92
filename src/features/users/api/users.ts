import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { invitationInfoSchema, userListSchema, type AcceptInvitationInput, type CreateUserInput, type UpdateUserInput } from '../../../../shared/schemas/users.schema';
import { api } from '../../../lib/api-client';

export const userKeys = { all: ['users'] as const, list: () => [...userKeys.all, 'list'] as const };

/** `GET /api/users` (admin). */
export const usersQueryOptions = () => queryOptions({ queryKey: userKeys.list(), queryFn: async ({ signal }) => (await api.get('/api/users', { schema: userListSchema, signal })).users });
export const useUsers = () => useQuery(usersQueryOptions());

function useUserChange<T>(send: (input: T) => Promise<unknown>) {
  const qc = useQueryClient();
  return useMutation({ mutationFn: send, onSuccess: () => qc.invalidateQueries({ queryKey: userKeys.all }) });
}

export const useInviteUser = () => useUserChange((input: CreateUserInput) => api.post('/api/users', input));
export const useUpdateUser = () => useUserChange(({ id, ...input }: UpdateUserInput & { id: string }) => api.patch(`/api/users/${id}`, input));
export const useUserAction = () => useUserChange(({ id, action }: { id: string; action: 'deactivate' | 'reactivate' | 'reset-password' }) => api.post(`/api/users/${id}/${action}`));

/** `GET /api/invitations/:token` (public). */
export const useInvitation = (token: string) =>
  useQuery({
    queryKey: ['invitations', token],
    queryFn: async ({ signal }) => (await api.get(`/api/invitations/${encodeURIComponent(token)}`, { schema: z.object({ invitation: invitationInfoSchema }), signal })).invitation,
    enabled: token.length >= 20,
    retry: false,
  });

/** `POST /api/invitations/accept` (public). */
export const useAcceptInvitation = () => useMutation({ mutationFn: (input: AcceptInvitationInput) => api.post('/api/invitations/accept', input) });
