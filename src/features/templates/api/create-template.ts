import { useMutation, useQueryClient } from '@tanstack/react-query';
import { templateVersionResponseSchema, type TemplateVersion } from '../../../../shared/schemas/template.schema';
import { api } from '../../../lib/api-client';
import { templateKeys } from './keys';

/** `POST /api/templates` with a name: the server makes draft version 1 from a starter model. */
export async function createTemplate(name: string): Promise<TemplateVersion> {
  return (await api.post('/api/templates', { name }, { schema: templateVersionResponseSchema })).version;
}

export function useCreateTemplate() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: createTemplate,
    onSuccess: (v) => {
      qc.setQueryData(templateKeys.version(v.id), v);
      return qc.invalidateQueries({ queryKey: templateKeys.list() });
    },
  });
}
