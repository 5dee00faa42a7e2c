/**
 * Downloads of the hand-off pack: `GET /api/rooms/:id/handoff.zip` and `GET /api/rooms/:id/exports/<file>`
 * (any member; `?series=` rounds the BOM and report to one E-series). Fetched here rather than
 * followed as a plain link, so that a refusal (a design the engine cannot analyse: 409 with the reason)
 * is shown as the server's sentence instead of a broken download.
 */
import { BOM_SERIES, type BomSeries } from '../../../../shared/handoff/bom';
import { HANDOFF_FILES, type HandoffFile } from '../../../../shared/handoff/files';
import { ApiError, apiErrorFrom } from '../../../lib/api-error';

export { BOM_SERIES, HANDOFF_FILES, type BomSeries, type HandoffFile };

export type HandoffTarget = HandoffFile | 'handoff.zip';

export function exportHref(roomId: string, target: HandoffTarget, series?: BomSeries): string {
  const base = `/api/rooms/${encodeURIComponent(roomId)}`;
  const path = target === 'handoff.zip' ? `${base}/handoff.zip` : `${base}/exports/${target}`;
  return series ? `${path}?series=${series}` : path;
}

/** The file name from `Content-Disposition: attachment; filename="..."`, or a fallback. */
export function attachmentName(header: string | null, fallback: string): string {
  const match = header && /filename="([^"]+)"/i.exec(header);
  return match ? match[1] : fallback;
}

export interface DownloadedFile {
  name: string;
  blob: Blob;
}

export async function fetchExport(href: string, fallbackName: string, { signal }: { signal?: AbortSignal } = {}): Promise<DownloadedFile> {
  let response: Response;
  try {
    response = await fetch(href, { credentials: 'same-origin', signal });
  } catch (cause) {
    if (cause instanceof DOMException && cause.name === 'AbortError') throw cause;
    throw new ApiError(0, 'network', 'The server could not be reached. Check your connection and try again.');
  }
  if (!response.ok) {
    const text = await response.text();
    let body: unknown = text;
    try {
      body = JSON.parse(text);
    } catch {
      // not JSON: the status says it
    }
    throw apiErrorFrom(response.status, body, response.statusText);
  }
  return { name: attachmentName(response.headers.get('Content-Disposition'), fallbackName), blob: await response.blob() };
}

/** Hands a fetched file to the browser's download (an object URL on a temporary link). */
export function saveFile({ name, blob }: DownloadedFile): void {
  const url = URL.createObjectURL(blob);
  const link = document.createElement('a');
  link.href = url;
  link.download = name;
  document.body.appendChild(link);
  link.click();
  link.remove();
  setTimeout(() => URL.revokeObjectURL(url), 30_000);
}
