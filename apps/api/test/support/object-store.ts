import * as fs from 'node:fs';
import * as os from 'node:os';
import * as path from 'node:path';
import S3rver from 's3rver';
import { installSingleDesForS3Fake } from '../../src/dev-s3/des-shim';

/** The S3-compatible fake from npm (s3rver) on a loopback port of its own, with files in a fresh folder. */
export interface S3Fake {
  port: number;
  dir: string;
  /** Stops answering (the folder stays, so `restart` serves the same objects again). */
  stop(): Promise<void>;
  restart(): Promise<void>;
  /** Stops and removes the folder. */
  dispose(): Promise<void>;
}

export async function startS3Fake(bucket: string): Promise<S3Fake> {
  installSingleDesForS3Fake();
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'kw-s3-test-'));
  const make = (port: number) =>
    new S3rver({
      port,
      address: '127.0.0.1',
      directory: dir,
      silent: true,
      configureBuckets: [{ name: bucket, configs: [] }],
    });
  let server = make(0);
  const address = await server.run();
  const port = address.port;
  let running = true;
  const fake: S3Fake = {
    port,
    dir,
    async stop() {
      if (running) await server.close();
      running = false;
    },
    async restart() {
      if (running) return;
      server = make(port);
      await server.run();
      running = true;
    },
    async dispose() {
      await fake.stop();
      fs.rmSync(dir, { recursive: true, force: true });
    },
  };
  return fake;
}
