import { downloadFile } from '../../../lib/api-client';

/** GET /api/exports/:id/files/:name, saved under the file's own name (the server checks who may have it). */
export function downloadExportFile(exportId: string, name: string): Promise<void> {
  return downloadFile(`/exports/${encodeURIComponent(exportId)}/files/${encodeURIComponent(name)}`, name);
}
