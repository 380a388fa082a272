import { z } from 'zod';

/**
 * The value of a number field nobody has typed into. It is `undefined`, not NaN: react-hook-form writes a
 * field's starting value into the input, and NaN arrives there as the text "NaN" (the browser then warns that
 * it cannot parse it). Typed as a number so a form's value types stay those its schema checks; a required
 * field's schema refuses it with the field's own message ("Enter the …").
 */
export const EMPTY_NUMBER = undefined as unknown as number;

/** A number field left empty: never typed into (undefined) or cleared (NaN, from `valueAsNumber`). */
export const isBlankNumber = (n: number | undefined): n is undefined => n === undefined || Number.isNaN(n);

/** A number field that may stay empty (undefined or NaN); the form's own rules decide when it is needed. */
export const optionalNumberField = () => z.union([z.undefined(), z.nan(), z.number()]);
