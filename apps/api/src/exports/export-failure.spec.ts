import { HttpStatus } from '@nestjs/common';
import { AppError } from '../common/errors';
import { attemptFailureMessage, ExportFailure, ExportStorageError } from './export-failure';

describe('what an export failure tells the job’s people', () => {
  it('keeps the sentence of an API or engine error, which is written for them', () => {
    const api = ExportFailure.from(
      new AppError(HttpStatus.CONFLICT, 'MACHINE_PROFILE.NOT_APPROVED', 'The profile is not approved'),
      'EXPORT.PACK_FAILED',
    );
    expect([api.code, api.message]).toEqual(['MACHINE_PROFILE.NOT_APPROVED', 'The profile is not approved']);
    const engine = ExportFailure.from(
      Object.assign(new Error('no colour plan exists'), { code: 'PACK.LAYOUT_FAILED' }),
      'EXPORT.PACK_FAILED',
    );
    expect([engine.code, engine.message]).toEqual(['PACK.LAYOUT_FAILED', 'no colour plan exists']);
  });

  it('gives plain words for any other error and keeps its own text for the log only', () => {
    const raw = "Cannot read properties of undefined (reading 'x') at /srv/kerfwright/pack.js:12";
    const failure = ExportFailure.from(new TypeError(raw), 'EXPORT.PACK_FAILED');
    expect(failure.code).toBe('EXPORT.PACK_FAILED');
    expect(failure.message).not.toContain('undefined');
    expect(failure.message).toMatch(/must be prepared again \(by a fabricator or a supervisor\)/);
    expect(failure.detail).toBe(raw);
  });

  it('says the storage could not be reached, and whether it is tried again, without the client’s text', () => {
    const err = new ExportStorageError(new Error('connect ECONNREFUSED 127.0.0.1:4586'));
    expect(attemptFailureMessage(err, false)).toMatch(/^The file storage could not be reached.*tried again/);
    expect(attemptFailureMessage(err, true)).toMatch(
      /must be prepared again \(by a fabricator or a supervisor\)/,
    );
    for (const final of [false, true]) {
      expect(attemptFailureMessage(err, final)).not.toMatch(/ECONN|127\.0\.0\.1/);
      expect(attemptFailureMessage(new Error('connect ECONNREFUSED 127.0.0.1:54329'), final)).not.toMatch(
        /ECONN/,
      );
    }
  });
});
