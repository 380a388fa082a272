import { type Readable } from 'node:stream';

export interface StoredObject {
  key: string;
  size: number;
}

/** The storage interface cut packs are written through; keys are validated before any driver sees them. */
export interface ObjectStorage {
  put(key: string, body: Buffer, contentType: string): Promise<void>;
  get(key: string): Promise<{ body: Readable; size: number; contentType: string }>;
  exists(key: string): Promise<boolean>;
  list(prefix: string): Promise<StoredObject[]>;
  delete(key: string): Promise<void>;
  deletePrefix(prefix: string): Promise<number>;
  /** Checks the store answers (and creates the bucket or folder if needed). */
  ready(): Promise<void>;
}

export const OBJECT_STORAGE = Symbol('OBJECT_STORAGE');

/** Keys are built by the server only: lower-case segments of safe characters, no dot-segments. */
const SEGMENT = /^[A-Za-z0-9][A-Za-z0-9._-]{0,127}$/;

export function assertSafeKey(key: string): string {
  const parts = key.split('/');
  if (
    parts.length === 0 ||
    parts.length > 8 ||
    parts.some((p) => !SEGMENT.test(p) || p === '.' || p === '..' || p.includes('..'))
  ) {
    throw new Error(`unsafe storage key "${key}"`);
  }
  return key;
}
