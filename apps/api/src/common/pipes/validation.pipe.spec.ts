import { assertCleanInput, MAX_INPUT_DEPTH } from './validation.pipe';

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
