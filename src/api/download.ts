import { requestRaw, type RequestOptions } from './http';

/** A file fetched from the API, with the name the server suggested. */
export interface DownloadedFile {
  blob: Blob;
  filename: string;
}

/** Fetches a file from `/api<path>` with the session token; the name comes from Content-Disposition. */
export async function fetchFile(
  path: string,
  fallbackName: string,
  query?: RequestOptions['query'],
): Promise<DownloadedFile> {
  const response = await requestRaw(path, { query });
  const blob = await response.blob();
  return { blob, filename: filenameFrom(response.headers.get('Content-Disposition')) ?? fallbackName };
}

/** Hands a fetched file to the browser as a download. */
export function saveFile({ blob, filename }: DownloadedFile): void {
  const url = URL.createObjectURL(blob);
  const link = document.createElement('a');
  link.href = url;
  link.download = filename;
  link.style.display = 'none';
  document.body.append(link);
  link.click();
  link.remove();
  // Revoking at once can cancel the download in some browsers; a tick later is enough.
  setTimeout(() => URL.revokeObjectURL(url), 0);
}

/** Fetches a file from the API and saves it under the server's name (or `fallbackName`). */
export async function download(path: string, fallbackName: string, query?: RequestOptions['query']): Promise<string> {
  const file = await fetchFile(path, fallbackName, query);
  saveFile(file);
  return file.filename;
}

// RFC 6266, section 4.1: `filename*` (RFC 8187 encoded) is preferred over plain `filename`.
function filenameFrom(disposition: string | null): string | null {
  if (!disposition) return null;
  const extended = /filename\*\s*=\s*([^']*)'[^']*'([^;]+)/i.exec(disposition);
  if (extended) {
    try {
      return decodeURIComponent(extended[2]!.trim());
    } catch {
      // A malformed encoding falls through to the plain parameter.
    }
  }
  const plain = /filename\s*=\s*("([^"]*)"|[^;]+)/i.exec(disposition);
  if (!plain) return null;
  return (plain[2] ?? plain[1]!).trim() || null;
}
