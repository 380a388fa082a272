import { ValidateIf } from 'class-validator';

/** Optional, but when present must not be null (validators run on null and refuse it). */
export const OptionalNotNull = (): PropertyDecorator => ValidateIf((_o, value) => value !== undefined);

/** Optional and may be null (null clears the value); validators run only on other values. */
export const OptionalNullable = (): PropertyDecorator =>
  ValidateIf((_o, value) => value !== undefined && value !== null);

export const FINITE = { allowNaN: false, allowInfinity: false } as const;
