/** /api/verify (public): check a PDF's bytes or look up a certificate number. */
import { useMutation } from '@tanstack/react-query';
import { verifyFileResponseSchema, verifyNumberResponseSchema, VERIFY_MAX_BYTES, type VerifyFileResponse, type VerifyNumberResponse } from '../../../../shared/schemas/certificates-api.schema';
import { ApiError, apiRequest } from '../../../lib/api-client';

export async function verifyFile(file: Blob): Promise<VerifyFileResponse> {
  if (file.size > VERIFY_MAX_BYTES) throw new ApiError(413, 'FILE_TOO_LARGE', `The file is larger than ${VERIFY_MAX_BYTES / 1024 / 1024} MB: choose the certificate PDF as issued.`);
  let res: Response;
  try {
    res = await fetch('/api/verify/file', { method: 'POST', headers: { 'Content-Type': 'application/pdf', Accept: 'application/json' }, body: file });
  } catch {
    throw new ApiError(0, 'NETWORK_ERROR', 'The server could not be reached. Check the connection and try again.');
  }
  const body = (await res.json().catch(() => null)) as { error?: { code: string; message: string } } | null;
  if (!res.ok) throw new ApiError(res.status, body?.error?.code ?? `HTTP_${res.status}`, body?.error?.message ?? 'The file could not be checked.');
  return verifyFileResponseSchema.parse(body);
}

export const verifyNumber = (number: string): Promise<VerifyNumberResponse> =>
  apiRequest(`/api/verify/number/${encodeURIComponent(number.trim())}`, { schema: verifyNumberResponseSchema });

export const useVerifyFile = () => useMutation({ mutationFn: verifyFile });
export const useVerifyNumber = () => useMutation({ mutationFn: verifyNumber });
