import { S3Storage } from '../src/storage/s3-storage';
import { type S3Fake, startS3Fake } from './support/object-store';

/**
 * The S3 driver against the S3-compatible fake: S3 returns at most 1,000 keys a page (Amazon S3 API
 * reference, ListObjectsV2, MaxKeys), so a cut pack of hundreds of sheets (two files each) is listed over
 * several pages, by continuation token.
 */
describe('S3 storage: listings longer than one page', () => {
  let fake: S3Fake;
  let storage: S3Storage;

  beforeAll(async () => {
    fake = await startS3Fake('kw-list-test');
    storage = new S3Storage({
      driver: 's3',
      endpoint: `http://127.0.0.1:${fake.port}`,
      region: 'us-east-1',
      bucket: 'kw-list-test',
      accessKeyId: 'S3RVER',
      secretAccessKey: 'S3RVER',
      forcePathStyle: true,
      dir: '',
    });
    await storage.ready();
  });

  afterAll(async () => {
    await fake.dispose();
  });

  it('lists and deletes 1,206 files under one prefix, as a 600-sheet pack has', async () => {
    const prefix = 'jobs/j-big/exports/e-big/';
    const names = Array.from({ length: 1206 }, (_, i) => `${prefix}sheet-${String(i).padStart(4, '0')}.svg`);
    for (let i = 0; i < names.length; i += 50)
      await Promise.all(names.slice(i, i + 50).map((k) => storage.put(k, Buffer.from('x'), 'image/svg+xml')));
    await storage.put('jobs/j-other/exports/e-1/manifest.json', Buffer.from('{}'), 'application/json');
    const listed = await storage.list(prefix);
    expect(listed.map((o) => o.key).sort()).toEqual(names);
    expect(listed.every((o) => o.size === 1)).toBe(true);
    expect(await storage.deletePrefix(prefix)).toBe(1206);
    expect(await storage.list(prefix)).toEqual([]);
    expect((await storage.list('jobs/')).map((o) => o.key)).toEqual([
      'jobs/j-other/exports/e-1/manifest.json',
    ]);
  }, 120_000);
});
