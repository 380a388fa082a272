import { type ChildProcess, execFile, spawn } from 'node:child_process';
import { randomUUID } from 'node:crypto';
import * as fs from 'node:fs';
import * as net from 'node:net';
import * as os from 'node:os';
import * as path from 'node:path';
import { setTimeout as sleep } from 'node:timers/promises';
import { promisify } from 'node:util';

const run = promisify(execFile);
const ROOT = path.resolve(__dirname, '..', '..', '..', '..');
const PG_SH = path.join(ROOT, 'db', 'scripts', 'pg.sh');
const DB_CLI = path.join(ROOT, 'db', 'dist', 'src', 'cli.js');

/** A free TCP port on loopback, as the kernel hands one out. */
export async function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const srv = net.createServer();
    srv.once('error', reject);
    srv.listen(0, '127.0.0.1', () => {
      const { port } = srv.address() as net.AddressInfo;
      srv.close(() => resolve(port));
    });
  });
}

/**
 * A PostgreSQL server of the suite's own (db/scripts/pg.sh with a fresh folder and port), migrated and seeded
 * like the product's, that the suite may stop and start again while the API runs against it.
 */
export interface PrivatePostgres {
  port: number;
  env: Record<string, string>;
  stop(): Promise<void>;
  start(): Promise<void>;
  destroy(): Promise<void>;
}

export async function startPrivatePostgres(): Promise<PrivatePostgres> {
  const port = await freePort();
  const dir = path.join(os.tmpdir(), `kw-private-pg-${process.pid}-${randomUUID().slice(0, 8)}`);
  const env = {
    KW_PG_DATA: dir,
    KW_DB_PORT: String(port),
    KW_DB_NAME: 'kerfwright_private',
    KW_PG_FAST: '1',
  };
  const pg = (cmd: string) => run('bash', [PG_SH, cmd], { env: { ...process.env, ...env } });
  await pg('start');
  await run(process.execPath, [DB_CLI, 'migrate'], { env: { ...process.env, ...env } });
  await run(process.execPath, [DB_CLI, 'seed'], { env: { ...process.env, ...env } });
  return {
    port,
    env: { KW_DB_PORT: env.KW_DB_PORT, KW_DB_NAME: env.KW_DB_NAME },
    stop: async () => {
      await pg('stop');
    },
    start: async () => {
      await pg('start');
    },
    destroy: async () => {
      await pg('stop').catch(() => undefined);
      fs.rmSync(dir, { recursive: true, force: true });
    },
  };
}

/** A Redis server of the suite's own (no persistence: a restart loses everything it held, the worst case). */
export interface PrivateRedis {
  port: number;
  /** Stops it at once (SIGKILL): whatever it held is gone. */
  kill(): Promise<void>;
  start(): Promise<void>;
}

export async function startPrivateRedis(): Promise<PrivateRedis> {
  const port = await freePort();
  let child: ChildProcess | null = null;
  const start = async () => {
    child = spawn(
      'redis-server',
      ['--bind', '127.0.0.1', '--port', String(port), '--save', '', '--appendonly', 'no'],
      { stdio: 'ignore' },
    );
    for (let i = 0; i < 100; i++) {
      const up = await new Promise<boolean>((resolve) => {
        const s = net.connect(port, '127.0.0.1', () => {
          s.end();
          resolve(true);
        });
        s.once('error', () => resolve(false));
      });
      if (up) return;
      await sleep(100);
    }
    throw new Error(`redis-server did not listen on ${port}`);
  };
  const kill = async () => {
    const c = child;
    if (!c || c.exitCode !== null || c.signalCode !== null) return;
    const exited = new Promise((resolve) => c.once('exit', resolve));
    c.kill('SIGKILL');
    await exited;
  };
  await start();
  return { port, kill, start };
}
