import { ApiError, apiErrorFromBody } from './http';
import { readToken } from './session-token';

/*
 * File uploads go through XMLHttpRequest rather than fetch: fetch reports no upload progress,
 * and a 5 MB CSV on a slow plant network needs a progress bar. Everything else still goes
 * through http.ts; this module reuses its token reading and its ApiError.
 */

export interface UploadOptions {
  /** Multipart field that carries the file. */
  field?: string;
  /** Share of the body sent so far, 0 to 1; not called when the browser cannot tell the total. */
  onProgress?: (fraction: number) => void;
  signal?: AbortSignal;
}

const NETWORK_MESSAGE = 'The server cannot be reached. Check the connection and try again.';

function parseBody(text: string): unknown {
  if (!text) return undefined;
  try {
    return JSON.parse(text);
  } catch {
    return undefined;
  }
}

/** Posts one file as multipart/form-data to `/api<path>`; resolves the JSON body or throws ApiError. */
export function uploadFile<T>(path: string, file: Blob, fileName: string, options: UploadOptions = {}): Promise<T> {
  const { field = 'file', onProgress, signal } = options;
  return new Promise<T>((resolve, reject) => {
    if (signal?.aborted) {
      reject(new DOMException('The upload was cancelled.', 'AbortError'));
      return;
    }
    const xhr = new XMLHttpRequest();
    xhr.open('POST', `/api${path.startsWith('/') ? path : `/${path}`}`);
    xhr.setRequestHeader('Accept', 'application/json');
    const token = readToken();
    if (token) xhr.setRequestHeader('Authorization', `Bearer ${token}`);

    xhr.upload.onprogress = (event) => {
      if (event.lengthComputable && event.total > 0) onProgress?.(event.loaded / event.total);
    };
    xhr.onload = () => {
      const body = parseBody(xhr.responseText);
      if (xhr.status >= 200 && xhr.status < 300) resolve(body as T);
      else reject(apiErrorFromBody(xhr.status, body));
    };
    xhr.onerror = () => reject(new ApiError(0, 'network_error', NETWORK_MESSAGE));
    xhr.onabort = () => reject(new DOMException('The upload was cancelled.', 'AbortError'));
    signal?.addEventListener('abort', () => xhr.abort(), { once: true });

    const form = new FormData();
    form.append(field, file, fileName);
    xhr.send(form);
  });
}
