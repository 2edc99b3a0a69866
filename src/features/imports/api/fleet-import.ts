import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import {
  importPreviewDto,
  unitImportResponseDto,
  type ImportMapping,
  type ImportPreviewDto,
  type UnitImportDto,
} from '../../../../shared/schemas/imports';
import { apiClient } from '../../../lib/api-client';
import { uploadForm, type TransferProgress } from '../../../lib/transfer';
import { queryRoots } from '../../../lib/query-roots';
import { importKeys } from './keys';

export const IMPORT_TEMPLATE_HREF = '/api/unit-imports/template';

function importForm(file: File, fields: Record<string, string | undefined>): FormData {
  const form = new FormData();
  for (const [k, v] of Object.entries(fields)) if (v !== undefined) form.append(k, v);
  form.append('file', file, file.name);
  return form;
}

type PreviewArgs = { file: File; mapping?: ImportMapping; onProgress?: (p: TransferProgress) => void };

export async function previewImport({ file, mapping, onProgress }: PreviewArgs): Promise<ImportPreviewDto> {
  const form = importForm(file, { mapping: mapping && JSON.stringify(mapping) });
  return z.object({ preview: importPreviewDto }).parse(await uploadForm('/api/unit-imports/preview', form, onProgress))
    .preview;
}

export function usePreviewImport() {
  return useMutation({ mutationFn: previewImport });
}

type CommitArgs = PreviewArgs & { importKey: string; skipExisting: boolean };

export async function commitImport({
  file,
  mapping,
  importKey,
  skipExisting,
  onProgress,
}: CommitArgs): Promise<UnitImportDto> {
  const form = importForm(file, {
    importKey,
    skipExisting: String(skipExisting),
    mapping: mapping && JSON.stringify(mapping),
  });
  return unitImportResponseDto.parse(await uploadForm('/api/unit-imports', form, onProgress)).import;
}

export function useCommitImport() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: commitImport,
    onSuccess: () =>
      Promise.all([
        queryClient.invalidateQueries({ queryKey: queryRoots.units }),
        queryClient.invalidateQueries({ queryKey: queryRoots.sites }),
      ]),
  });
}

export async function getImportProgress(key: string, signal?: AbortSignal): Promise<UnitImportDto> {
  return unitImportResponseDto.parse(await apiClient.get(`/api/unit-imports/${encodeURIComponent(key)}`, { signal }))
    .import;
}

/** Polled while the commit request runs; the import row appears once the server has checked every row. */
export function importProgressQuery(key: string) {
  return queryOptions({
    queryKey: importKeys.detail(key),
    queryFn: ({ signal }) => getImportProgress(key, signal),
    retry: false,
  });
}

export function useImportProgress(key: string | null) {
  return useQuery({
    ...importProgressQuery(key ?? ''),
    enabled: key !== null,
    refetchInterval: (q) =>
      q.state.data?.status === 'running' || q.state.status === 'error' || !q.state.data ? 700 : false,
  });
}
