import { queryOptions, useSuspenseQuery } from '@tanstack/react-query';
import { meSchema, type Me } from '../../../../shared/schemas/me.schema';
import { api } from '../../../lib/api-client';
import { sessionKeys } from './keys';

/** `GET /api/me`: the signed-in user, their role and the lab. 401 when signed out. */
export function getMe(signal?: AbortSignal): Promise<Me> {
  return api.get('/api/me', { schema: meSchema, signal });
}

export const meQueryOptions = () =>
  queryOptions({ queryKey: sessionKeys.me(), queryFn: ({ signal }) => getMe(signal), staleTime: 60_000 });

/** The signed-in user. Only inside /app, whose loader has already put it in the cache. */
export function useMe(): Me {
  return useSuspenseQuery(meQueryOptions()).data;
}
