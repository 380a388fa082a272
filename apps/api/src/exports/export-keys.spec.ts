import { exportPrefix, fileKey, isSafeFileName } from './export-keys';
import { assertSafeKey } from '../storage/object-storage';

const JOB = '3f2b6c1e-8d4a-4b7e-9c1a-2e5f6a7b8c9d';
const EXP = 'a1b2c3d4-e5f6-4a7b-8c9d-0e1f2a3b4c5d';

describe('cut-pack file names and storage keys', () => {
  it('accepts the names a cut pack uses', () => {
    for (const name of [
      'sheet-01-saffron.dxf',
      'sheet-12-clear.svg',
      'setup-sheet.pdf',
      'assembly-guide.pdf',
      'manifest.json',
      'cut-pack-3f2b6c1e.zip',
    ]) {
      expect(isSafeFileName(name)).toBe(true);
    }
  });

  it('refuses anything that could leave the export folder or confuse a client', () => {
    for (const name of [
      '',
      '.',
      '..',
      '../manifest.json',
      '..%2Fmanifest.json',
      'a/b.pdf',
      'a\\b.pdf',
      '.hidden.pdf',
      'sheet..dxf',
      'Sheet-01.DXF',
      'manifest.json\u0000.pdf',
      'no-extension',
      'white space.pdf',
      'quote".pdf',
      `${'a'.repeat(120)}.pdf`,
    ]) {
      expect(isSafeFileName(name)).toBe(false);
    }
  });

  it('builds job-scoped keys that the storage layer accepts, and nothing else', () => {
    const prefix = exportPrefix(JOB, EXP);
    expect(prefix).toBe(`jobs/${JOB}/exports/${EXP}/`);
    expect(assertSafeKey(fileKey(prefix, 'manifest.json'))).toBe(`jobs/${JOB}/exports/${EXP}/manifest.json`);
    expect(() => fileKey(prefix, '../other.pdf')).toThrow(/unsafe/);
    expect(() => exportPrefix('../../etc', EXP)).toThrow();
    expect(() => exportPrefix(JOB, EXP.toUpperCase())).toThrow();
  });
});
