import { useMutation, useQueryClient } from '@tanstack/react-query';
import { standardResponseSchema, type StandardDetail, type StandardInput } from '../../../../shared/schemas/standards.schema';
import { api } from '../../../lib/api-client';
import { standardKeys } from './keys';

/** `POST /api/standards` (no id) or `PUT /api/standards/:id`. */
export async function saveStandard(input: StandardInput, id?: string): Promise<StandardDetail> {
  const res = id
    ? await api.put(`/api/standards/${id}`, input, { schema: standardResponseSchema })
    : await api.post('/api/standards', input, { schema: standardResponseSchema });
  return res.standard;
}

export function useSaveStandard(id?: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: StandardInput) => saveStandard(input, id),
    onSuccess: (s) => {
      qc.setQueryData(standardKeys.detail(s.id), s);
      void qc.invalidateQueries({ queryKey: standardKeys.all });
    },
  });
}
