import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { AttachmentDto } from '../../../../shared/schemas/history';
import { uploadForm, type TransferProgress } from '../../../lib/transfer';
import { historyKeys } from './keys';

export type UploadProgress = TransferProgress;

const FAILED: Record<number, string> = {
  413: 'A file is too large.',
  415: 'Only photos (JPEG, PNG, WebP) and PDF documents can be attached.',
};

/** Uploads photos or PDFs to one event, with progress. */
export async function uploadAttachments(
  { eventId, files }: { eventId: number; files: File[] },
  onProgress?: (p: UploadProgress) => void,
): Promise<AttachmentDto[]> {
  const body = new FormData();
  for (const f of files) body.append('files', f, f.name);
  const answer = await uploadForm<{ attachments: AttachmentDto[] }>(
    `/api/events/${eventId}/attachments`,
    body,
    onProgress,
    FAILED,
  );
  return answer.attachments;
}

export function useUploadAttachments(unitId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    // Offline, fail at once with a message instead of waiting silently.
    networkMode: 'always',
    mutationFn: ({
      eventId,
      files,
      onProgress,
    }: {
      eventId: number;
      files: File[];
      onProgress?: (p: UploadProgress) => void;
    }) => uploadAttachments({ eventId, files }, onProgress),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: historyKeys.unit(unitId) }),
  });
}
