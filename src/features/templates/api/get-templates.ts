import { queryOptions, useQuery } from '@tanstack/react-query';
import { templateListResponseSchema, type TemplateSummary } from '../../../../shared/schemas/template.schema';
import { api } from '../../../lib/api-client';
import { templateKeys } from './keys';

/** `GET /api/templates`: every template with its latest version and the state of each version. */
export async function getTemplates(signal?: AbortSignal): Promise<TemplateSummary[]> {
  return (await api.get('/api/templates', { schema: templateListResponseSchema, signal })).templates;
}

export const templatesQueryOptions = () => queryOptions({ queryKey: templateKeys.list(), queryFn: ({ signal }) => getTemplates(signal) });

export const useTemplates = () => useQuery(templatesQueryOptions());
