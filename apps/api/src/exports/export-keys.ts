/**
 * File names inside a cut pack and the storage keys built from them. Keys are job-scoped
 * (`jobs/<jobId>/exports/<exportId>/<fileName>`) and built by the server only: a name that reaches a key
 * or a download lookup must match FILE_NAME first.
 */
export const FILE_NAME = /^[a-z0-9](?:[a-z0-9-]|\.(?!\.)){0,95}\.[a-z0-9]{1,8}$/;
const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/;

export function isSafeFileName(name: string): boolean {
  return FILE_NAME.test(name);
}

export function exportPrefix(jobId: string, exportId: string): string {
  if (!UUID.test(jobId) || !UUID.test(exportId)) throw new Error('export ids must be lower-case UUIDs');
  return `jobs/${jobId}/exports/${exportId}/`;
}

export function fileKey(prefix: string, name: string): string {
  if (!isSafeFileName(name)) throw new Error(`unsafe file name "${name}"`);
  return `${prefix}${name}`;
}
