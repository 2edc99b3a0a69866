import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiErrorDto } from '../../../../shared/schemas/common';
import type { AttachmentDto } from '../../../../shared/schemas/history';
import { ApiError } from '../../../lib/api-client';
import { historyKeys } from './keys';

export type UploadProgress = { loaded: number; total: number };

const FALLBACK: Record<number, string> = {
  413: 'A file is too large.',
  415: 'Only photos (JPEG, PNG, WebP) and PDF documents can be attached.',
};

/**
 * Uploads photos or PDFs to one event. XMLHttpRequest rather than fetch: only it reports upload progress, which
 * matters on a depot's slow connection.
 */
export function uploadAttachments(
  { eventId, files }: { eventId: number; files: File[] },
  onProgress?: (p: UploadProgress) => void,
): Promise<AttachmentDto[]> {
  return new Promise((resolve, reject) => {
    const body = new FormData();
    for (const f of files) body.append('files', f, f.name);
    const xhr = new XMLHttpRequest();
    xhr.open('POST', `/api/events/${eventId}/attachments`);
    xhr.withCredentials = true;
    xhr.setRequestHeader('Accept', 'application/json');
    xhr.responseType = 'text';
    xhr.upload.onprogress = (e) => {
      if (e.lengthComputable) onProgress?.({ loaded: e.loaded, total: e.total });
    };
    xhr.onerror = () =>
      reject(new ApiError(0, 'network_error', 'The upload did not get through. Check the connection and try again.'));
    xhr.onload = () => {
      let json: unknown = undefined;
      try {
        json = JSON.parse(xhr.responseText);
      } catch {
        // Not JSON: fall back to the status.
      }
      if (xhr.status >= 200 && xhr.status < 300) {
        resolve((json as { attachments: AttachmentDto[] }).attachments);
        return;
      }
      const parsed = apiErrorDto.safeParse(json);
      if (parsed.success) {
        const { code, message, fields } = parsed.data.error;
        reject(new ApiError(xhr.status, code, message, fields));
      } else {
        reject(new ApiError(xhr.status, 'http_error', FALLBACK[xhr.status] ?? 'The upload failed. Try again.'));
      }
    };
    xhr.send(body);
  });
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
