// Requests the JSON api-client does not cover: multipart uploads with progress, and files (PDF, CSV) to save.
import { apiErrorDto } from '../../shared/schemas/common';
import { ApiError, unreachable } from './api-client';

export type TransferProgress = { loaded: number; total: number };

/** A refusal's error from its status and body; `fallback` words it when the body is not the API's error shape. */
export function errorFrom(status: number, body: unknown, fallback: string): ApiError {
  const parsed = apiErrorDto.safeParse(body);
  if (parsed.success) {
    const { code, message, fields } = parsed.data.error;
    return new ApiError(status, code, message, fields);
  }
  return new ApiError(status, status >= 500 ? 'server_error' : 'http_error', fallback);
}

const UPLOAD_FAILED: Record<number, string> = { 413: 'The file is too large.' };

/**
 * POSTs a form; XMLHttpRequest rather than fetch because only it reports upload progress, which matters on a depot's
 * slow connection. Resolves the JSON answer; `failed` words a refusal by status when the server's body has none.
 */
export function uploadForm<T>(
  url: string,
  form: FormData,
  onProgress?: (p: TransferProgress) => void,
  failed: Record<number, string> = UPLOAD_FAILED,
): Promise<T> {
  return new Promise((resolve, reject) => {
    const xhr = new XMLHttpRequest();
    xhr.open('POST', url);
    xhr.withCredentials = true;
    xhr.setRequestHeader('Accept', 'application/json');
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
        // Not JSON: the status decides.
      }
      if (xhr.status >= 200 && xhr.status < 300) resolve(json as T);
      else reject(errorFrom(xhr.status, json, failed[xhr.status] ?? 'The upload failed. Try again.'));
    };
    xhr.send(form);
  });
}

/** Fetches a file the server makes (a PDF) and hands it to the browser to open or save under `fileName`. */
export async function saveFile(
  url: string,
  fileName: string,
  init: { method?: 'GET' | 'POST'; body?: unknown } = {},
): Promise<void> {
  let response: Response;
  try {
    response = await fetch(url, {
      method: init.method ?? 'GET',
      credentials: 'include',
      headers: init.body === undefined ? undefined : { 'Content-Type': 'application/json' },
      body: init.body === undefined ? undefined : JSON.stringify(init.body),
    });
  } catch {
    throw unreachable();
  }
  if (!response.ok) {
    const body: unknown = await response.json().catch(() => undefined);
    throw errorFrom(response.status, body, 'The file could not be made. Try again.');
  }
  handToBrowser(await response.blob(), fileName);
}

/** Hands a file made here or by the server to the browser to open or save under `fileName`. */
export function handToBrowser(file: Blob, fileName: string): void {
  const href = URL.createObjectURL(file);
  const a = document.createElement('a');
  a.href = href;
  a.download = fileName;
  document.body.append(a);
  a.click();
  a.remove();
  // Give the browser time to start the download before the object URL goes.
  setTimeout(() => URL.revokeObjectURL(href), 60_000);
}
