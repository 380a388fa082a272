/** A content file that cannot be used: names the file and the field at fault. */
export class ContentError extends Error {
  constructor(
    readonly file: string,
    readonly field: string,
    problem: string,
  ) {
    super(`${file}: ${field}: ${problem}`);
    this.name = 'ContentError';
  }
}

/** Small checks shared by the loaders; each throws a ContentError naming file and field. */
export class FieldReader {
  constructor(readonly file: string) {}

  fail(field: string, problem: string): never {
    throw new ContentError(this.file, field, problem);
  }

  record(value: unknown, field: string): Record<string, unknown> {
    if (typeof value !== 'object' || value === null || Array.isArray(value)) {
      this.fail(field, 'must be an object');
    }
    return value as Record<string, unknown>;
  }

  list(value: unknown, field: string, opts: { nonEmpty?: boolean } = {}): unknown[] {
    if (!Array.isArray(value)) this.fail(field, 'must be a list');
    if (opts.nonEmpty && value.length === 0) this.fail(field, 'must not be empty');
    return value;
  }

  text(value: unknown, field: string): string {
    if (typeof value !== 'string' || value.trim() === '') this.fail(field, 'must be a non-empty string');
    return value;
  }

  optionalText(value: unknown, field: string): string | undefined {
    return value === undefined ? undefined : this.text(value, field);
  }

  texts(value: unknown, field: string): string[] {
    return this.list(value, field, { nonEmpty: true }).map((v, i) => this.text(v, `${field}[${i}]`));
  }

  bool(value: unknown, field: string): boolean {
    if (typeof value !== 'boolean') this.fail(field, 'must be true or false');
    return value;
  }

  /** A finite number within [min, max]; `exclusiveMin` rejects min itself. */
  num(
    value: unknown,
    field: string,
    range: { min?: number; max?: number; exclusiveMin?: boolean } = {},
  ): number {
    if (typeof value !== 'number' || !Number.isFinite(value)) this.fail(field, 'must be a number');
    const { min, max, exclusiveMin } = range;
    if (min !== undefined && (exclusiveMin ? value <= min : value < min)) {
      this.fail(field, `must be ${exclusiveMin ? 'greater than' : 'at least'} ${min} (got ${value})`);
    }
    if (max !== undefined && value > max) this.fail(field, `must be at most ${max} (got ${value})`);
    return value;
  }

  positive(value: unknown, field: string): number {
    return this.num(value, field, { min: 0, exclusiveMin: true });
  }

  integer(value: unknown, field: string, min: number): number {
    const n = this.num(value, field, { min });
    if (!Number.isInteger(n)) this.fail(field, `must be a whole number (got ${n})`);
    return n;
  }

  oneOf<T extends string>(value: unknown, field: string, allowed: readonly T[]): T {
    if (typeof value !== 'string' || !(allowed as readonly string[]).includes(value)) {
      this.fail(field, `must be one of ${allowed.join(', ')} (got ${JSON.stringify(value)})`);
    }
    return value as T;
  }

  key(value: unknown, field: string): string {
    const s = this.text(value, field);
    if (!KEBAB.test(s)) this.fail(field, `must be kebab-case (got "${s}")`);
    return s;
  }
}

export const KEBAB = /^[a-z0-9]+(-[a-z0-9]+)*$/;
