import * as fs from 'node:fs';
import * as os from 'node:os';
import * as path from 'node:path';
import S3rver from 's3rver';
import { installSingleDesForS3Fake } from './des-shim';

/**
 * `node apps/api/dist/dev-s3/main.js`: the S3-compatible fake (s3rver) that stands in for object storage
 * in development and tests, on loopback, with its files in KW_S3_DIR.
 */
async function main(): Promise<void> {
  installSingleDesForS3Fake();
  const port = Number(process.env.KW_S3_PORT ?? 4569);
  const directory = process.env.KW_S3_DIR ?? path.join(os.tmpdir(), 'kerfwright-s3');
  fs.mkdirSync(directory, { recursive: true });
  const server = new S3rver({
    port,
    address: '127.0.0.1',
    directory,
    silent: true,
    configureBuckets: [{ name: process.env.KW_S3_BUCKET ?? 'kerfwright-files', configs: [] }],
  });
  await server.run();
  console.log(`object storage fake: http://127.0.0.1:${port} (files in ${directory})`);
  const stop = () => void server.close().then(() => process.exit(0));
  process.on('SIGINT', stop);
  process.on('SIGTERM', stop);
}

main().catch((err: unknown) => {
  console.error(err instanceof Error ? err.message : err);
  process.exit(1);
});
