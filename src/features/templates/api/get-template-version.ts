import { queryOptions, useQuery } from '@tanstack/react-query';
import { templateVersionResponseSchema, type TemplateVersion } from '../../../../shared/schemas/template.schema';
import { api } from '../../../lib/api-client';
import { templateKeys } from './keys';

/** `GET /api/templates/versions/:id`. */
export async function getTemplateVersion(id: string, signal?: AbortSignal): Promise<TemplateVersion> {
  return (await api.get(`/api/templates/versions/${id}`, { schema: templateVersionResponseSchema, signal })).version;
}

export const templateVersionQueryOptions = (id: string) =>
  queryOptions({ queryKey: templateKeys.version(id), queryFn: ({ signal }) => getTemplateVersion(id, signal) });

export const useTemplateVersion = (id: string) => useQuery(templateVersionQueryOptions(id));
