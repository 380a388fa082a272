import { IsRowVersion } from '../validation/row-version';
import { assertCleanInput, createValidationPipe, MAX_INPUT_DEPTH } from './validation.pipe';

const refusal = (value: unknown) => {
  try {
    assertCleanInput(value);
  } catch (err) {
    return (err as { getResponse(): { code: string; details: { field: string }[] } }).getResponse();
  }
  return null;
};

describe('request values checked before validation', () => {
  it('lets ordinary bodies through', () => {
    expect(refusal({ name: 'Lamp', spec: { piece: { sides: 6 }, colours: ['clear', 'amber'] } })).toBeNull();
    expect(refusal("' OR '1'='1")).toBeNull();
  });

  it('refuses NUL characters in values and keys, naming the field', () => {
    expect(refusal({ spec: { solid: { text: 'v 0 0 0\u0000' } } })).toMatchObject({
      code: 'REQUEST.INVALID_CHARACTERS',
      details: [{ field: 'spec.solid.text' }],
    });
    expect(refusal({ ['a\u0000']: 1 })).toMatchObject({ code: 'REQUEST.INVALID_CHARACTERS' });
  });

  it('refuses keys that reach a prototype', () => {
    expect(refusal(JSON.parse('{"name":"x","__proto__":{"role":"supervisor"}}'))).toMatchObject({
      code: 'REQUEST.FORBIDDEN_KEY',
      details: [{ field: '__proto__' }],
    });
    expect(refusal({ spec: { constructor: { prototype: {} } } })).toMatchObject({
      code: 'REQUEST.FORBIDDEN_KEY',
    });
  });

  it(`refuses nesting deeper than ${MAX_INPUT_DEPTH} levels without running out of stack`, () => {
    const deep = JSON.parse(`${'['.repeat(100_000)}${']'.repeat(100_000)}`);
    expect(refusal(deep)).toMatchObject({ code: 'REQUEST.TOO_DEEP' });
    let ok: unknown = 1;
    for (let i = 0; i < MAX_INPUT_DEPTH; i++) ok = [ok];
    expect(refusal(ok)).toBeNull();
  });
});

describe('validation messages', () => {
  class VersionBody {
    @IsRowVersion()
    version!: number;
  }
  const pipe = createValidationPipe();
  const details = async (body: unknown) => {
    try {
      await pipe.transform(body, { type: 'body', metatype: VersionBody });
    } catch (err) {
      return (err as { getResponse(): { details: { field: string; messages: string[] }[] } }).getResponse()
        .details;
    }
    return null;
  };

  it('says a missing field is required, not every rule its absence breaks', async () => {
    expect(await details({})).toEqual([{ field: 'version', messages: ['version is required'] }]);
  });

  it('refuses a version no integer column holds (1e308 is an integer to JavaScript)', async () => {
    expect(await details({ version: 1e308 })).toEqual([
      { field: 'version', messages: [expect.stringMatching(/must not be greater than 2147483647/)] },
    ]);
    expect(await details({ version: 0 })).toEqual([
      { field: 'version', messages: [expect.stringMatching(/must not be less than 1/)] },
    ]);
    expect(await details({ version: 3 })).toBeNull();
  });

  it('names an unknown field as not allowed, even though its value is given', async () => {
    expect(await details({ version: 3, extra: 1 })).toEqual([
      { field: 'extra', messages: [expect.stringMatching(/should not exist/)] },
    ]);
  });
});
