import { CUT_PACK_FILE_ROLES, type JobTransitionView } from '@kerfwright/contracts';
import { describe, expect, it } from 'vitest';
import { jobFixture } from '../../../testing/fixtures';
import {
  PACK_FILE_ROLE_LABELS,
  packFailureText,
  packProgressText,
  preparedAgainAfterReturn,
} from './pack-text';

describe('cut pack wording', () => {
  it('names every file role in words, never by its internal name', () => {
    for (const role of CUT_PACK_FILE_ROLES) {
      expect(PACK_FILE_ROLE_LABELS[role]).toMatch(/^[A-Z][a-z]/);
      expect(PACK_FILE_ROLE_LABELS[role]).not.toContain('-');
    }
  });

  it("explains a failed attempt of the machinery in the API's words, and keeps a job's own reason", () => {
    const storage = packFailureText({
      errorCode: 'EXPORT.ATTEMPT_FAILED',
      errorMessage:
        'The file storage could not be reached, so the cut pack could not be stored; every attempt failed, so it must be prepared again (by a fabricator or a supervisor)',
      attempts: 4,
    });
    expect(storage).toBe(
      'Tried 4 times: the file storage could not be reached, so the cut pack could not be stored; every attempt ' +
        'failed, so it must be prepared again (by a fabricator or a supervisor). If it fails again, whoever runs ' +
        'the server finds the details in its log.',
    );
    expect(packFailureText({ errorCode: 'EXPORT.ATTEMPT_FAILED', errorMessage: null, attempts: 1 })).toBe(
      'The files could not be built and stored after one attempt. Prepare the cut pack again. If it fails ' +
        'again, whoever runs the server finds the details in its log.',
    );
    const reason = 'The machine profile version was retired since the job was prepared.';
    expect(packFailureText({ errorCode: 'MACHINE_PROFILE.RETIRED', errorMessage: reason, attempts: 1 })).toBe(
      reason,
    );
    expect(packFailureText({ errorCode: null, errorMessage: null, attempts: 1 })).toBe(
      'The cut pack could not be prepared.',
    );
  });

  it('says a queued pack waits for a worker instead of showing the last attempt’s percentage', () => {
    expect(packProgressText({ state: 'queued', progress: 99 })).toBe('waiting for a worker');
    expect(packProgressText({ state: 'running', progress: 42 })).toBe('building, 42 %');
  });

  it('tells a preparation made after a return (earlier packs are not for it) from a first one', () => {
    const steps = (...actions: string[]): { transitions: JobTransitionView[] } => ({
      transitions: actions.map((action) => ({
        from: null,
        to: 'draft',
        action,
        actorId: null,
        actorName: null,
        reason: null,
        at: '2026-01-01T00:00:00.000Z',
      })),
    });
    expect(preparedAgainAfterReturn(steps('create', 'request', 'prepare', 'approve', 'release'))).toBe(false);
    // Prepared twice before approval: no pack could have been built for the first preparation.
    expect(preparedAgainAfterReturn(steps('create', 'request', 'prepare', 'prepare', 'approve'))).toBe(false);
    expect(
      preparedAgainAfterReturn(
        steps('create', 'request', 'prepare', 'approve', 'release', 'return', 'reopen', 'request', 'prepare'),
      ),
    ).toBe(true);
    // Returned and not prepared since: the preparation in effect is still the one its packs were built for.
    expect(preparedAgainAfterReturn(steps('create', 'request', 'prepare', 'approve', 'return'))).toBe(false);
    // A list row carries no history.
    expect(preparedAgainAfterReturn(jobFixture({ state: 'approved' }))).toBe(false);
  });
});
