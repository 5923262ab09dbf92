import { useMutation, useQueryClient } from '@tanstack/react-query';
import { templateVersionResponseSchema, type TemplateDefinition, type TemplateVersion } from '../../../../shared/schemas/template.schema';
import { api } from '../../../lib/api-client';
import { templateKeys } from './keys';

/** `PUT /api/templates/versions/:id` (drafts only; 409 for a released version). */
export async function updateDraft(id: string, definition: TemplateDefinition): Promise<TemplateVersion> {
  return (await api.put(`/api/templates/versions/${id}`, { definition }, { schema: templateVersionResponseSchema })).version;
}

export function useUpdateDraft(id: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (definition: TemplateDefinition) => updateDraft(id, definition),
    onSuccess: (v) => {
      qc.setQueryData(templateKeys.version(id), v);
      return qc.invalidateQueries({ queryKey: templateKeys.list() });
    },
  });
}
