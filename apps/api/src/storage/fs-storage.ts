import * as fs from 'node:fs';
import * as path from 'node:path';
import { type Readable } from 'node:stream';
import { assertSafeKey, type ObjectStorage, type StoredObject } from './object-storage';

const TYPES: Record<string, string> = {
  '.dxf': 'image/vnd.dxf',
  '.svg': 'image/svg+xml',
  '.pdf': 'application/pdf',
  '.json': 'application/json',
  '.zip': 'application/zip',
};

/** Files in a folder behind the storage interface; writes go to a temporary name and are renamed into place. */
export class FsStorage implements ObjectStorage {
  constructor(private readonly root: string) {}

  private file(key: string): string {
    const p = path.resolve(this.root, assertSafeKey(key));
    if (!p.startsWith(path.resolve(this.root) + path.sep)) throw new Error(`unsafe storage key "${key}"`);
    return p;
  }

  async ready(): Promise<void> {
    await fs.promises.mkdir(this.root, { recursive: true });
  }

  async put(key: string, body: Buffer): Promise<void> {
    const target = this.file(key);
    await fs.promises.mkdir(path.dirname(target), { recursive: true });
    const tmp = `${target}.tmp-${process.pid}-${Date.now()}`;
    await fs.promises.writeFile(tmp, body);
    await fs.promises.rename(tmp, target);
  }

  async get(key: string): Promise<{ body: Readable; size: number; contentType: string }> {
    const p = this.file(key);
    const stat = await fs.promises.stat(p);
    return {
      body: fs.createReadStream(p),
      size: stat.size,
      contentType: TYPES[path.extname(p)] ?? 'application/octet-stream',
    };
  }

  async exists(key: string): Promise<boolean> {
    return fs.promises.access(this.file(key)).then(
      () => true,
      () => false,
    );
  }

  async list(prefix: string): Promise<StoredObject[]> {
    const base = path.resolve(this.root);
    const out: StoredObject[] = [];
    const walk = async (dir: string): Promise<void> => {
      const entries = await fs.promises.readdir(dir, { withFileTypes: true }).catch(() => []);
      for (const e of entries) {
        const p = path.join(dir, e.name);
        if (e.isDirectory()) await walk(p);
        else {
          const key = path.relative(base, p).split(path.sep).join('/');
          if (key.startsWith(prefix) && !e.name.includes('.tmp-'))
            out.push({ key, size: (await fs.promises.stat(p)).size });
        }
      }
    };
    await walk(base);
    return out.sort((a, b) => a.key.localeCompare(b.key));
  }

  async delete(key: string): Promise<void> {
    await fs.promises.rm(this.file(key), { force: true });
  }

  async deletePrefix(prefix: string): Promise<number> {
    const objects = await this.list(prefix);
    for (const o of objects) await fs.promises.rm(this.file(o.key), { force: true });
    return objects.length;
  }
}
