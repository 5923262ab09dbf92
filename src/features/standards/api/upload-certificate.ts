import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiErrorSchema } from '../../../../shared/schemas/api-error.schema';
import { standardResponseSchema, type StandardDetail } from '../../../../shared/schemas/standards.schema';
import { ApiError } from '../../../lib/api-client';
import { standardKeys } from './keys';

/** `POST /api/standards/:id/certificate` (multipart, field "file"). The server checks the content is a PDF. */
export async function uploadCertificate(id: string, file: File): Promise<StandardDetail> {
  const form = new FormData();
  form.append('file', file, file.name);
  let res: Response;
  try {
    res = await fetch(`/api/standards/${id}/certificate`, { method: 'POST', body: form, credentials: 'include', headers: { Accept: 'application/json' } });
  } catch {
    throw new ApiError(0, 'NETWORK_ERROR', 'The server could not be reached. Check the connection and try again.');
  }
  const body: unknown = await res.json().catch(() => null);
  if (!res.ok) {
    const e = apiErrorSchema.safeParse(body);
    throw e.success ? new ApiError(res.status, e.data.error.code, e.data.error.message, e.data.error.issues ?? []) : new ApiError(res.status, `HTTP_${res.status}`, 'The upload failed.');
  }
  return standardResponseSchema.parse(body).standard;
}

export function useUploadCertificate(id: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (file: File) => uploadCertificate(id, file),
    onSuccess: (s) => {
      qc.setQueryData(standardKeys.detail(s.id), s);
      void qc.invalidateQueries({ queryKey: standardKeys.all });
    },
  });
}

export const certificateDownloadUrl = (id: string) => `/api/standards/${id}/certificate`;
