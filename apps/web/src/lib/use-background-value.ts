import { useEffect, useState } from 'react';

/**
 * Computes `compute()` after the page has painted, `delayMs` after the last change of `key`, and keeps the
 * last result meanwhile (`pending` says a newer one is on its way). For work that must not hold up typing
 * or the first paint, such as laying a model out on sheets. `compute` runs on the main thread; `key` names
 * its inputs (a change of key is what triggers a new run).
 */
export function useBackgroundValue<T>(
  key: string | null,
  compute: () => T,
  delayMs = 0,
): { value: T | null; pending: boolean; error: unknown } {
  const [state, setState] = useState<{ key: string | null; value: T | null; error: unknown }>({
    key: null,
    value: null,
    error: null,
  });
  useEffect(() => {
    if (key === null) return;
    const timer = setTimeout(() => {
      try {
        setState({ key, value: compute(), error: null });
      } catch (error) {
        setState({ key, value: null, error });
      }
    }, delayMs);
    return () => clearTimeout(timer);
    // compute is read when the key changes; the key names everything it depends on.
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [key, delayMs]);
  if (key === null) return { value: null, pending: false, error: null };
  return { value: state.value, pending: state.key !== key, error: state.key === key ? state.error : null };
}
