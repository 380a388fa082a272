/** JSON text of a value with every object's keys in order, so two equal values give the same text. */
function canonical(value: unknown): string {
  return JSON.stringify(value, (_key, v: unknown) =>
    v && typeof v === 'object' && !Array.isArray(v)
      ? Object.fromEntries(
          Object.entries(v as Record<string, unknown>).sort(([a], [b]) => a.localeCompare(b)),
        )
      : v,
  );
}

/**
 * Resets a form to `values` unless it holds them already. A dialog starts its form afresh each time it opens;
 * writing the same values back into its fields would undo what the opening did to the first one (a number
 * selected so that typing replaces it: a "2" typed then made "12").
 */
export function resetUnlessSame<T>(
  form: { getValues: () => T; reset: (values: T) => void },
  values: T,
): void {
  if (canonical(form.getValues()) !== canonical(values)) form.reset(values);
}
