import * as os from 'node:os';
import * as path from 'node:path';
import { registerAs } from '@nestjs/config';

/**
 * Where cut-pack files live. `s3` talks to any S3-compatible store through the AWS SDK (in development and
 * tests, the local fake that the scripts start); `fs` keeps them in a folder, behind the same interface.
 */
export const storageConfig = registerAs('storage', () => ({
  driver: (process.env.KW_STORAGE ?? 's3') as 's3' | 'fs',
  endpoint: process.env.KW_S3_ENDPOINT ?? `http://127.0.0.1:${process.env.KW_S3_PORT ?? 4569}`,
  region: process.env.KW_S3_REGION ?? 'us-east-1',
  bucket: process.env.KW_S3_BUCKET ?? 'kerfwright-files',
  accessKeyId: process.env.KW_S3_ACCESS_KEY ?? 'S3RVER',
  secretAccessKey: process.env.KW_S3_SECRET_KEY ?? 'S3RVER',
  forcePathStyle: (process.env.KW_S3_PATH_STYLE ?? 'true') === 'true',
  dir: process.env.KW_STORAGE_DIR ?? path.join(os.tmpdir(), 'kerfwright-files'),
}));
export type StorageConfig = ReturnType<typeof storageConfig>;
