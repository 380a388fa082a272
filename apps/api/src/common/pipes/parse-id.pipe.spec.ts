import { BadRequestException } from '@nestjs/common';
import { ParseIdPipe, sameId } from './parse-id.pipe';

describe('ParseIdPipe', () => {
  const pipe = new ParseIdPipe();
  const meta = { type: 'param' as const, data: 'id' };

  it('gives a UUID in lower case, however it was written', async () => {
    await expect(pipe.transform('3F2A6C1E-9B1D-4C3E-8F00-ABCDEF012345', meta)).resolves.toBe(
      '3f2a6c1e-9b1d-4c3e-8f00-abcdef012345',
    );
  });

  it('refuses what is not a UUID', async () => {
    await expect(pipe.transform('not-a-uuid', meta)).rejects.toBeInstanceOf(BadRequestException);
  });
});

describe('sameId', () => {
  it('compares ids without regard to case, and never matches a missing id', () => {
    expect(sameId('ABCDEF01-0000-4000-8000-000000000000', 'abcdef01-0000-4000-8000-000000000000')).toBe(true);
    expect(sameId('abcdef01-0000-4000-8000-000000000000', 'abcdef01-0000-4000-8000-000000000001')).toBe(
      false,
    );
    expect(sameId(null, null)).toBe(false);
    expect(sameId(undefined, 'x')).toBe(false);
  });
});
