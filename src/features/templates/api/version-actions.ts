/**
 * The version actions of a quality manager: validate (dry run), release, new version from,
 * retire. One endpoint each under /api/templates/versions/:id/….
 */
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { templateVersionResponseSchema, validationResponseSchema, type TemplateVersion, type ValidationRecord } from '../../../../shared/schemas/template.schema';
import { api } from '../../../lib/api-client';
import { templateKeys } from './keys';

export async function validateVersion(id: string): Promise<ValidationRecord> {
  return (await api.post(`/api/templates/versions/${id}/validate`, undefined, { schema: validationResponseSchema })).validation;
}
export async function releaseVersion(id: string): Promise<TemplateVersion> {
  return (await api.post(`/api/templates/versions/${id}/release`, undefined, { schema: templateVersionResponseSchema })).version;
}
export async function newVersionFrom(id: string): Promise<TemplateVersion> {
  return (await api.post(`/api/templates/versions/${id}/new-version`, undefined, { schema: templateVersionResponseSchema })).version;
}
export async function retireVersion(id: string): Promise<TemplateVersion> {
  return (await api.post(`/api/templates/versions/${id}/retire`, undefined, { schema: templateVersionResponseSchema })).version;
}

function useVersionMutation<T>(id: string, fn: (id: string) => Promise<T>) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: () => fn(id),
    onSettled: async (data) => {
      // A refused release stores its record with the draft: refetch either way.
      await qc.invalidateQueries({ queryKey: templateKeys.version(id) });
      if (data && typeof data === 'object' && 'id' in data && 'definition' in data) qc.setQueryData(templateKeys.version((data as unknown as TemplateVersion).id), data as unknown as TemplateVersion);
      await qc.invalidateQueries({ queryKey: templateKeys.list() });
    },
  });
}

export const useValidateVersion = (id: string) => useVersionMutation(id, validateVersion);
export const useReleaseVersion = (id: string) => useVersionMutation(id, releaseVersion);
export const useNewVersionFrom = (id: string) => useVersionMutation(id, newVersionFrom);
export const useRetireVersion = (id: string) => useVersionMutation(id, retireVersion);
