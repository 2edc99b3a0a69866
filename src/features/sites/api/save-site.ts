import { useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { siteDto, type CreateSiteInput, type SiteDto, type UpdateSiteInput } from '../../../../shared/schemas/sites';
import { apiClient } from '../../../lib/api-client';
import { queryRoots } from '../../../lib/query-roots';
import { siteKeys } from './keys';

const siteResponse = z.object({ site: siteDto });

export async function createSite(input: CreateSiteInput): Promise<SiteDto> {
  return siteResponse.parse(await apiClient.post('/api/sites', input)).site;
}

export async function updateSite({ id, changes }: { id: number; changes: UpdateSiteInput }): Promise<SiteDto> {
  return siteResponse.parse(await apiClient.patch(`/api/sites/${id}`, changes)).site;
}

export async function deleteSite(id: number): Promise<void> {
  await apiClient.delete(`/api/sites/${id}`);
}

function useSiteMutation<V, R>(mutationFn: (v: V) => Promise<R>) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn,
    // Units show their site's code and name.
    onSuccess: () =>
      Promise.all([
        queryClient.invalidateQueries({ queryKey: siteKeys.all }),
        queryClient.invalidateQueries({ queryKey: queryRoots.units }),
      ]),
  });
}

export const useCreateSite = () => useSiteMutation(createSite);
export const useUpdateSite = () => useSiteMutation(updateSite);
export const useDeleteSite = () => useSiteMutation(deleteSite);
